import { HeldoutScore } from '../../../src/engine/gradient-net/heldout-score';
import { linearOnly } from '../../../src/engine/gradient-net/initial-params';
import { energyDistance } from '../../../src/engine/stats/energy-distance';
import { Random } from '../../../src/engine/stats/random';
import { randomParams } from './helpers';

describe('HeldoutScore', () => {
  test('is the energy distance between the mapped held-out source rows and the held-out target rows', () => {
    const r = new Random(3);
    const x = { n: 50, d: 2, data: Float64Array.from({ length: 100 }, () => r.normal()), weights: null };
    const y = { n: 60, d: 2, data: Float64Array.from({ length: 120 }, () => 2 + r.normal()), weights: null };
    // F(x) = x + (2, 2): V = 0, alpha = 1, no nonlinear part.
    const p = { ...linearOnly(randomParams(2, 4, 1, 1)), v: new Float64Array(4), alpha: 1, beta: Float64Array.of(2, 2) };
    const shifted = { n: 50, d: 2, data: x.data.map((v) => v + 2) };
    const score = new HeldoutScore(x, y);
    expect(score.of(p)).toBeCloseTo(energyDistance(shifted, y).value, 12); // Source: stats/energy-distance.ts on the mapped rows
    const identity = { ...p, beta: Float64Array.of(0, 0) };
    expect(score.of(identity)).toBeGreaterThan(score.of(p)); // the unshifted map is farther from the target
  });
});
