import { entropicTeacher } from '../../../src/engine/gradient-net/entropic-teacher';
import { RegressionObjective } from '../../../src/engine/gradient-net/regression-objective';
import { Random } from '../../../src/engine/stats/random';

describe('entropicTeacher', () => {
  test('on a translated sample its map is close to the translation, the optimal map', () => {
    // Source: for the squared cost, the optimal map between a law and its translate by t is x -> x + t (common fact of OT).
    const r = new Random(4);
    const n = 300;
    const x = Float64Array.from({ length: 2 * n }, () => r.normal());
    const src = { n, d: 2, data: x, weights: null };
    const tgt = { n, d: 2, data: Float64Array.from(x, (v, j) => v + (j % 2 === 0 ? 3 : -1)), weights: null };
    const teacher = entropicTeacher(src, tgt, 0.01, new Random(1), {});
    expect(teacher.rows).toEqual({ source: n, target: n });
    const probe = { n: 2, d: 2, data: Float64Array.of(0, 0, 0.5, -0.5) };
    const out = teacher.at(probe);
    // Design choice: within 0.1 at eps 0.01 (smoothing shrinks the map slightly towards the target mean).
    expect(Math.abs(out[0] - 3)).toBeLessThan(0.1);
    expect(Math.abs(out[1] + 1)).toBeLessThan(0.1);
    expect(Math.abs(out[2] - 3.5)).toBeLessThan(0.1);
    expect(Math.abs(out[3] + 1.5)).toBeLessThan(0.1);
  });
});

describe('RegressionObjective', () => {
  test('value is the batch mean of squared distances; gradient 2 (F - t) / batch', () => {
    const obj = new RegressionObjective(() => Float64Array.of(1, 1, 0, 0));
    const r = obj.evaluate(Float64Array.of(2, 1, 0, 3), Uint32Array.of(0, 1));
    expect(r.value).toBeCloseTo((1 + 9) / 2, 14); // Source: worked by hand
    expect(Array.from(r.gradient)).toEqual([1, 0, 0, 3]);
  });
});
