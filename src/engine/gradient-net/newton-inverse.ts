import { choleskySolve } from './cholesky-solve';
import type { Float64Network } from './float64-network';

/** Result of inverting one row. */
export interface NewtonResult {
  readonly converged: boolean;
  readonly iterations: number;
  /** |F(x) - y| at the returned x (Euclidean, standardised units). */
  readonly residual: number;
}

/** Iteration and halving limits (bounded loops). */
export const NEWTON_MAX_ITERATIONS = 100;
const MAX_HALVINGS = 40;

/**
 * Solves F(x) = y for one row by Newton's method with backtracking, writing x
 * into `x`. F is the gradient of a strongly convex function (Jacobian symmetric
 * with eigenvalues >= alpha > 0), so the Newton step -J^-1 r is a descent
 * direction for |F(x) - y|^2 (its slope is -2 |r|^2) and halving the step until
 * the residual falls by the Armijo factor (1 - 1e-4 t) always succeeds for
 * small enough t; a solution exists and is unique. Start: the solution of the
 * linear part, (V^T V + alpha I) x = y - beta. Stops when
 * |r| <= tol (1 + |y|), after NEWTON_MAX_ITERATIONS iterations, or when no halving
 * reduces the residual (then `converged` is false and the caller reports it).
 * Cost O(iterations * (hidden * d^2 + d^3)).
 * @param y target row, length d (not modified).
 * @param x output row, length d.
 * @param tol relative tolerance, default 1e-12.
 * @example newtonInverse(net, net.forward(x0)...) // recovers x0, converged true
 */
export function newtonInverse(net: Float64Network, y: Float64Array, x: Float64Array, tol = 1e-12): NewtonResult {
  const d = net.d;
  const f = new Float64Array(d);
  const r = new Float64Array(d);
  const step = new Float64Array(d);
  const trial = new Float64Array(d);
  const jac = new Float64Array(d * d);
  const scratch = new Float64Array(d * d);
  let ynorm = 0;
  for (let k = 0; k < d; k++) {
    r[k] = y[k] - net.p.beta[k];
    ynorm += y[k] * y[k];
  }
  const goal = tol * (1 + Math.sqrt(ynorm));
  if (!choleskySolve(net.linear, r, x, scratch, d)) x.fill(0);
  let res = residual(net, x, y, f, r);
  for (let it = 0; it < NEWTON_MAX_ITERATIONS; it++) {
    if (res <= goal) return { converged: true, iterations: it, residual: res };
    net.jacobian(x, jac);
    if (!choleskySolve(jac, r, step, scratch, d)) return { converged: false, iterations: it, residual: res };
    let t = 1;
    let accepted = false;
    for (let h = 0; h < MAX_HALVINGS; h++) {
      for (let k = 0; k < d; k++) trial[k] = x[k] - t * step[k];
      const rt = residual(net, trial, y, f, null);
      if (rt <= (1 - 1e-4 * t) * res) {
        x.set(trial);
        res = residual(net, x, y, f, r);
        accepted = true;
        break;
      }
      t /= 2;
    }
    if (!accepted) return { converged: res <= goal * 1e3, iterations: it + 1, residual: res };
  }
  return { converged: res <= goal, iterations: NEWTON_MAX_ITERATIONS, residual: res };
}

/** |F(x) - y|, writing F(x) - y into r when given. */
function residual(net: Float64Network, x: Float64Array, y: Float64Array, f: Float64Array, r: Float64Array | null): number {
  net.forward(x, f);
  let s = 0;
  for (let k = 0; k < y.length; k++) {
    const e = f[k] - y[k];
    if (r) r[k] = e;
    s += e * e;
  }
  return Math.sqrt(s);
}
