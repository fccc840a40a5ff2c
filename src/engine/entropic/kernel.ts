import type { Points } from '../points';
import { squaredDistancesRow } from '../stats/sq-distances';
import { logitRows2 } from './cost-rows';

/**
 * The stabilised Gibbs kernel of log-domain Sinkhorn, stored dense and
 * row-major in one Float64Array of n m entries:
 *   K_ij = exp((f_i + g_j - C_ij) / eps),   C_ij = |x_i - y_j|^2 / 2,
 * where f, g are the potentials absorbed so far. The solver then works with
 * scalings u, v of modest size on top of K (Schmitzer 2019, "Stabilized sparse
 * scaling algorithms for entropy regularized transport problems", section 3.1),
 * so each iteration is two matrix-vector products and no Math.exp.
 * Memory: 8 n m bytes (200 MB at 5,000 x 5,000); the cost matrix is never
 * stored, but recomputed row by row whenever the kernel is built afresh.
 */

/**
 * Builds K afresh (one Math.exp per entry) and at the same time replaces f by
 * its exact Sinkhorn update given g:
 *   f_i = -eps log sum_j b_j exp((g_j - C_ij) / eps)
 * computed with a row-wise max shift (stable log-sum-exp), so that after the
 * call sum_j b_j K_ij = 1 for every row: no row of K can underflow to zeros.
 * Rows are taken two at a time for the distances (`logitRows2`). With
 * `colWeights` and `colSums`, also writes colSums_j = sum_i colWeights_i K_ij
 * (the column sums K^T a, row by row) during the last pass over each row,
 * sparing a separate product over the whole kernel.
 * O(n m (d + 1)) time, no extra memory beyond K.
 * @param x source rows (n), y target rows (m), same columns.
 * @param b target masses (length m, positive, summing to 1); g target potential (length m, finite).
 * @param f receives the new source potential (length n).
 * @param eps > 0. @param K receives the kernel (length >= n m).
 * @example buildKernelRecentred(x, y, b, f, g, 0.1, K) // K ready, u = 1 exact for the rows
 */
export function buildKernelRecentred(
  x: Points,
  y: Points,
  b: Float64Array,
  f: Float64Array,
  g: Float64Array,
  eps: number,
  K: Float64Array,
  colWeights: Float64Array | null = null,
  colSums: Float64Array | null = null,
): void {
  const n = x.n;
  const m = y.n;
  const d = x.d;
  const inv = 1 / eps;
  const max = new Float64Array(2);
  if (colWeights && colSums) colSums.fill(0, 0, m);
  for (let i = 0; i < n; i += 2) {
    const i1 = Math.min(i + 1, n - 1);
    logitRows2(x.data, i, i1, y.data, d, 0, m, g, inv, K, i * m, i1 * m, max);
    for (let r = i; r <= i1; r++) {
      const o = r * m;
      const s = expRow(K, o, m, b, max[r - i]);
      // s >= b_jmax * 1 > 0 because the largest entry is exp(0) = 1.
      const scale = 1 / s;
      if (colWeights && colSums) scaleRowAdding(K, o, m, scale, colWeights[r], colSums);
      else for (let j = 0; j < m; j++) K[o + j] *= scale;
      f[r] = -eps * (max[r - i] + Math.log(s));
    }
  }
}

/** K[o + j] <- exp(K[o + j] - max) for j < m; returns sum_j b_j K[o + j]. O(m). */
function expRow(K: Float64Array, o: number, m: number, b: Float64Array, max: number): number {
  let s = 0;
  for (let j = 0; j < m; j++) {
    const w = Math.exp(K[o + j] - max);
    K[o + j] = w;
    s += b[j] * w;
  }
  return s;
}

/** K[o + j] *= scale, then sums_j += w K[o + j], for j < m. O(m). */
function scaleRowAdding(K: Float64Array, o: number, m: number, scale: number, w: number, sums: Float64Array): void {
  for (let j = 0; j < m; j++) {
    const k = K[o + j] * scale;
    K[o + j] = k;
    sums[j] += w * k;
  }
}

/**
 * Builds K afresh from given potentials, without changing them:
 * K_ij = exp((f_i + g_j - C_ij) / eps). Used by the self-transport solve, where
 * the row and column potentials must stay equal. O(n m (d + 1)).
 * @example buildKernelPlain(x, x, f, f, 0.1, K)
 */
export function buildKernelPlain(x: Points, y: Points, f: Float64Array, g: Float64Array, eps: number, K: Float64Array): void {
  const n = x.n;
  const m = y.n;
  const inv = 1 / eps;
  for (let i = 0; i < n; i++) {
    const o = i * m;
    squaredDistancesRow(x, i, y, K, o, 0.5);
    const fi = f[i];
    for (let j = 0; j < m; j++) K[o + j] = Math.exp((fi + g[j] - K[o + j]) * inv);
  }
}

/**
 * Moves the kernel from eps to eps / 2 while absorbing the scalings:
 * K'_ij = (u_i K_ij v_j)^2 = exp((F_i + G_j - C_ij) / (eps / 2)) with
 * F = f + eps log u, G = g + eps log v. One multiply pass, no Math.exp; each
 * squaring doubles the relative rounding error of an entry, so the solver
 * rebuilds exactly after `maxSquarings(tolerance)` of them. O(n m).
 * @example squareKernel(K, 2, 2, Float64Array.of(1, 1), Float64Array.of(1, 1)) // K_ij <- K_ij^2
 */
export function squareKernel(K: Float64Array, n: number, m: number, u: Float64Array, v: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const o = i * m;
    const ui = u[i];
    for (let j = 0; j < m; j++) {
      const t = ui * K[o + j] * v[j];
      K[o + j] = t * t;
    }
  }
}

/** The fewest squarings allowed between exact rebuilds, whatever the tolerance. */
const MIN_SQUARINGS = 12;

/**
 * How many times the kernel may be squared before an exact rebuild, for a given
 * tolerance. After s squarings an entry carries a relative error of about
 * 2^s * 4 * 2^-53 (each squaring doubles the error of u_i K_ij v_j and adds a
 * few roundings), and the L1 marginal error measured on the stored kernel then
 * differs from the true one by at most twice that. Allowing s while that is
 * below tolerance / 10 costs nothing in accuracy and spares a build
 * (n m Math.exp calls and the distances) on most fits; never fewer than 12.
 * O(1).
 * @example maxSquarings(1e-4) // 33; maxSquarings(1e-14) // 12
 */
export function maxSquarings(tolerance: number): number {
  const s = Math.floor(Math.log2(tolerance / 10 / (8 * 2 ** -53)));
  return Math.max(MIN_SQUARINGS, Math.min(40, Number.isFinite(s) ? s : MIN_SQUARINGS));
}

/**
 * Replaces column j's potential by its exact Sinkhorn update given f,
 *   g_j = -eps log sum_i a_i exp((f_i - C_ij) / eps)   (stable log-sum-exp),
 * and rewrites column j of K to match. For the rare column whose kernel entries
 * all underflowed (a target point far from every source point at small eps).
 * O(n d) time, O(n) scratch.
 * @example repairColumn(x, y, logA, f, g, 0.01, K, 3, scratch)
 */
export function repairColumn(
  x: Points,
  y: Points,
  logA: Float64Array,
  f: Float64Array,
  g: Float64Array,
  eps: number,
  K: Float64Array,
  j: number,
  scratch: Float64Array,
): void {
  const n = x.n;
  const m = y.n;
  const d = x.d;
  const inv = 1 / eps;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    let c = 0;
    for (let k = 0; k < d; k++) {
      const t = x.data[i * d + k] - y.data[j * d + k];
      c += t * t;
    }
    const e = (f[i] - 0.5 * c) * inv;
    scratch[i] = e;
    if (e + logA[i] > max) max = e + logA[i];
  }
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.exp(scratch[i] + logA[i] - max);
  g[j] = -eps * (max + Math.log(s));
  const gj = g[j] * inv;
  for (let i = 0; i < n; i++) K[i * m + j] = Math.exp(scratch[i] + gj);
}
