import { RemapError } from '../errors';
import type { Points } from '../points';

/** Weighted mean, covariance (divided by the total weight) and range of rows with positive weight. */
export interface CountMoments {
  readonly mean: Float64Array;
  readonly cov: Float64Array;
  readonly min: Float64Array;
  readonly max: Float64Array;
}

/**
 * The moments of the empirical distribution in which row i weighs w_i (a
 * bootstrap count, or a replicate weight): mean = sum w_i x_i / W and
 * cov = sum w_i (x_i - mean)(x_i - mean)^T / W, W = sum w_i, by two passes (the
 * definition `weightedMoments` uses; it sums in blocks, so the two agree to
 * rounding, not bit for bit). Rows of weight 0 are skipped. Unlike
 * `weightedMoments` it does not check each weight (the caller's weights are
 * counts or checked replicate weights), which keeps the loop free of calls.
 * Cost: O(n d^2).
 * @param w one weight per row, >= 0, with a positive total.
 * @throws RemapError when the total is not positive, or a mean or covariance is not finite (values too large).
 * @example countMoments(column([1, 2, 4]), Float64Array.of(1, 2, 0), 'bounds') // mean [5/3], cov [2/9]
 */
export function countMoments(p: Points, w: Float64Array, fn: string): CountMoments {
  const { n, d, data } = p;
  const mean = new Float64Array(d);
  const cov = new Float64Array(d * d);
  const min = new Float64Array(d).fill(Infinity);
  const max = new Float64Array(d).fill(-Infinity);
  const diff = new Float64Array(d);
  let total = 0;
  for (let i = 0, o = 0; i < n; i++, o += d) {
    const wi = w[i];
    if (!(wi > 0)) continue;
    total += wi;
    for (let k = 0; k < d; k++) {
      const v = data[o + k];
      mean[k] += wi * v;
      if (v < min[k]) min[k] = v;
      if (v > max[k]) max[k] = v;
    }
  }
  if (!(total > 0)) throw new RemapError(`${fn}: a replicate gives no row a positive weight.`);
  for (let k = 0; k < d; k++) mean[k] /= total;
  for (let i = 0, o = 0; i < n; i++, o += d) {
    const wi = w[i];
    if (!(wi > 0)) continue;
    for (let k = 0; k < d; k++) diff[k] = data[o + k] - mean[k];
    for (let k = 0; k < d; k++) {
      const a = wi * diff[k];
      for (let l = k; l < d; l++) cov[k * d + l] += a * diff[l];
    }
  }
  for (let k = 0; k < d; k++) {
    if (!(Math.abs(mean[k]) < Infinity)) throw new RemapError(`${fn}: column ${k + 1} holds values too large to average (mean ${mean[k]}); rescale it.`);
    for (let l = k; l < d; l++) {
      const v = cov[k * d + l] / total;
      if (!(Math.abs(v) < Infinity))
        throw new RemapError(`${fn}: columns ${k + 1} and ${l + 1} hold values too large to square (covariance ${v}); rescale them.`);
      cov[k * d + l] = v;
      cov[l * d + k] = v;
    }
  }
  return { mean, cov, min, max };
}
