import { mgnHidden } from './cascaded-mgn';
import { icgnHidden } from './icgn';
import type { NetworkParams } from './network-params';

/**
 * A trained gradient network evaluated in plain float64 JavaScript (no tensors):
 * F(x) = W^T act(x) + (V^T V + alpha I) x + beta and its Jacobian
 * J(x) = W^T diag(gain(x)) W + V^T V + alpha I, symmetric positive definite
 * (smallest eigenvalue >= alpha > 0) by construction. `layers` = 1 uses the
 * closed-form input convex gradient network (icgn.ts), >= 2 the cascaded
 * monotone gradient network (cascaded-mgn.ts).
 * Holds scratch buffers, so one instance must not be shared by concurrent callers
 * (JavaScript runs it on one thread, so this only matters for re-entrancy).
 */
export class Float64Network {
  readonly p: NetworkParams;
  readonly d: number;
  /** V^T V + alpha I, d x d. */
  readonly linear: Float64Array;
  private readonly act: Float64Array;
  private readonly gain: Float64Array;

  /**
   * Cost O(d^3) to form V^T V.
   * @param p validated parameters (see checkNetworkParams).
   */
  constructor(p: NetworkParams) {
    this.p = p;
    const d = p.d;
    this.d = d;
    this.act = new Float64Array(p.hidden);
    this.gain = new Float64Array(p.hidden);
    const lin = new Float64Array(d * d);
    for (let i = 0; i < d; i++) {
      for (let k = 0; k < d; k++) {
        let s = 0;
        for (let r = 0; r < d; r++) s += p.v[r * d + i] * p.v[r * d + k];
        lin[i * d + k] = s + (i === k ? p.alpha : 0);
      }
    }
    this.linear = lin;
  }

  /**
   * Writes F(x) for one row into `out` (length d). O(hidden * d * layers + d^2).
   * @example net.forward(Float64Array.of(0, 0), out) // out = beta (F(0) = beta)
   */
  forward(x: Float64Array, out: Float64Array): void {
    const { p, d, act, linear } = this;
    this.hidden(x, act, null);
    for (let k = 0; k < d; k++) {
      let s = p.beta[k];
      for (let i = 0; i < d; i++) s += linear[k * d + i] * x[i];
      out[k] = s;
    }
    for (let j = 0; j < p.hidden; j++) {
      const a = act[j];
      if (a === 0) continue;
      const o = j * d;
      for (let k = 0; k < d; k++) out[k] += p.w[o + k] * a;
    }
  }

  /**
   * Writes the Jacobian dF/dx at x (d x d, row-major, symmetric) into `jac`.
   * O(hidden * d^2).
   * @example net.jacobian(x, jac) // jac[0 * d + 1] === jac[1 * d + 0]
   */
  jacobian(x: Float64Array, jac: Float64Array): void {
    const { p, d, gain, linear } = this;
    this.hidden(x, null, gain);
    jac.set(linear);
    for (let j = 0; j < p.hidden; j++) {
      const g = gain[j];
      const o = j * d;
      for (let i = 0; i < d; i++) {
        const wi = g * p.w[o + i];
        if (wi === 0) continue;
        for (let k = i; k < d; k++) jac[i * d + k] += wi * p.w[o + k];
      }
    }
    for (let i = 0; i < d; i++) for (let k = 0; k < i; k++) jac[i * d + k] = jac[k * d + i];
  }

  private hidden(x: Float64Array, act: Float64Array | null, gain: Float64Array | null): void {
    if (this.p.layers === 1) icgnHidden(this.p, x, act, gain);
    else mgnHidden(this.p, x, act, gain);
  }
}
