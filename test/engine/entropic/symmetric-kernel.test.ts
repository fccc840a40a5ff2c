import { buildKernelPlain } from '../../../src/engine/entropic/kernel';
import {
  buildSymmetricKernel,
  packedRowStart,
  packedSize,
  softMinSelf,
  squareSymmetricKernel,
  symmetricKernelTimes,
} from '../../../src/engine/entropic/symmetric-kernel';
import type { Points } from '../../../src/engine/points';

function rows(n: number, d: number, seed: number): Points {
  let s = seed >>> 0;
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    data[i] = (2 * s) / 4294967296 - 1;
  }
  return { n, d, data };
}

describe('symmetric-kernel', () => {
  const n = 7; // odd, so the two-row loops meet a last single row
  const x = rows(n, 2, 1);
  const f = Float64Array.from({ length: n }, (_, i) => 0.1 * Math.cos(i));
  const eps = 0.3;
  const full = new Float64Array(n * n);
  buildKernelPlain(x, x, f, f, eps, full);

  test('packedSize and packedRowStart index the upper triangle row by row', () => {
    // Source: common practice (packed upper-triangular storage), 3 x 3: rows of 3, 2, 1 entries.
    expect(packedSize(3)).toBe(6);
    expect([0, 1, 2].map((i) => packedRowStart(i, 3))).toEqual([0, 3, 5]);
  });

  test('buildSymmetricKernel stores exactly the upper triangle of the full kernel exp((f_i + f_j - C_ij) / eps)', () => {
    const P = new Float64Array(packedSize(n));
    buildSymmetricKernel(x, f, eps, P);
    // Source: buildKernelPlain (kernel.ts), itself checked against the closed form.
    for (let i = 0; i < n; i++) for (let j = i; j < n; j++) expect(P[packedRowStart(i, n) + j - i]).toBe(full[i * n + j]);
  });

  test('symmetricKernelTimes equals the dense product K w', () => {
    const P = new Float64Array(packedSize(n));
    buildSymmetricKernel(x, f, eps, P);
    const w = Float64Array.from({ length: n }, (_, i) => 1 + i / 3);
    const s = new Float64Array(n).fill(9);
    symmetricKernelTimes(P, n, w, s);
    for (let i = 0; i < n; i++) {
      let want = 0;
      for (let j = 0; j < n; j++) want += full[i * n + j] * w[j];
      // Source: common practice (dense matrix-vector product), up to rounding of a different summation order.
      expect(Math.abs(s[i] - want)).toBeLessThan(1e-14 * want);
    }
  });

  test('squareSymmetricKernel gives (u_i K_ij u_j)^2', () => {
    const P = Float64Array.of(1, 2, 3); // [[1, 2], [2, 3]]
    squareSymmetricKernel(P, 2, Float64Array.of(2, 0.5));
    // Source: exp(2z) = exp(z)^2: (2*1*2)^2, (2*2*0.5)^2, (0.5*3*0.5)^2.
    expect(Array.from(P)).toEqual([16, 4, 0.5625]);
  });

  test('softMinSelf is the log-domain symmetric Sinkhorn map -eps log sum_j a_j exp((f_j - C_ij) / eps), even where exp underflows', () => {
    const logA = Float64Array.from({ length: n }, (_, i) => Math.log((1 + (i % 2)) / 10));
    const tiny = 1e-4; // exp(-C / 1e-4) underflows for most pairs
    const out = new Float64Array(n);
    softMinSelf(x, logA, f, tiny, out, new Float64Array(n));
    for (let i = 0; i < n; i++) {
      const z = Array.from({ length: n }, (_, j) => {
        const c = ((x.data[2 * i] - x.data[2 * j]) ** 2 + (x.data[2 * i + 1] - x.data[2 * j + 1]) ** 2) / 2;
        return logA[j] + (f[j] - c) / tiny;
      });
      const mx = Math.max(...z);
      // Source: the symmetric Sinkhorn update (Feydy et al. 2019, section 3.1), log-sum-exp in closed form.
      expect(out[i]).toBeCloseTo(-tiny * (mx + Math.log(z.reduce((s, v) => s + Math.exp(v - mx), 0))), 12);
      expect(Number.isFinite(out[i])).toBe(true);
    }
  });

  test('inputs are not mutated', () => {
    const copies = [x.data, f].map((a) => Float64Array.from(a));
    buildSymmetricKernel(x, f, eps, new Float64Array(packedSize(n)));
    softMinSelf(x, new Float64Array(n).fill(-Math.log(n)), f, eps, new Float64Array(n), new Float64Array(n));
    expect([x.data, f]).toEqual(copies);
  });
});
