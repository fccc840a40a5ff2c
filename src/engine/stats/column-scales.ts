import type { Points, Sample } from '../points';
import type { SettingSpec } from '../settings';

/**
 * Per-column scales for fitting joint maps in standardised units.
 *
 * Squared distance in raw units lets the widest column decide everything (an
 * income in tens of thousands beside a rate in hundredths). Dividing column k
 * of BOTH samples by one positive number s_k makes the squared-distance map of
 * the scaled data the optimal map for the weighted cost
 * sum_k ((x_k - y_k) / s_k)^2 in raw units. If F is the gradient of a convex
 * function in scaled units, the raw map T(x) = D^-1 F(D x) (D = diag(1/s_k)) is
 * monotone in the D^2 inner product: <D^2 (x - y), T(x) - T(y)> =
 * <Dx - Dy, F(Dx) - F(Dy)> >= 0, and its Jacobian D^-1 J_F D is similar to the
 * symmetric PSD J_F (same eigenvalues), so the Jacobian certificate is read in
 * scaled units. The same s_k must scale source and target, otherwise the
 * cost is not a cost between the two distributions; so s_k is the pooled
 * spread: the square root of the mean of the two samples' (weighted) variances
 * of column k. A constant column (both variances 0) gets s_k = 1.
 */

/** Which units a joint method fits in (the setting `units`). */
export type ColumnUnits = 'standardised' | 'raw';

/**
 * The `units` setting every joint method (linear, pairs, entropic,
 * gradient-net) takes: `standardised` (default) fits with each column divided
 * by its pooled spread (see above), `raw` with plain squared distance in the
 * data's own units, where the widest column dominates.
 */
export const UNITS_SETTING = {
  name: 'units',
  type: 'choice',
  default: 'standardised',
  choices: ['standardised', 'raw'],
  describe:
    "standardised (default): fit with each column divided by its pooled spread, so columns in different units count alike (the map is optimal for that weighted cost); raw: plain squared distance in the data's own units, where the widest column dominates.",
} as const satisfies SettingSpec;

/**
 * s_k = sqrt((var_source(k) + var_target(k)) / 2), weighted by each sample's
 * row weights (variance divided by the total weight), 1 where that is 0 or not
 * finite. O((n + m) d).
 * @example pooledColumnScales(sample([[0, 0], [2, 200]]), sample([[0, 0], [2, 200]])) // Float64Array [1, 100]
 */
export function pooledColumnScales(source: Sample, target: Sample): Float64Array {
  const a = columnVariances(source);
  const b = columnVariances(target);
  const out = new Float64Array(source.d);
  for (let k = 0; k < source.d; k++) {
    const s = Math.sqrt((a[k] + b[k]) / 2);
    out[k] = s > 0 && Number.isFinite(s) ? s : 1;
  }
  return out;
}

/** Weighted variance of each column (divided by the total weight). Two passes for accuracy. O(n d). */
export function columnVariances(s: Sample): Float64Array {
  const { n, d, data, weights } = s;
  const mean = new Float64Array(d);
  const out = new Float64Array(d);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (w === 0) continue;
    total += w;
    for (let k = 0; k < d; k++) mean[k] += w * data[i * d + k];
  }
  if (!(total > 0)) return out;
  for (let k = 0; k < d; k++) mean[k] /= total;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (w === 0) continue;
    for (let k = 0; k < d; k++) {
      const e = data[i * d + k] - mean[k];
      out[k] += w * e * e;
    }
  }
  for (let k = 0; k < d; k++) out[k] /= total;
  return out;
}

/** Each column k divided by scales[k], as new Points (weights kept for a Sample). O(n d). */
export function divideColumns<P extends Points>(p: P, scales: Float64Array): P {
  const { n, d, data } = p;
  const out = new Float64Array(n * d);
  for (let i = 0, j = 0; i < n; i++) for (let k = 0; k < d; k++, j++) out[j] = data[j] / scales[k];
  return { ...p, data: out };
}

/** Each column k multiplied by scales[k], in place on a buffer the caller owns. O(n d). */
export function multiplyColumnsInPlace(data: Float64Array, d: number, scales: Float64Array): void {
  for (let j = 0; j < data.length; j++) data[j] *= scales[j % d];
}
