import type { Points } from '../points';

/** The constant of the default-eps rule, chosen on the known-truth benchmark (bench/entropic.bench.ts, SWEEP=1). */
export const DEFAULT_EPS_FACTOR = 0.125;

/**
 * The eps used when the user leaves it at 0 ("choose from the data"):
 *   eps = 0.125 * V * n^(-2 / (d + 4)),
 * where V = (tr Cov(source) + tr Cov(target)) / (2 d) is the mean variance of
 * one column (the scale of a squared coordinate difference, in the units of
 * the cost |x - y|^2 / 2) and n the smaller effective sample size (Kish:
 * (sum w)^2 / sum w^2). The n^(-2/(d+4)) rate is the kernel-smoothing
 * bandwidth rate for a squared length scale (Silverman's rule of thumb has
 * bandwidth ~ n^(-1/(d+4))): the entropic map averages target points within
 * about sqrt(eps) of the barycentre, so eps should shrink as the sample fills
 * the space.
 * Why one column's variance and not the total: the best eps of an eps sweep
 * against a known Brenier map (bench/truth.ts, n = 4,000) was about
 * 0.125 * total variance / d at every d tried: L2-UVP 0.15 %, 0.51 % and 2.4 %
 * for d = 2, 4, 8, where the total-variance rule (used until the speed work)
 * gave 0.17 %, 1.7 % and 22 % (at d = 8 worse than the linear map's 8 %);
 * at n = 2,000 the same (d = 8: 3.2 % against 10.6 % at twice the eps).
 * Columns on very different scales: the cost, and so eps, is in the data's
 * units, and the map smooths every column with the same sqrt(eps); columns
 * with a spread much smaller than the mean are smoothed more than the rest.
 * A sample with no spread at all gives V = 0; then eps = 1e-3 (any positive
 * value maps the constant source to the target mean). O((n + m) d).
 * @param x, y the supports (kept rows), logA, logB their log-masses (summing in exp to 1).
 * @example defaultEps(x, logA, y, logB) // 0.125 * (mean column variance) * n^(-2/(d+4))
 */
export function defaultEps(x: Points, logA: Float64Array, y: Points, logB: Float64Array): number {
  const d = x.d;
  const v = (totalVariance(x, logA) + totalVariance(y, logB)) / (2 * Math.max(1, d));
  const n = Math.min(effectiveSize(logA), effectiveSize(logB));
  const eps = DEFAULT_EPS_FACTOR * v * Math.pow(n, -2 / (d + 4));
  return eps > 0 && Number.isFinite(eps) ? eps : 1e-3;
}

/** Weighted total variance sum_k Var_w(column k), masses exp(logW). O(n d). */
export function totalVariance(p: Points, logW: Float64Array): number {
  const { n, d, data } = p;
  let total = 0;
  for (let k = 0; k < d; k++) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += Math.exp(logW[i]) * data[i * d + k];
    let s = 0;
    for (let i = 0; i < n; i++) {
      const z = data[i * d + k] - mean;
      s += Math.exp(logW[i]) * z * z;
    }
    total += s;
  }
  return total;
}

/** Kish's effective sample size 1 / sum_i w_i^2 for masses w_i = exp(logW_i) summing to 1. O(n). */
export function effectiveSize(logW: Float64Array): number {
  let s = 0;
  for (let i = 0; i < logW.length; i++) s += Math.exp(2 * logW[i]);
  return 1 / s;
}
