import { fusedScalingPass, kernelTimes, kernelTransposeTimes } from '../../../src/engine/entropic/kernel-products';

describe('kernel-products', () => {
  const K = Float64Array.of(1, 2, 3, 4, 5, 6); // 2 x 3

  test('kernelTimes and kernelTransposeTimes are K w and K^T w', () => {
    const s = new Float64Array(2);
    kernelTimes(K, 2, 3, Float64Array.of(1, 0, 1), s);
    // Source: common practice, [1+3, 4+6].
    expect(Array.from(s)).toEqual([4, 10]);
    const t = new Float64Array(3).fill(9);
    kernelTransposeTimes(K, 2, 3, Float64Array.of(1, 2), t);
    // Source: common practice, [1+8, 2+10, 3+12].
    expect(Array.from(t)).toEqual([9, 12, 15]);
  });

  test('fusedScalingPass with omega = 1 gives u = 1 / K(bv), t = K^T(a u), zero source error and unit mass', () => {
    const a = Float64Array.of(0.5, 0.5);
    const bv = Float64Array.of(0.2, 0.3, 0.5);
    const u = Float64Array.of(1, 1);
    const uOut = new Float64Array(2);
    const t = new Float64Array(3);
    const stats = new Float64Array(2);
    expect(fusedScalingPass(K, 2, 3, a, bv, u, 1, uOut, t, stats)).toBe(true);
    // Source: Sinkhorn's u-step; K bv = [2.3, 5.3].
    expect(uOut[0]).toBeCloseTo(1 / 2.3, 15);
    expect(uOut[1]).toBeCloseTo(1 / 5.3, 15);
    expect(t[0]).toBeCloseTo(0.5 / 2.3 + 2 / 5.3, 15);
    expect(stats[0]).toBeLessThan(1e-15);
    expect(stats[1]).toBeCloseTo(1, 15);
  });

  test('fusedScalingPass with omega > 1 over-relaxes: u_out = u^(1-omega) (1/s)^omega', () => {
    const uOut = new Float64Array(2);
    fusedScalingPass(K, 2, 3, Float64Array.of(0.5, 0.5), Float64Array.of(0.2, 0.3, 0.5), Float64Array.of(2, 1), 1.5, uOut, new Float64Array(3), new Float64Array(2));
    // Source: Thibault et al. 2017, arXiv 1711.01851, eq. (8).
    expect(uOut[0]).toBeCloseTo(Math.pow(2, -0.5) * Math.pow(1 / 2.3, 1.5), 14);
  });

  test('fusedScalingPass reports a row whose product is 0 instead of dividing by it', () => {
    const Z = Float64Array.of(0, 0, 1, 1);
    const ok = fusedScalingPass(Z, 2, 2, Float64Array.of(0.5, 0.5), Float64Array.of(0.5, 0.5), Float64Array.of(1, 1), 1, new Float64Array(2), new Float64Array(2), new Float64Array(2));
    expect(ok).toBe(false);
  });
});
