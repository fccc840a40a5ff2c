import { buildKernelPlain, buildKernelRecentred, maxSquarings, repairColumn, squareKernel } from '../../../src/engine/entropic/kernel';
import { points } from '../../../src/engine/points';

const x = points([
  [0, 0],
  [1, 0],
  [0, 2],
]);
const y = points([
  [1, 1],
  [2, 0],
]);
const cost = (i: number, j: number): number => ((x.data[2 * i] - y.data[2 * j]) ** 2 + (x.data[2 * i + 1] - y.data[2 * j + 1]) ** 2) / 2;

describe('kernel', () => {
  test('buildKernelPlain writes exp((f_i + g_j - C_ij) / eps) with C = |x - y|^2 / 2', () => {
    const f = Float64Array.of(0.1, -0.2, 0.3);
    const g = Float64Array.of(0.5, 0);
    const K = new Float64Array(6);
    buildKernelPlain(x, y, f, g, 0.7, K);
    // Source: Schmitzer 2019, eq. (3.4) (stabilised kernel).
    for (let i = 0; i < 3; i++) for (let j = 0; j < 2; j++) expect(K[i * 2 + j]).toBeCloseTo(Math.exp((f[i] + g[j] - cost(i, j)) / 0.7), 14);
  });

  test('buildKernelRecentred sets f to the exact log-sum-exp update, so sum_j b_j K_ij = 1', () => {
    const b = Float64Array.of(0.25, 0.75);
    const g = Float64Array.of(0.5, 0);
    const f = new Float64Array(3);
    const K = new Float64Array(6);
    const eps = 0.01;
    buildKernelRecentred(x, y, b, f, g, eps, K);
    for (let i = 0; i < 3; i++) {
      // Source: the Sinkhorn f-update, f_i = -eps log sum_j b_j exp((g_j - C_ij) / eps), in closed form.
      const terms = [0, 1].map((j) => Math.log(b[j]) + (g[j] - cost(i, j)) / eps);
      const m = Math.max(...terms);
      expect(f[i]).toBeCloseTo(-eps * (m + Math.log(terms.reduce((s, t) => s + Math.exp(t - m), 0))), 12);
      expect(b[0] * K[i * 2] + b[1] * K[i * 2 + 1]).toBeCloseTo(1, 14);
    }
  });

  test('buildKernelRecentred with column weights also writes the column sums K^T a, and the same K and f', () => {
    const b = Float64Array.of(0.25, 0.75);
    const g = Float64Array.of(0.5, 0);
    const a = Float64Array.of(0.2, 0.3, 0.5);
    const f1 = new Float64Array(3);
    const K1 = new Float64Array(6);
    buildKernelRecentred(x, y, b, f1, g, 0.2, K1);
    const f2 = new Float64Array(3);
    const K2 = new Float64Array(6);
    const t = new Float64Array(2).fill(9);
    buildKernelRecentred(x, y, b, f2, g, 0.2, K2, a, t);
    expect(Array.from(K2)).toEqual(Array.from(K1));
    expect(Array.from(f2)).toEqual(Array.from(f1));
    // Source: the definition t_j = sum_i a_i K_ij.
    for (let j = 0; j < 2; j++) expect(t[j]).toBeCloseTo(a[0] * K1[j] + a[1] * K1[2 + j] + a[2] * K1[4 + j], 15);
  });

  test('squareKernel gives (u_i K_ij v_j)^2, the kernel at eps / 2 after absorbing the scalings', () => {
    const K = Float64Array.of(0.5, 2, 1, 3);
    squareKernel(K, 2, 2, Float64Array.of(2, 1), Float64Array.of(1, 0.5));
    // Source: exp(2z) = exp(z)^2.
    expect(Array.from(K)).toEqual([1, 4, 1, 2.25]);
  });

  test('repairColumn sets g_j by its exact update and rewrites column j', () => {
    const logA = Float64Array.of(Math.log(0.5), Math.log(0.25), Math.log(0.25));
    const f = Float64Array.of(0, 0.1, -0.1);
    const g = new Float64Array(2);
    const K = new Float64Array(6).fill(7);
    const eps = 0.3;
    repairColumn(x, y, logA, f, g, eps, K, 1, new Float64Array(3));
    // Source: the Sinkhorn g-update, g_j = -eps log sum_i a_i exp((f_i - C_ij) / eps).
    const want = -eps * Math.log([0, 1, 2].reduce((s, i) => s + Math.exp(logA[i] + (f[i] - cost(i, 1)) / eps), 0));
    expect(g[1]).toBeCloseTo(want, 13);
    expect(K[0]).toBe(7);
    for (let i = 0; i < 3; i++) expect(K[i * 2 + 1]).toBeCloseTo(Math.exp((f[i] + g[1] - cost(i, 1)) / eps), 13);
  });

  test('maxSquarings allows squarings while 2^s * 8 * 2^-53 stays below tolerance / 10, never fewer than 12', () => {
    // Source: the error bound in the doc comment (each squaring doubles an entry's relative error).
    expect(maxSquarings(1e-4)).toBe(Math.floor(Math.log2(1e-4 / 10 / (8 * 2 ** -53))));
    expect(maxSquarings(1e-4)).toBe(33);
    expect(maxSquarings(1e-6)).toBe(26);
    expect(maxSquarings(1e-14)).toBe(12);
    for (const tol of [1e-3, 1e-6, 1e-9]) expect(2 ** maxSquarings(tol) * 8 * 2 ** -53).toBeLessThan(tol / 10);
  });
});
