import { kishEffectiveSize } from '../../../src/engine/stats/effective-size';

describe('kishEffectiveSize: (sum w)^2 / sum w^2 (Kish 1965, Survey Sampling)', () => {
  test('equal weights give the row count; null weights give n', () => {
    // Source: Kish 1965: with equal weights the design effect of weighting is 1
    expect(kishEffectiveSize(Float64Array.of(3, 3, 3, 3), 4)).toBeCloseTo(4, 12);
    expect(kishEffectiveSize(null, 17)).toBe(17);
  });

  test('uneven weights shrink it: worked by hand', () => {
    // Source: by hand, (1 + 1 + 2)^2 / (1 + 1 + 4) = 16 / 6
    expect(kishEffectiveSize(Float64Array.of(1, 1, 2), 3)).toBeCloseTo(16 / 6, 12);
    // Source: by hand, one weight of 99 among 99 weights of 1: (198)^2 / (99 + 9801) = 39204 / 9900 = 3.96
    const w = new Float64Array(100).fill(1);
    w[0] = 99;
    expect(kishEffectiveSize(w, 100)).toBeCloseTo(3.96, 12);
  });

  test('zero weights do not count, and huge or tiny weights neither overflow nor underflow', () => {
    // Source: by hand, weights (2, 0, 2): 16 / 8 = 2 rows
    expect(kishEffectiveSize(Float64Array.of(2, 0, 2), 3)).toBeCloseTo(2, 12);
    // Source: scale invariance of the ratio (multiply every weight by c: c^2 cancels)
    expect(kishEffectiveSize(Float64Array.of(1e200, 1e200, 2e200), 3)).toBeCloseTo(16 / 6, 12);
    expect(kishEffectiveSize(Float64Array.of(1e-200, 1e-200, 2e-200), 3)).toBeCloseTo(16 / 6, 12);
  });
});
