import type { Sample } from '../points';

/**
 * Centring plus ONE positive scale for all columns: x~ = (x - mean) / scale.
 *
 * Why one scalar: if the network F is the gradient of a convex function, the map
 * T(x) = m_t + s_t F((x - m_s) / s_s) has Jacobian (s_t / s_s) J_F((x - m_s)/s_s),
 * still symmetric positive semi-definite, so T stays the gradient of a convex
 * function (phi(x) = s_s s_t psi((x - m_s)/s_s) + m_t . x). With a separate scale
 * per column the Jacobian D_t J_F D_s^-1 is no longer symmetric in general and
 * monotonicity would hold only after the fact, so per-column scales are not used.
 * The price: columns on very different scales stay so after standardising
 * (as they do in the squared-distance cost the map minimises).
 */
export interface Standardiser {
  readonly mean: Float64Array;
  readonly scale: number;
}

/**
 * Weighted column means and the root mean of the weighted column variances
 * (sqrt(trace(cov) / d)); a zero or non-finite spread gives scale 1. O(n d).
 * @example standardiserOf(sample([[0, 0], [2, 2]])) // { mean: [1, 1], scale: 1 }
 */
export function standardiserOf(s: Sample): Standardiser {
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
      const e = data[i * d + k] - mean[k];
      ss += w * e * e;
    }
  }
  const scale = Math.sqrt(ss / total / d);
  return { mean, scale: scale > 0 && Number.isFinite(scale) ? scale : 1 };
}

/** (x - mean) / scale for every row, into a new Float64Array. O(n d). */
export function standardise(data: Float64Array, d: number, st: Standardiser): Float64Array {
  const out = new Float64Array(data.length);
  for (let j = 0; j < data.length; j++) out[j] = (data[j] - st.mean[j % d]) / st.scale;
  return out;
}
