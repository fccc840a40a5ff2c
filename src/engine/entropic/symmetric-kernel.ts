import type { Points } from '../points';
import { squaredDistancesRow } from '../stats/sq-distances';

/**
 * The symmetric Gibbs kernel of a point set onto itself,
 *   K_ij = exp((f_i + f_j - C_ij) / eps),   C_ij = |x_i - x_j|^2 / 2,
 * stored once: only the upper triangle with the diagonal, row by row
 * (row i holds j = i..n-1 and starts at `packedRowStart(i, n)`), in
 * n (n + 1) / 2 entries. Building it takes half the Math.exp calls and half
 * the distances of the full square (measured 0.41 of the time at 4,000 rows,
 * d = 8), and half the memory. A product with it reads half the memory but
 * does the same arithmetic, and measured about as fast as the full product
 * (0.9-1.1 times); the self solves need only 2-12 products, so the build is
 * what counts. Used by the self-transport solve (the debiasing terms of the
 * Sinkhorn divergence).
 */

/** Entries of the packed upper triangle of an n x n symmetric matrix: n (n + 1) / 2. O(1). @example packedSize(3) // 6 */
export function packedSize(n: number): number {
  return (n * (n + 1)) / 2;
}

/** Index of entry (i, i) in the packed upper triangle; entry (i, j), j >= i, sits at packedRowStart(i, n) + j - i. O(1). @example packedRowStart(1, 3) // 3 */
export function packedRowStart(i: number, n: number): number {
  return i * n - (i * (i - 1)) / 2;
}

/**
 * Builds the packed symmetric kernel exp((f_i + f_j - C_ij) / eps) for j >= i.
 * O(n^2 (d + 1) / 2) time; no memory beyond P.
 * @param x the points (n rows); f the potential (length n, finite); eps > 0.
 * @param P receives the packedSize(n) entries.
 * @example buildSymmetricKernel(points([[0], [1]]), Float64Array.of(0, 0), 1, P) // P = [1, e^-0.5, 1]
 */
export function buildSymmetricKernel(x: Points, f: Float64Array, eps: number, P: Float64Array): void {
  const { n, d, data } = x;
  const inv = 1 / eps;
  let i = 0;
  // Two rows per sweep: each x_j is read once for rows i and i + 1 (the distance
  // arithmetic of squaredDistancesRow, in the same order, so the same bits).
  for (; i + 1 < n; i += 2) {
    const o0 = packedRowStart(i, n) - i;
    const o1 = packedRowStart(i + 1, n) - (i + 1);
    const x0 = i * d;
    const x1 = x0 + d;
    const f0 = f[i];
    const f1 = f[i + 1];
    P[o0 + i] = Math.exp((f0 + f0 - 0) * inv);
    for (let j = i + 1, yo = (i + 1) * d; j < n; j++, yo += d) {
      let s0 = 0;
      let s1 = 0;
      for (let k = 0; k < d; k++) {
        const v = data[yo + k];
        const t0 = data[x0 + k] - v;
        const t1 = data[x1 + k] - v;
        s0 += t0 * t0;
        s1 += t1 * t1;
      }
      const fj = f[j];
      P[o0 + j] = Math.exp((f0 + fj - 0.5 * s0) * inv);
      P[o1 + j] = Math.exp((f1 + fj - 0.5 * s1) * inv);
    }
  }
  if (i < n) P[packedRowStart(i, n)] = Math.exp((f[i] + f[i] - 0) * inv);
}

/**
 * Moves the packed kernel from eps to eps / 2 while absorbing the scaling u:
 * K'_ij = (u_i K_ij u_j)^2 (see squareKernel in kernel.ts). O(n^2 / 2).
 * @example squareSymmetricKernel(P, 2, Float64Array.of(1, 1)) // every entry squared
 */
export function squareSymmetricKernel(P: Float64Array, n: number, u: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const o = packedRowStart(i, n) - i;
    const ui = u[i];
    for (let j = i; j < n; j++) {
      const t = ui * P[o + j] * u[j];
      P[o + j] = t * t;
    }
  }
}

/**
 * The product s = K w with the packed symmetric kernel: each stored entry
 * K_ij (j > i) adds K_ij w_j to s_i and K_ij w_i to s_j, so every entry is read
 * once. Two rows per sweep. O(n^2 / 2).
 * @param s is overwritten (length n).
 * @example symmetricKernelTimes(Float64Array.of(1, 2, 3), 2, Float64Array.of(1, 1), s) // s = [3, 5] for K = [[1, 2], [2, 3]]
 */
export function symmetricKernelTimes(P: Float64Array, n: number, w: Float64Array, s: Float64Array): void {
  s.fill(0);
  let i = 0;
  for (; i + 1 < n; i += 2) {
    const o0 = packedRowStart(i, n) - i;
    const o1 = packedRowStart(i + 1, n) - (i + 1);
    const w0 = w[i];
    const w1 = w[i + 1];
    const k01 = P[o0 + i + 1];
    let acc0 = P[o0 + i] * w0 + k01 * w1;
    let acc1 = k01 * w0 + P[o1 + i + 1] * w1;
    for (let j = i + 2; j < n; j++) {
      const k0 = P[o0 + j];
      const k1 = P[o1 + j];
      const wj = w[j];
      acc0 += k0 * wj;
      acc1 += k1 * wj;
      s[j] += k0 * w0 + k1 * w1;
    }
    s[i] += acc0;
    s[i + 1] += acc1;
  }
  if (i < n) s[i] += P[packedRowStart(i, n)] * w[i];
}

/**
 * The exact symmetric Sinkhorn map in the log domain, without a stored kernel:
 *   out_i = -eps log sum_j a_j exp((f_j - C_ij) / eps)
 * (stable log-sum-exp with a row-wise max shift), for rows whose kernel
 * underflowed. O(n^2 (d + 1)) time, O(n) scratch.
 * @param logA log-masses (length n); f the potential; out receives the new potential (may not alias f).
 * @param scratch length >= n.
 * @example softMinSelf(x, logA, f, 0.1, out, scratch) // out = T(f)
 */
export function softMinSelf(x: Points, logA: Float64Array, f: Float64Array, eps: number, out: Float64Array, scratch: Float64Array): void {
  const n = x.n;
  const inv = 1 / eps;
  for (let i = 0; i < n; i++) {
    squaredDistancesRow(x, i, x, scratch, 0, 0.5);
    let max = -Infinity;
    for (let j = 0; j < n; j++) {
      const e = logA[j] + (f[j] - scratch[j]) * inv;
      scratch[j] = e;
      if (e > max) max = e;
    }
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.exp(scratch[j] - max);
    out[i] = -eps * (max + Math.log(s));
  }
}
