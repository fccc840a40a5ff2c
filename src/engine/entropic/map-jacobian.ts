import type { Points } from '../points';
import { softmaxLogits } from './barycentric-map';
import { smallestEigenvalue } from '../stats/smallest-eigenvalue';

/**
 * The Jacobian of the entropic map at row i of x:
 *   DT(x) = Cov_w(y) / eps,  w_j(x) the softmax weights of `barycentricMap`,
 * which follows from d w_j / dx = w_j (y_j - T(x)) / eps (Pooladian &
 * Niles-Weed 2021, arXiv 2109.12004, section 3). It is a covariance matrix over
 * eps, hence symmetric positive semi-definite: the map is monotone.
 * Two passes (mean, then centred products) for accuracy; weights below e^-60
 * of the largest are skipped. O(m d^2). Writes the row-major d x d matrix into `out`.
 * @param h the offsets log b_j + g_j / eps (length m); scratch length >= m.
 * @example mapJacobian(x, 0, y, h, 0.1, out, scratch) // out = Cov / eps
 */
export function mapJacobian(x: Points, i: number, support: Points, h: Float64Array, eps: number, out: Float64Array, scratch: Float64Array): void {
  const d = x.d;
  const m = support.n;
  const y = support.data;
  softmaxLogits(x, i, support, h, eps, scratch);
  const mean = new Float64Array(d);
  let total = 0;
  for (let j = 0; j < m; j++) {
    const w = scratch[j];
    if (w === 0) continue;
    total += w;
    for (let k = 0; k < d; k++) mean[k] += w * y[j * d + k];
  }
  for (let k = 0; k < d; k++) mean[k] /= total;
  out.fill(0, 0, d * d);
  const z = new Float64Array(d);
  for (let j = 0; j < m; j++) {
    const w = scratch[j];
    if (w === 0) continue;
    for (let k = 0; k < d; k++) z[k] = y[j * d + k] - mean[k];
    for (let p = 0; p < d; p++) {
      const wz = w * z[p];
      for (let q = p; q < d; q++) out[p * d + q] += wz * z[q];
    }
  }
  const scale = 1 / (total * eps);
  for (let p = 0; p < d; p++) {
    for (let q = p; q < d; q++) {
      const v = out[p * d + q] * scale;
      out[p * d + q] = v;
      out[q * d + p] = v;
    }
  }
}

/**
 * The smallest eigenvalue of the entropic map's Jacobian over the given rows of
 * x: >= 0 (up to rounding) certifies the map is monotone there. O(r m d^2 + r d^3).
 * @param rows the row indices of x to check.
 * @example minJacobianEigenvalue(x, Int32Array.of(0, 1), y, logMass, g, 0.1) // >= -1e-12
 */
export function minJacobianEigenvalue(x: Points, rows: Int32Array, support: Points, logMass: Float64Array, potential: Float64Array, eps: number): number {
  const d = x.d;
  const m = support.n;
  const h = new Float64Array(m);
  for (let j = 0; j < m; j++) h[j] = logMass[j] + potential[j] / eps;
  const J = new Float64Array(d * d);
  const scratch = new Float64Array(m);
  let min = Infinity;
  for (let r = 0; r < rows.length; r++) {
    mapJacobian(x, rows[r], support, h, eps, J, scratch);
    let trace = 0;
    for (let k = 0; k < d; k++) trace += J[k * d + k];
    // J is a covariance divided by eps, PSD exactly: a negative eigenvalue within rounding of its trace is 0.
    const raw = smallestEigenvalue(J, d);
    const e = raw < 0 && -raw <= 1e-12 * Math.abs(trace) ? 0 : raw;
    if (e < min) min = e;
  }
  return min;
}
