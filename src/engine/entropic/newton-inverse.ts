import type { Points } from '../points';
import { softmaxLogits } from './barycentric-map';

/** Stop when every coordinate of T(x) - y is within this times (1 + the largest |y_k|), in fitted units. */
export const INVERSE_TOLERANCE = 1e-10;
/** Newton steps allowed per row before the row is declared not inverted. */
const MAX_STEPS = 100;

/** The outcome of `newtonInverse`. */
export interface InverseResult {
  /** The preimages, row-major (rows that failed hold the last iterate). */
  readonly data: Float64Array;
  /** Rows (0-based) where Newton did not reach the tolerance: outside the map's image, or too close to its edge. */
  readonly failed: number[];
  /** The largest Newton step count over the rows. */
  readonly steps: number;
}

/**
 * The exact inverse of the entropic map T(x) = sum_j y_j softmax_j(h_j - |x - y_j|^2 / (2 eps)) on
 * given rows: for each y, the x with T(x) = y. T is the gradient of the strictly convex
 *   psi(x) = eps log sum_j exp(h_j + (<x, y_j> - |y_j|^2 / 2) / eps)
 * (a log-sum-exp of affine functions; strictly convex when the y_j span the space), so x minimises
 * Phi(x) = psi(x) - <y, x>, whose gradient is T(x) - y and Hessian the Jacobian Cov_w(y_j) / eps,
 * symmetric positive definite. Newton's method with a backtracking (Armijo) line search on Phi
 * (Nocedal & Wright 2006, "Numerical Optimization", Algorithm 3.1 with Newton directions) converges
 * from any start; the start is `start` (the reverse entropic map, close by). A y outside the
 * interior of the convex hull of the y_j has no preimage: Phi is unbounded below, the iterate runs
 * away, and the row is reported in `failed`.
 * Cost: O(steps * m d^2) per row; O(m + d^2) scratch.
 * @param y rows to invert (fitted units); support the y_j (m >= 1); h offsets (length m); eps > 0.
 * @param start a first guess per row (same shape as y).
 * @example newtonInverse(forward(x), support, h, 0.1, reverse(forward(x))).data // x, to 1e-10
 */
export function newtonInverse(y: Points, support: Points, h: Float64Array, eps: number, start: Float64Array): InverseResult {
  const { n: r, d } = y;
  const m = support.n;
  const ys = support.data;
  const out = Float64Array.from(start);
  const w = new Float64Array(m);
  const mean = new Float64Array(d);
  const J = new Float64Array(d * d);
  const step = new Float64Array(d);
  const trial = new Float64Array(d);
  const failed: number[] = [];
  let most = 0;
  const xPoint = { n: 1, d, data: new Float64Array(d) };
  /** Phi at xPoint, with the weights, the mean T(x) and (if wanted) the Jacobian. */
  const evaluate = (target: Float64Array, withJacobian: boolean): number => {
    softmaxLogits(xPoint, 0, support, h, eps, w);
    // softmaxLogits leaves w_j = exp(z_j - max z); recover max z for Phi from the largest weight's row.
    let total = 0;
    mean.fill(0);
    for (let j = 0; j < m; j++) {
      const wj = w[j];
      if (wj === 0) continue;
      total += wj;
      for (let k = 0; k < d; k++) mean[k] += wj * ys[j * d + k];
    }
    for (let k = 0; k < d; k++) mean[k] /= total;
    if (withJacobian) {
      J.fill(0);
      for (let j = 0; j < m; j++) {
        const wj = w[j];
        if (wj === 0) continue;
        for (let p = 0; p < d; p++) {
          const zp = wj * (ys[j * d + p] - mean[p]);
          for (let q = p; q < d; q++) J[p * d + q] += zp * (ys[j * d + q] - mean[q]);
        }
      }
      for (let p = 0; p < d; p++) for (let q = p; q < d; q++) J[q * d + p] = J[p * d + q] /= total * eps;
    }
    // Phi = |x|^2 / 2 + eps (max z + log total) - <target, x>, with max z = h_jmax - |x - y_jmax|^2 / (2 eps).
    let jmax = 0;
    for (let j = 0; j < m; j++)
      if (w[j] === 1) {
        jmax = j;
        break;
      }
    let dist = 0;
    let xx = 0;
    let xt = 0;
    for (let k = 0; k < d; k++) {
      const x = xPoint.data[k];
      dist += (x - ys[jmax * d + k]) ** 2;
      xx += x * x;
      xt += x * target[k];
    }
    const maxZ = h[jmax] - dist / (2 * eps);
    return xx / 2 + eps * (maxZ + Math.log(total)) - xt;
  };
  const target = new Float64Array(d);
  for (let i = 0; i < r; i++) {
    const o = i * d;
    for (let k = 0; k < d; k++) {
      target[k] = y.data[o + k];
      xPoint.data[k] = out[o + k];
    }
    let big = 0;
    for (let k = 0; k < d; k++) big = Math.max(big, Math.abs(target[k]));
    const tol = INVERSE_TOLERANCE * (1 + big);
    let phi = evaluate(target, true);
    let done = false;
    let steps = 0;
    for (; steps < MAX_STEPS; steps++) {
      let worst = 0;
      for (let k = 0; k < d; k++) worst = Math.max(worst, Math.abs(mean[k] - target[k]));
      if (worst <= tol) {
        done = true;
        break;
      }
      // Newton direction: J step = -(T(x) - y), by Cholesky (J is SPD; a tiny relative ridge if rounding says otherwise).
      for (let k = 0; k < d; k++) step[k] = target[k] - mean[k];
      if (!choleskySolve(J, d, step)) break;
      let slope = 0;
      for (let k = 0; k < d; k++) slope += (mean[k] - target[k]) * step[k];
      let t = 1;
      const x0 = Float64Array.from(xPoint.data);
      let accepted = false;
      for (let back = 0; back < 60; back++) {
        for (let k = 0; k < d; k++) trial[k] = x0[k] + t * step[k];
        xPoint.data.set(trial);
        const next = evaluate(target, false);
        if (next <= phi + 1e-4 * t * slope || Math.abs(next - phi) <= 1e-15 * Math.abs(phi)) {
          phi = next;
          accepted = true;
          break;
        }
        t /= 2;
      }
      if (!accepted) {
        xPoint.data.set(x0);
        evaluate(target, false);
        let w2 = 0;
        for (let k = 0; k < d; k++) w2 = Math.max(w2, Math.abs(mean[k] - target[k]));
        done = w2 <= tol;
        break;
      }
      phi = evaluate(target, true);
    }
    if (steps > most) most = steps;
    out.set(xPoint.data, o);
    if (!done) failed.push(i);
  }
  return { data: out, failed, steps: most };
}

/** Solves A z = b in place in b for a symmetric positive definite A (row-major d x d; A is not changed). False if A is not numerically PD. O(d^3). */
function choleskySolve(A: Float64Array, d: number, b: Float64Array): boolean {
  let trace = 0;
  for (let k = 0; k < d; k++) trace += A[k * d + k];
  const L = new Float64Array(d * d);
  for (let attempt = 0; attempt < 2; attempt++) {
    const ridge = attempt === 0 ? 0 : 1e-12 * trace;
    let ok = true;
    for (let i = 0; i < d && ok; i++) {
      for (let j = 0; j <= i; j++) {
        let s = A[i * d + j] + (i === j ? ridge : 0);
        for (let k = 0; k < j; k++) s -= L[i * d + k] * L[j * d + k];
        if (i === j) {
          if (!(s > 0)) {
            ok = false;
            break;
          }
          L[i * d + i] = Math.sqrt(s);
        } else L[i * d + j] = s / L[j * d + j];
      }
    }
    if (!ok) continue;
    for (let i = 0; i < d; i++) {
      let s = b[i];
      for (let k = 0; k < i; k++) s -= L[i * d + k] * b[k];
      b[i] = s / L[i * d + i];
    }
    for (let i = d - 1; i >= 0; i--) {
      let s = b[i];
      for (let k = i + 1; k < d; k++) s -= L[k * d + i] * b[k];
      b[i] = s / L[i * d + i];
    }
    return true;
  }
  return false;
}
