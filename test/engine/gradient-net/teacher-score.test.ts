import { TeacherScore } from '../../../src/engine/gradient-net/teacher-score';
import { randomParams } from './helpers';

describe('TeacherScore', () => {
  test('is the weighted mean squared distance between F(x) and the teacher targets', () => {
    // F(x) = x (no hidden part, V = 0, alpha = 1, beta = 0); targets x + (1, 2): squared distance 1 + 4 per row.
    const p = { ...randomParams(2, 3, 1, 1), c: new Float64Array(3), v: new Float64Array(4), alpha: 1, beta: new Float64Array(2) };
    const x = { n: 3, d: 2, data: Float64Array.of(0, 0, 1, -1, 2, 5), weights: null };
    const t = Float64Array.from(x.data, (v, j) => v + (j % 2 === 0 ? 1 : 2));
    expect(new TeacherScore(x, t).of(p)).toBeCloseTo(5, 12); // Source: worked by hand, 1^2 + 2^2
    // A zero weight leaves its row out: moving that row's target changes nothing.
    const w = { ...x, weights: Float64Array.of(1, 1, 0) };
    const t2 = Float64Array.from(t);
    t2[4] += 100;
    expect(new TeacherScore(w, t2).of(p)).toBeCloseTo(5, 12);
  });
});
