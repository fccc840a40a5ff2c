import { defaultEps, defaultEpsFactor, effectiveSize, totalVariance } from '../../../src/engine/entropic/default-eps';
import { points } from '../../../src/engine/points';

describe('default-eps', () => {
  test('totalVariance is the mass-weighted sum of column variances', () => {
    const p = points([
      [0, 0],
      [2, 4],
    ]);
    // Source: common practice, variances 1 and 4 with masses 1/2.
    expect(totalVariance(p, Float64Array.of(Math.log(0.5), Math.log(0.5)))).toBeCloseTo(5, 14);
  });

  test('effectiveSize is 1 / sum w^2 (Kish)', () => {
    // Source: Kish 1965, "Survey Sampling"; equal masses give n.
    expect(effectiveSize(new Float64Array(8).fill(-Math.log(8)))).toBeCloseTo(8, 12);
    expect(effectiveSize(Float64Array.of(Math.log(0.5), Math.log(0.25), Math.log(0.25)))).toBeCloseTo(1 / 0.375, 12);
  });

  test('defaultEps = defaultEpsFactor(d) * mean column variance * n^(-2/(d+4)), the factor d / 32 within [1/16, 1/4]', () => {
    // Source: design choice, chosen on the tune half of the bench zoo (see defaultEpsFactor).
    expect([1, 2, 4, 5, 8, 12].map(defaultEpsFactor)).toEqual([0.0625, 0.0625, 0.125, 0.15625, 0.25, 0.25]);
    const x = points([[0], [2]]);
    const y = points([[0], [4]]);
    const l = Float64Array.of(Math.log(0.5), Math.log(0.5));
    // Source: the documented rule; variances 1 and 4, n = 2, d = 1.
    expect(defaultEps(x, l, y, l)).toBeCloseTo(0.0625 * 2.5 * Math.pow(2, -2 / 5), 14);
    // Source: the documented rule, d = 2: total variances 1 + 4 and 4 + 0, so the mean column variance is 9 / 4.
    const x2 = points([
      [0, 0],
      [2, 4],
    ]);
    const y2 = points([
      [0, 1],
      [4, 1],
    ]);
    expect(defaultEps(x2, l, y2, l)).toBeCloseTo(0.0625 * (9 / 4) * Math.pow(2, -2 / 6), 14);
  });

  test('defaultEps is positive when neither sample has any spread', () => {
    const x = points([[1], [1]]);
    const l = Float64Array.of(Math.log(0.5), Math.log(0.5));
    expect(defaultEps(x, l, x, l)).toBe(1e-3);
  });
});
