import type { Sample } from '../points';

/**
 * Centring plus one positive scale per column: x~_k = (x_k - mean_k) / scale_k,
 * with scale_k = c_k * s, where c_k is shared by source and target (the pooled
 * column spread of stats/column-scales.ts with units = standardised, or 1 for
 * every column with units = raw) and s is one number per sample that gives its
 * standardised columns a mean variance of 1 (so the network starts on data of
 * unit size, whatever the spreads of the two samples).
 *
 * Why this keeps the map monotone: with the network F a gradient of a convex
 * function, the map T(x) = m_t + D_t F(D_s^-1 (x - m_s)), D = diag(scale), has
 * D_t = (s_t / s_s) D_s, so its Jacobian (s_t / s_s) D_s J_F D_s^-1 is similar
 * to the symmetric positive definite J_F: T is the gradient of a convex
 * function in the inner product weighted by D_s^-2, that is, monotone and
 * optimal for the cost sum_k ((x_k - y_k) / c_k)^2 (the product's rule for
 * joint methods in standardised units; column-scales.ts). The Jacobian
 * certificate is therefore read in scaled units. Earlier versions used one
 * scale for all columns (units = raw still does) because per-side per-column
 * scales of different shapes would give a Jacobian D_t J_F D_s^-1 that is not
 * similar to a symmetric matrix; sharing the shape c_k between the sides avoids that.
 */
export interface Standardiser {
  readonly mean: Float64Array;
  /** Per column, > 0. */
  readonly scale: Float64Array;
}

/**
 * Weighted column means, and scale_k = c_k * s with s the root mean of the
 * weighted variances of the columns divided by c_k; a zero or non-finite s
 * gives s = 1. O(n d).
 * @param columnScales c_k > 0, shared by both samples (length d).
 * @example standardiserOf(sample([[0, 0], [2, 2]]), Float64Array.of(1, 1)) // { mean: [1, 1], scale: [1, 1] }
 */
export function standardiserOf(s: Sample, columnScales: Float64Array): Standardiser {
  const { n, d, data, weights } = s;
  const mean = new Float64Array(d);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (w === 0) continue;
    total += w;
    for (let k = 0; k < d; k++) mean[k] += w * data[i * d + k];
  }
  for (let k = 0; k < d; k++) mean[k] /= total;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (w === 0) continue;
    for (let k = 0; k < d; k++) {
      const e = (data[i * d + k] - mean[k]) / columnScales[k];
      ss += w * e * e;
    }
  }
  let one = Math.sqrt(ss / total / d);
  if (!(one > 0) || !Number.isFinite(one)) one = 1;
  return { mean, scale: Float64Array.from(columnScales, (c) => c * one) };
}

/** (x_k - mean_k) / scale_k for every row, into a new Float64Array. O(n d). */
export function standardise(data: Float64Array, d: number, st: Standardiser): Float64Array {
  const out = new Float64Array(data.length);
  for (let j = 0; j < data.length; j++) out[j] = (data[j] - st.mean[j % d]) / st.scale[j % d];
  return out;
}
