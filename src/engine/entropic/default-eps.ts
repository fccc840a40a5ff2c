import type { Points } from '../points';

/** The constant of the default-eps rule, chosen on the known-truth benchmark (bench/entropic.bench.ts). */
export const DEFAULT_EPS_FACTOR = 0.125;

/**
 * The eps used when the user leaves it at 0 ("choose from the data"):
 *   eps = 0.125 * V * n^(-2 / (d + 4)),
 * where V = (tr Cov(source) + tr Cov(target)) / 2 is the mean total variance
 * (the scale of squared distances within a sample, in the units of the cost
 * |x - y|^2 / 2) and n the smaller effective sample size (Kish: (sum w)^2 / sum w^2).
 * The n^(-2/(d+4)) rate is the kernel-smoothing bandwidth rate for a squared
 * length scale (Silverman's rule of thumb has bandwidth ~ n^(-1/(d+4))): the
 * entropic map averages target points within about sqrt(eps) of the
 * barycentre, so eps should shrink as the sample fills the space. The factor
 * 0.125 is where the L2-UVP of the map against a known Brenier map was lowest
 * in an eps sweep at n = 2,000 (d = 8: 6.7% at factor ~0.13 against 11.9% and
 * 19.1% at a third and three times that; d = 4: 1.6% at ~0.14; d = 2: flat,
 * 0.3-0.4%); at n = 4,000 it gives 0.23%, 1.13% and 5.05% for d = 2, 4, 8
 * (bench/entropic.bench.ts, SWEEP=1 reruns the sweep). A sample with
 * no spread at all gives V = 0; then eps = 1e-3 (any positive value maps the
 * constant source to the target mean). O((n + m) d).
 * @param x, y the supports (kept rows), logA, logB their log-masses (summing in exp to 1).
 * @example defaultEps(x, logA, y, logB) // 0.125 * V * n^(-2/(d+4))
 */
export function defaultEps(x: Points, logA: Float64Array, y: Points, logB: Float64Array): number {
  const d = x.d;
  const v = (totalVariance(x, logA) + totalVariance(y, logB)) / 2;
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
