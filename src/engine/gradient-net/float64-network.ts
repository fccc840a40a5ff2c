import { mgnHidden } from './cascaded-mgn';
import { icgnHidden } from './icgn';
import type { NetworkParams } from './network-params';
import { sigmoidEnergy } from './sigmoid-energy';

// A local alias: a global lookup of Math in a hot loop is many times slower under Jest's sandbox.
const { exp } = Math;
/** Rows per block for forwardColumns: the columns of a block stay in cache. */
export const ROWS_PER_BLOCK = 1024;

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
  /** beta - sum_j c_j h(b_j) w_j (layers = 1): the constant of the closed form folded into the offset. */
  private readonly shifted: Float64Array;
  /** Scratch for forwardColumns: one unit's values over a block of rows. */
  private unit = new Float64Array(0);

  /**
   * Cost O(d^3 + hidden d) to form V^T V and the offset of the closed form.
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
    const shifted = Float64Array.from(p.beta);
    for (let j = 0; j < p.hidden; j++) {
      const h0 = sigmoidEnergy(p.b[j]);
      for (let k = 0; k < d; k++) shifted[k] -= p.c[j] * h0 * p.w[j * d + k];
    }
    this.shifted = shifted;
  }

  /**
   * F for many rows at once: `x` and `out` hold n standardised rows (row-major,
   * may not alias). The same numbers as `forward` row by row (see forwardColumns).
   * O(n * (hidden * d * layers + d^2)).
   * @example net.forwardRows(Float64Array.of(0, 0, 1, 1), 2, out) // out = [F(0, 0), F(1, 1)]
   */
  forwardRows(x: Float64Array, n: number, out: Float64Array): void {
    const { d } = this;
    const B = Math.min(ROWS_PER_BLOCK, n);
    const cols = this.columns(B);
    const outCols = this.columns(B);
    for (let start = 0; start < n; start += B) {
      const m = Math.min(B, n - start);
      for (let k = 0; k < d; k++) {
        const col = cols[k];
        for (let i = 0, o = start * d + k; i < m; i++, o += d) col[i] = x[o];
      }
      this.forwardColumns(cols, m, outCols);
      for (let k = 0; k < d; k++) {
        const col = outCols[k];
        for (let i = 0, o = start * d + k; i < m; i++, o += d) out[o] = col[i];
      }
    }
  }

  /**
   * F for a block of m standardised rows held column by column: `x[k][i]` is
   * coordinate k of row i, and F's coordinate k is written to `out[k][i]`
   * (d columns each way, each of length >= m; x and out may not share arrays).
   * What applying a map to a million rows spends its time on. With layers = 1,
   * every inner loop runs over the rows of the block with fixed weights (long,
   * branch-free loops the JIT compiles well), up to four weights per pass, with
   * one exp per unit (h(b_j) is kept from construction); the sums are formed in
   * the same order as in `forward`, so the numbers are the same to the last bit.
   * Cost O(m * (hidden * d * layers + d^2)); keep m near ROWS_PER_BLOCK (1024) so the block stays in cache.
   * @example net.forwardColumns([Float64Array.of(0, 1), Float64Array.of(0, 1)], 2, out) // out[k][i] = F(row i)_k
   */
  forwardColumns(x: readonly Float64Array[], m: number, out: readonly Float64Array[]): void {
    const { p, d, linear, shifted } = this;
    if (p.layers !== 1) {
      this.forwardColumnsByRow(x, m, out);
      return;
    }
    const { w, b, c, hidden } = p;
    if (this.unit.length < m) this.unit = new Float64Array(m);
    const u = this.unit;
    // Linear part first, then the units in order j, so that every sum runs in the order `forward` uses.
    for (let k = 0; k < d; k++) combine(out[k], m, shifted[k], linear, k * d, x);
    for (let j = 0; j < hidden; j++) {
      const cj = c[j];
      if (cj === 0) continue;
      combine(u, m, b[j], w, j * d, x);
      for (let i = 0; i < m; i++) {
        // 1 / (1 + e^-u) is exact at both ends in float64 (e^-u = Infinity gives 0), so no branch is needed.
        const sg = 1 / (1 + exp(-u[i]));
        u[i] = cj * (sg * sg * (0.5 - sg / 3));
      }
      spread(out, m, w, j * d, u);
    }
  }

  /** The cascade (layers >= 2): `forward` row by row. */
  private forwardColumnsByRow(x: readonly Float64Array[], m: number, out: readonly Float64Array[]): void {
    const d = this.d;
    const row = new Float64Array(d);
    const f = new Float64Array(d);
    for (let i = 0; i < m; i++) {
      for (let k = 0; k < d; k++) row[k] = x[k][i];
      this.forward(row, f);
      for (let k = 0; k < d; k++) out[k][i] = f[k];
    }
  }

  /** d arrays of `size` values: a block held column by column, for forwardColumns. */
  columns(size: number): Float64Array[] {
    return Array.from({ length: this.d }, () => new Float64Array(size));
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

/**
 * target[i] = start + sum_k coef[off + k] * cols[k][i] for i < m, summed left to right in order k
 * (the same rounding as a plain loop over k), four columns per pass over the rows.
 */
function combine(target: Float64Array, m: number, start: number, coef: Float64Array, off: number, cols: readonly Float64Array[]): void {
  const d = cols.length;
  let k = 0;
  if (d >= 4) {
    const c0 = cols[0];
    const c1 = cols[1];
    const c2 = cols[2];
    const c3 = cols[3];
    const w0 = coef[off];
    const w1 = coef[off + 1];
    const w2 = coef[off + 2];
    const w3 = coef[off + 3];
    for (let i = 0; i < m; i++) target[i] = start + w0 * c0[i] + w1 * c1[i] + w2 * c2[i] + w3 * c3[i];
    k = 4;
  } else {
    target.fill(start, 0, m);
  }
  for (; k + 4 <= d; k += 4) {
    const c0 = cols[k];
    const c1 = cols[k + 1];
    const c2 = cols[k + 2];
    const c3 = cols[k + 3];
    const w0 = coef[off + k];
    const w1 = coef[off + k + 1];
    const w2 = coef[off + k + 2];
    const w3 = coef[off + k + 3];
    for (let i = 0; i < m; i++) target[i] = target[i] + w0 * c0[i] + w1 * c1[i] + w2 * c2[i] + w3 * c3[i];
  }
  for (; k + 2 <= d; k += 2) {
    const c0 = cols[k];
    const c1 = cols[k + 1];
    const w0 = coef[off + k];
    const w1 = coef[off + k + 1];
    for (let i = 0; i < m; i++) target[i] = target[i] + w0 * c0[i] + w1 * c1[i];
  }
  if (k < d) {
    const c0 = cols[k];
    const w0 = coef[off + k];
    for (let i = 0; i < m; i++) target[i] += w0 * c0[i];
  }
}

/** acc[k][i] += coef[off + k] * v[i] for k < d, i < m: one unit's contribution to every output column, four columns per pass. */
function spread(acc: readonly Float64Array[], m: number, coef: Float64Array, off: number, v: Float64Array): void {
  const d = acc.length;
  let k = 0;
  for (; k + 4 <= d; k += 4) {
    const a0 = acc[k];
    const a1 = acc[k + 1];
    const a2 = acc[k + 2];
    const a3 = acc[k + 3];
    const w0 = coef[off + k];
    const w1 = coef[off + k + 1];
    const w2 = coef[off + k + 2];
    const w3 = coef[off + k + 3];
    for (let i = 0; i < m; i++) {
      const vi = v[i];
      a0[i] += w0 * vi;
      a1[i] += w1 * vi;
      a2[i] += w2 * vi;
      a3[i] += w3 * vi;
    }
  }
  for (; k < d; k++) {
    const a0 = acc[k];
    const w0 = coef[off + k];
    for (let i = 0; i < m; i++) a0[i] += w0 * v[i];
  }
}
