import type { Points } from '../points';
import { squaredDistancesRow } from '../stats/sq-distances';

/**
 * Softmax weights below e^-60 of the largest are skipped: even 5,000 of them
 * add less than 1e-22 to a sum of at least 1, far below a double's rounding.
 */
const NEGLIGIBLE = -60;

/**
 * The entropic transport map of Pooladian & Niles-Weed (2021, "Entropic
 * estimation of optimal transport maps", arXiv 2109.12004, eq. (3.2)) applied
 * to new rows:
 *   T(x) = sum_j y_j w_j(x),  w_j(x) = softmax_j( log b_j + (g_j - |x - y_j|^2 / 2) / eps ),
 * the barycentre of the support points y_j under the conditional plan given x.
 * T is the gradient of the convex function
 *   x -> |x|^2 / 2 + eps log sum_j b_j exp((g_j - |x - y_j|^2 / 2) / eps)
 *      = eps log sum_j b_j exp((g_j + <x, y_j> - |y_j|^2 / 2) / eps)
 * (a log-sum-exp of affine functions), so it is monotone. With the roles swapped (support = source rows, potential
 * = f) the same routine gives the reverse entropic map. The softmax uses a
 * row-wise max shift, so it never overflows.
 * Cost: O(r m d) for r rows; O(m) scratch. Never mutates its inputs.
 * @param x rows to map (any count r, x.d = support.d).
 * @param support the points y_j (m >= 1); logMass their log-masses; potential g (length m, finite).
 * @param eps the regularisation the potential was fitted with (> 0).
 * @returns the mapped rows, row-major r x d.
 * @example barycentricMap(points([[0]]), points([[-1], [1]]), logMass, Float64Array.of(0, 0), 1) // [[0]] by symmetry
 */
export function barycentricMap(x: Points, support: Points, logMass: Float64Array, potential: Float64Array, eps: number): Float64Array {
  const r = x.n;
  const d = x.d;
  const m = support.n;
  const y = support.data;
  const h = new Float64Array(m);
  for (let j = 0; j < m; j++) h[j] = logMass[j] + potential[j] / eps;
  const logit = new Float64Array(m);
  const out = new Float64Array(r * d);
  const acc = new Float64Array(d);
  for (let i = 0; i < r; i++) {
    softmaxLogits(x, i, support, h, eps, logit);
    acc.fill(0);
    let total = 0;
    for (let j = 0; j < m; j++) {
      const w = logit[j];
      if (w === 0) continue;
      total += w;
      const o = j * d;
      for (let k = 0; k < d; k++) acc[k] += w * y[o + k];
    }
    for (let k = 0; k < d; k++) out[i * d + k] = acc[k] / total;
  }
  return out;
}

/**
 * Unnormalised softmax weights for row i of x: w_j = exp(z_j - max z) with
 * z_j = h_j - |x_i - y_j|^2 / (2 eps), and 0 where z_j - max z < -60 (no
 * Math.exp call there). The largest weight is exactly 1. O(m d).
 * @param h the per-support offsets log b_j + g_j / eps (length m).
 * @param out receives the m weights.
 * @example softmaxLogits(x, 0, y, h, 0.1, w) // w[argmax] = 1
 */
export function softmaxLogits(x: Points, i: number, support: Points, h: Float64Array, eps: number, out: Float64Array): void {
  const m = support.n;
  squaredDistancesRow(x, i, support, out, 0, 0.5 / eps);
  let max = -Infinity;
  for (let j = 0; j < m; j++) {
    const z = h[j] - out[j];
    out[j] = z;
    if (z > max) max = z;
  }
  for (let j = 0; j < m; j++) {
    const z = out[j] - max;
    out[j] = z < NEGLIGIBLE ? 0 : Math.exp(z);
  }
}
