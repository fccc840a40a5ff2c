import { standardise, standardiserOf } from '../../../src/engine/gradient-net/standardise';

describe('standardiserOf', () => {
  test('centres each column and uses one scale sqrt(trace(cov) / d)', () => {
    const data = Float64Array.of(0, 0, 2, 4);
    const st = standardiserOf({ n: 2, d: 2, data, weights: null });
    expect(Array.from(st.mean)).toEqual([1, 2]);
    expect(st.scale).toBeCloseTo(Math.sqrt((1 + 4) / 2), 15); // Source: variances 1 and 4 (divisor n)
    const z = standardise(data, 2, st);
    expect(z[0]).toBeCloseTo(-1 / st.scale, 15);
    expect(Array.from(data)).toEqual([0, 0, 2, 4]);
  });

  test('weights weigh rows; a constant sample gets scale 1', () => {
    const st = standardiserOf({ n: 3, d: 1, data: Float64Array.of(0, 10, 4), weights: Float64Array.of(1, 1, 0) });
    expect(st.mean[0]).toBe(5);
    expect(standardiserOf({ n: 2, d: 1, data: Float64Array.of(3, 3), weights: null }).scale).toBe(1);
  });
});
