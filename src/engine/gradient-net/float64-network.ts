import { mgnHidden } from './cascaded-mgn';
import { icgnHidden } from './icgn';
import type { NetworkParams } from './network-params';
import { sigmoidEnergy } from './sigmoid-energy';

// A local alias: a global lookup of Math in a hot loop is many times slower under Jest's sandbox.
const { exp } = Math;
/** Rows per block in forwardRows (fits the columns of a block in cache). */
const BLOCK = 1024;

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
  /** h(b_j) per unit (layers = 1), the constant the closed form subtracts. */
  private readonly h0: Float64Array;

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
    this.h0 = Float64Array.from({ length: p.hidden }, (_, j) => sigmoidEnergy(p.b[j]));
  }

  /**
   * F for many rows at once: `x` and `out` hold n standardised rows (row-major,
   * may not alias). The same numbers as `forward` row by row, computed with one
   * exp per unit (h(b_j) is kept from construction) and no calls in the loop:
   * what applying a map to a million rows spends its time on.
   * O(n * (hidden * d * layers + d^2)).
   * @example net.forwardRows(Float64Array.of(0, 0, 1, 1), 2, out) // out = [F(0, 0), F(1, 1)]
   */
  forwardRows(x: Float64Array, n: number, out: Float64Array): void {
    const { p, d, linear } = this;
    if (p.layers !== 1) {
      const row = new Float64Array(d);
      const f = new Float64Array(d);
      for (let i = 0; i < n; i++) {
        for (let k = 0; k < d; k++) row[k] = x[i * d + k];
        this.forward(row, f);
        for (let k = 0; k < d; k++) out[i * d + k] = f[k];
      }
      return;
    }
    const { w, b, c, hidden } = p;
    const beta = this.shiftedBeta();
    // Blocks of rows held column by column, so that every inner loop runs over rows with fixed
    // weights (long, branch-free loops the JIT compiles well): about three times faster than row by row.
    const B = Math.min(BLOCK, n);
    const cols = this.columns(B);
    const u = new Float64Array(B);
    for (let start = 0; start < n; start += B) {
      const m = Math.min(B, n - start);
      for (let k = 0; k < d; k++) {
        const col = cols.x[k];
        for (let i = 0; i < m; i++) col[i] = x[(start + i) * d + k];
      }
      for (let k = 0; k < d; k++) {
        const acc = cols.out[k];
        acc.fill(beta[k], 0, m);
        for (let q = 0; q < d; q++) {
          const a = linear[k * d + q];
          const col = cols.x[q];
          for (let i = 0; i < m; i++) acc[i] += a * col[i];
        }
      }
      for (let j = 0; j < hidden; j++) {
        const cj = c[j];
        if (cj === 0) continue;
        const wo = j * d;
        u.fill(b[j], 0, m);
        for (let k = 0; k < d; k++) {
          const wk = w[wo + k];
          const col = cols.x[k];
          for (let i = 0; i < m; i++) u[i] += wk * col[i];
        }
        for (let i = 0; i < m; i++) {
          // 1 / (1 + e^-u) is exact at both ends in float64 (e^-u = Infinity gives 0), so no branch is needed.
          const sg = 1 / (1 + exp(-u[i]));
          u[i] = cj * (sg * sg * (0.5 - sg / 3));
        }
        for (let k = 0; k < d; k++) {
          const wk = w[wo + k];
          const acc = cols.out[k];
          for (let i = 0; i < m; i++) acc[i] += wk * u[i];
        }
      }
      for (let k = 0; k < d; k++) {
        const acc = cols.out[k];
        for (let i = 0; i < m; i++) out[(start + i) * d + k] = acc[i];
      }
    }
  }

  /** beta - sum_j c_j h(b_j) w_j: the constant of the closed form folded into the offset (layers = 1). O(hidden d). */
  private shiftedBeta(): Float64Array {
    const { p, d, h0 } = this;
    const out = Float64Array.from(p.beta);
    for (let j = 0; j < p.hidden; j++) for (let k = 0; k < d; k++) out[k] -= p.c[j] * h0[j] * p.w[j * d + k];
    return out;
  }

  private columns(size: number): { x: Float64Array[]; out: Float64Array[] } {
    const make = () => Array.from({ length: this.d }, () => new Float64Array(size));
    return { x: make(), out: make() };
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
