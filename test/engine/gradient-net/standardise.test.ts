import { standardise, standardiserOf } from '../../../src/engine/gradient-net/standardise';

describe('standardiserOf', () => {
  test('with one shape for all columns: centres each column and uses one scale sqrt(trace(cov) / d)', () => {
    const data = Float64Array.of(0, 0, 2, 4);
    const st = standardiserOf({ n: 2, d: 2, data, weights: null }, Float64Array.of(1, 1));
    expect(Array.from(st.mean)).toEqual([1, 2]);
    expect(st.scale[0]).toBeCloseTo(Math.sqrt((1 + 4) / 2), 15); // Source: variances 1 and 4 (divisor n)
    expect(st.scale[1]).toBe(st.scale[0]);
    const z = standardise(data, 2, st);
    expect(z[0]).toBeCloseTo(-1 / st.scale[0], 15);
    expect(Array.from(data)).toEqual([0, 0, 2, 4]);
  });

  test('per-column shapes: scale_k = c_k * s, s making the mean variance of the scaled columns 1', () => {
    // Columns with variances 1 and 10,000 (divisor n); shapes c = [1, 100] make both variance 1, so s = 1.
    const data = Float64Array.of(-1, -100, 1, 100);
    const st = standardiserOf({ n: 2, d: 2, data, weights: null }, Float64Array.of(1, 100));
    expect(st.scale[0]).toBeCloseTo(1, 14); // Source: worked by hand, sqrt((1 + 1) / 2) = 1
    expect(st.scale[1]).toBeCloseTo(100, 12);
  });

  test('weights weigh rows; a constant sample gets scale 1', () => {
    const st = standardiserOf({ n: 3, d: 1, data: Float64Array.of(0, 10, 4), weights: Float64Array.of(1, 1, 0) }, Float64Array.of(1));
    expect(st.mean[0]).toBe(5);
    expect(standardiserOf({ n: 2, d: 1, data: Float64Array.of(3, 3), weights: null }, Float64Array.of(1)).scale[0]).toBe(1);
  });
});
