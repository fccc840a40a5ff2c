import { RemapError } from '../errors';
import type { Points } from '../points';

/** Mean and covariance of a (weighted) sample. */
export interface Moments {
  readonly d: number;
  /** Weighted column means, length d. */
  readonly mean: Float64Array;
  /** Weighted covariance, row-major d x d, exactly symmetric, divided by the total weight. */
  readonly cov: Float64Array;
  /** Sum of the weights (n when unweighted). */
  readonly totalWeight: number;
  /** Per-column smallest and largest value over rows of positive weight (the range the sample covers). */
  readonly min: Float64Array;
  readonly max: Float64Array;
}

/**
 * The mean and covariance of the empirical distribution of `p`: each row i
 * carries mass w_i / sum(w) (or 1/n without weights), and
 *   mean = sum_i w_i x_i / W,   cov = sum_i w_i (x_i - mean)(x_i - mean)^T / W.
 * The covariance is divided by the total weight W (n when unweighted), not by
 * n - 1: these are the moments of the sample as a distribution, which is what
 * a transport map between the two samples needs. Multiply by n / (n - 1) for
 * the unbiased sample covariance.
 *
 * Two passes over the rows (mean, then centred products in blocks of rows),
 * accumulating only the upper triangle and mirroring it, so the result is
 * exactly symmetric.
 * Cost: O(n d^2) time, O(d^2 + 256 d) extra memory. Never mutates `p` or `weights`.
 *
 * @param p the rows (n >= 1, d >= 1, finite values).
 * @param weights optional row weights, one per row, finite and >= 0, not all zero; null or omitted = equal weights.
 * @throws RemapError for an empty sample, wrong weight count, a negative or
 *   non-finite weight, all-zero weights, or non-finite values (or values so
 *   large their squares overflow).
 * @example weightedMoments({ n: 3, d: 1, data: Float64Array.from([1, 2, 3]) })
 * // { d: 1, mean: [2], cov: [2/3], totalWeight: 3, min: [1], max: [3] }
 */
export function weightedMoments(p: Points, weights?: ArrayLike<number> | null): Moments {
  const fn = 'weightedMoments';
  const { n, d, data } = p;
  if (!(Number.isInteger(n) && n >= 1)) throw new RemapError(`${fn}: the sample has ${n} rows; give at least one row.`);
  if (!(Number.isInteger(d) && d >= 1)) throw new RemapError(`${fn}: the sample has ${d} columns; give at least one column.`);
  if (data.length !== n * d)
    throw new RemapError(`${fn}: the data holds ${data.length} numbers but n x d = ${n * d}; build the points with points() or sample().`);
  const mean = new Float64Array(d);
  const acc = new Float64Array(d * d);
  // The column ranges come with the mean pass for free (the linear map needs both).
  const min = new Float64Array(d).fill(Infinity);
  const max = new Float64Array(d).fill(-Infinity);
  let total: number;

  if (weights == null) {
    total = n;
    for (let i = 0, j = 0; i < n; i++) {
      for (let k = 0; k < d; k++, j++) {
        const v = data[j];
        mean[k] += v;
        if (v < min[k]) min[k] = v;
        if (v > max[k]) max[k] = v;
      }
    }
    for (let k = 0; k < d; k++) mean[k] /= n;
  } else {
    if (weights.length !== n) throw new RemapError(`${fn}: ${weights.length} weights for ${n} rows; give one weight per row.`);
    total = 0;
    for (let i = 0; i < n; i++) {
      const w = weights[i];
      if (!(w >= 0) || !Number.isFinite(w)) throw new RemapError(`${fn}: weight ${i + 1} is ${w}; weights must be finite and zero or positive.`);
      total += w;
    }
    if (!(total > 0) || !Number.isFinite(total))
      throw new RemapError(`${fn}: the weights add up to ${total}; give at least one positive weight (and rescale huge ones).`);
    for (let i = 0, j = 0; i < n; i++) {
      const w = weights[i];
      for (let k = 0; k < d; k++, j++) {
        const v = data[j];
        mean[k] += w * v;
        if (w > 0) {
          if (v < min[k]) min[k] = v;
          if (v > max[k]) max[k] = v;
        }
      }
    }
    for (let k = 0; k < d; k++) mean[k] /= total;
  }

  // Centred products block by block: BLOCK rows are copied, centred, into a
  // column-major scratch that stays in cache; each (k, l) entry of the upper
  // triangle is then a short dot product summed in registers.
  const block = Math.min(BLOCK, n);
  const cen = new Float64Array(block * d);
  const wcen = weights == null ? cen : new Float64Array(block * d);
  for (let start = 0; start < n; start += block) {
    const len = Math.min(block, n - start);
    for (let r = 0; r < len; r++) {
      const o = (start + r) * d;
      const w = weights == null ? 1 : weights[start + r];
      for (let k = 0; k < d; k++) {
        const c = data[o + k] - mean[k];
        cen[k * block + r] = c;
        if (wcen !== cen) wcen[k * block + r] = w * c;
      }
    }
    for (let k = 0; k < d; k++) {
      const kb = k * block;
      for (let l = k; l < d; l++) acc[k * d + l] += dot(wcen, kb, cen, l * block, len);
    }
  }

  for (let k = 0; k < d; k++) {
    if (!Number.isFinite(mean[k]))
      throw new RemapError(`${fn}: column ${k + 1} holds a non-finite or too large value (its mean is ${mean[k]}); remove or rescale it.`);
    for (let l = k; l < d; l++) {
      const v = acc[k * d + l] / total;
      if (!Number.isFinite(v)) throw new RemapError(`${fn}: columns ${k + 1} and ${l + 1} hold values too large to square (covariance ${v}); rescale them.`);
      acc[k * d + l] = v;
      acc[l * d + k] = v;
    }
  }
  return { d, mean, cov: acc, totalWeight: total, min, max };
}

/** Rows per block of the centred-product pass (a 10-column block fits in a 32 KB cache). */
const BLOCK = 256;

/** sum_{r < len} x[i + r] * y[j + r], with four running sums. */
function dot(x: Float64Array, i: number, y: Float64Array, j: number, len: number): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let r = 0;
  for (; r + 3 < len; r += 4) {
    s0 += x[i + r] * y[j + r];
    s1 += x[i + r + 1] * y[j + r + 1];
    s2 += x[i + r + 2] * y[j + r + 2];
    s3 += x[i + r + 3] * y[j + r + 3];
  }
  for (; r < len; r++) s0 += x[i + r] * y[j + r];
  return s0 + s1 + (s2 + s3);
}
