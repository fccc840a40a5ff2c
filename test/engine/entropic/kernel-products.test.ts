import { squareKernel } from '../../../src/engine/entropic/kernel';
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
    fusedScalingPass(
      K,
      2,
      3,
      Float64Array.of(0.5, 0.5),
      Float64Array.of(0.2, 0.3, 0.5),
      Float64Array.of(2, 1),
      1.5,
      uOut,
      new Float64Array(3),
      new Float64Array(2),
    );
    // Source: Thibault et al. 2017, arXiv 1711.01851, eq. (8).
    expect(uOut[0]).toBeCloseTo(Math.pow(2, -0.5) * Math.pow(1 / 2.3, 1.5), 14);
  });

  test('fusedScalingPass reports a row whose product is 0 instead of dividing by it', () => {
    const Z = Float64Array.of(0, 0, 1, 1);
    const ok = fusedScalingPass(
      Z,
      2,
      2,
      Float64Array.of(0.5, 0.5),
      Float64Array.of(0.5, 0.5),
      Float64Array.of(1, 1),
      1,
      new Float64Array(2),
      new Float64Array(2),
      new Float64Array(2),
    );
    expect(ok).toBe(false);
  });

  /** The one-row reference of the fused pass: s_i = K_i. bv, u_i = u_i^(1-w) (1/s_i)^w, t = K^T(a u), skipping bad rows. */
  function reference(K: Float64Array, n: number, m: number, a: Float64Array, bv: Float64Array, u: Float64Array, omega: number) {
    const uOut = new Float64Array(n);
    const t = new Float64Array(m);
    let err = 0;
    let mass = 0;
    let ok = true;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < m; j++) s += K[i * m + j] * bv[j];
      uOut[i] = omega === 1 ? 1 / s : u[i] * Math.pow(1 / s / u[i], omega);
      if (!(uOut[i] > 0 && uOut[i] < Infinity)) {
        ok = false;
        continue;
      }
      err += Math.abs(a[i] * uOut[i] * s - a[i]);
      mass += a[i] * uOut[i] * s;
      for (let j = 0; j < m; j++) t[j] += a[i] * uOut[i] * K[i * m + j];
    }
    return { uOut, t, err, mass, ok };
  }

  test('the four-row blocked pass equals the one-row reference on sizes that leave remainders (7 x 5), plain and over-relaxed', () => {
    const n = 7;
    const m = 5;
    const K7 = Float64Array.from({ length: n * m }, (_, k) => Math.exp(-((k * 37) % 11) / 4));
    const a = Float64Array.from({ length: n }, (_, i) => (1 + i) / 28);
    const bv = Float64Array.from({ length: m }, (_, j) => 0.1 + 0.05 * j);
    const u = Float64Array.from({ length: n }, (_, i) => 0.5 + i / 10);
    for (const omega of [1, 1.4]) {
      const uOut = new Float64Array(n);
      const t = new Float64Array(m);
      const stats = new Float64Array(2);
      expect(fusedScalingPass(K7, n, m, a, bv, u, omega, uOut, t, stats)).toBe(true);
      // Source: the one-row loop above (Sinkhorn's u-step and K^T(a u)), up to the rounding of another summation order.
      const want = reference(K7, n, m, a, bv, u, omega);
      for (let i = 0; i < n; i++) expect(uOut[i]).toBeCloseTo(want.uOut[i], 13);
      for (let j = 0; j < m; j++) expect(t[j]).toBeCloseTo(want.t[j], 13);
      expect(stats[0]).toBeCloseTo(want.err, 13);
      expect(stats[1]).toBeCloseTo(want.mass, 13);
    }
  });

  test('a zero row inside a four-row block is reported and left out of t, the other rows still count', () => {
    const n = 5;
    const m = 3;
    const Kz = Float64Array.from({ length: n * m }, (_, k) => (k >= 3 && k < 6 ? 0 : 1 + (k % 4)));
    const a = new Float64Array(n).fill(0.2);
    const bv = new Float64Array(m).fill(1 / 3);
    const t = new Float64Array(m);
    const uOut = new Float64Array(n);
    expect(fusedScalingPass(Kz, n, m, a, bv, new Float64Array(n).fill(1), 1, uOut, t, new Float64Array(2))).toBe(false);
    const want = reference(Kz, n, m, a, bv, new Float64Array(n).fill(1), 1);
    expect(want.ok).toBe(false);
    for (let j = 0; j < m; j++) expect(t[j]).toBeCloseTo(want.t[j], 14);
    expect(t.every(Number.isFinite)).toBe(true);
  });

  test('kernelTimes and kernelTransposeTimes handle odd sizes and zero weights (3 x 3)', () => {
    const K3 = Float64Array.of(1, 2, 3, 4, 5, 6, 7, 8, 9);
    const s = new Float64Array(3);
    kernelTimes(K3, 3, 3, Float64Array.of(1, 0, 2), s);
    // Source: common practice, [1+6, 4+12, 7+18] and [1*1+7*2, 2+16, 3+18] with a zero weight on row 2.
    expect(Array.from(s)).toEqual([7, 16, 25]);
    const t = new Float64Array(3);
    kernelTransposeTimes(K3, 3, 3, Float64Array.of(1, 0, 2), t);
    expect(Array.from(t)).toEqual([15, 18, 21]);
  });

  test('a pass that squares the kernel first gives the same bits as squareKernel followed by the pass', () => {
    const n = 6;
    const m = 5;
    const base = Float64Array.from({ length: n * m }, (_, k) => Math.exp(-((k * 29) % 13) / 5));
    const sqU = Float64Array.from({ length: n }, (_, i) => 0.7 + i / 9);
    const sqV = Float64Array.from({ length: m }, (_, j) => 1.3 - j / 11);
    const a = new Float64Array(n).fill(1 / n);
    const bv = new Float64Array(m).fill(1 / m);
    const u = new Float64Array(n).fill(1);
    const K1 = Float64Array.from(base);
    const out1 = [new Float64Array(n), new Float64Array(m), new Float64Array(2)] as const;
    fusedScalingPass(K1, n, m, a, bv, u, 1, out1[0], out1[1], out1[2], { u: sqU, v: sqV });
    const K2 = Float64Array.from(base);
    squareKernel(K2, n, m, sqU, sqV);
    const out2 = [new Float64Array(n), new Float64Array(m), new Float64Array(2)] as const;
    fusedScalingPass(K2, n, m, a, bv, u, 1, out2[0], out2[1], out2[2]);
    // Source: squareKernel (kernel.ts), the same arithmetic in the same order.
    expect(Array.from(K1)).toEqual(Array.from(K2));
    for (let k = 0; k < 3; k++) expect(Array.from(out1[k])).toEqual(Array.from(out2[k]));
  });
});
