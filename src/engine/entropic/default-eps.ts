import type { Points } from '../points';

/**
 * The factor of the default-smoothing rule at d columns: d / 32, kept within [1/16, 1/4].
 * Chosen on the tune half of the bench zoo (bench/zoo.ts: gauss, heavy, scales, factor; n = m = 4,000;
 * `npm run bench -- entropic-zoo --sweep`), worst L2-UVP over the four families against the known maps:
 *   d = 2: factor 1/16 0.45 %, 1/8 0.46 %, 1/4 0.52 %, 1/2 0.82 %;
 *   d = 5: 1/16 3.76 %, 1/8 2.61 %, 1/4 2.39 %, 1/2 4.31 %;
 *   d = 8: 1/8 9.30 %, 1/4 6.36 %, 0.35 6.70 %, 1/2 9.01 %.
 * The best factor grows with d (the map averages over more directions); beyond d = 8 nothing was
 * measured, so the factor stays at 1/4. Until then one factor, 1/8, chosen on bench/truth.ts, served every d.
 * O(1).
 * @example defaultEpsFactor(8) // 0.25
 */
export function defaultEpsFactor(d: number): number {
  return Math.min(0.25, Math.max(0.0625, d / 32));
}

/**
 * The eps used when the user leaves the smoothing at 0 ("choose from the data"):
 *   eps = defaultEpsFactor(d) * V * n^(-2 / (d + 4)),
 * where V = (tr Cov(source) + tr Cov(target)) / (2 d) is the mean variance of
 * one column (the scale of a squared coordinate difference, in the units of
 * the cost |x - y|^2 / 2; 1 in standardised units) and n the smaller effective
 * sample size (Kish: (sum w)^2 / sum w^2). The n^(-2/(d+4)) rate is the
 * kernel-smoothing bandwidth rate for a squared length scale (Silverman's rule
 * of thumb has bandwidth ~ n^(-1/(d+4))): the entropic map averages target
 * points within about sqrt(eps) of the barycentre, so eps should shrink as the
 * sample fills the space. One column's variance rather than the total: with the
 * total the rule smoothed far too much at d = 8 (L2-UVP 22 % on bench/truth.ts,
 * against 2.4 % for the per-column rule).
 * A sample with no spread at all gives V = 0; then eps = 1e-3 (any positive
 * value maps the constant source to the target mean). O((n + m) d).
 * @param x, y the supports (kept rows), logA, logB their log-masses (summing in exp to 1).
 * @example defaultEps(x, logA, y, logB) // defaultEpsFactor(d) * (mean column variance) * n^(-2/(d+4))
 */
export function defaultEps(x: Points, logA: Float64Array, y: Points, logB: Float64Array): number {
  const d = x.d;
  const v = (totalVariance(x, logA) + totalVariance(y, logB)) / (2 * Math.max(1, d));
  const n = Math.min(effectiveSize(logA), effectiveSize(logB));
  const eps = defaultEpsFactor(d) * v * Math.pow(n, -2 / (d + 4));
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
