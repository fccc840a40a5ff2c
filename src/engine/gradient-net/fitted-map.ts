import { BaseMap, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitRecord, MapJSON, Mapped } from '../map';
import type { Points } from '../points';
import { Float64Network, ROWS_PER_BLOCK } from './float64-network';
import { checkNetworkParams, type NetworkParams } from './network-params';
import { newtonInverse } from './newton-inverse';

/** Where a sample sat: centre, per-column scale (standardise.ts), and the per-column range (for tails and `outside`). */
export interface Frame {
  readonly mean: Float64Array;
  readonly scale: Float64Array;
  readonly lo: Float64Array;
  readonly hi: Float64Array;
}

/**
 * A fitted gradient-net map: T(x) = m_t + D_t F(D_s^-1 (x - m_s)) with F the
 * trained network (a gradient of a strongly convex function, see
 * float64-network.ts) and per-column scales D_s, D_t of the same shape
 * (standardise.ts), so T is the gradient of a convex function in the inner
 * product of the standardised units and monotone there by construction. Holds only
 * Float64Arrays: applying uses plain float64 JavaScript, dispose() is a no-op
 * and the map is JSON-serialisable (toJSON / GradientNetMap.fromJSON round-trip
 * bit-for-bit).
 *
 * Tails: 'linear' applies the network as it is everywhere (far from the data
 * it is affine: the sigmoids saturate, leaving (V^T V + alpha I) x + const);
 * 'clamp' first clamps each coordinate to the fitted range (source range for
 * apply, target range for invert). Clamping keeps rows inside the range
 * untouched; for rows outside it the composite is no longer guaranteed monotone.
 */
export class GradientNetMap extends BaseMap {
  readonly network: NetworkParams;
  readonly source: Frame;
  readonly target: Frame;
  private readonly net: Float64Network;

  constructor(header: MapHeader, fitted: FitRecord, network: NetworkParams, source: Frame, target: Frame) {
    super(header, fitted);
    this.network = network;
    this.source = source;
    this.target = target;
    this.net = new Float64Network(network);
  }

  /** Apply: each layer's hidden units against d inputs, twice (forward and the gradient), about 4 hidden d layers a row; invert: Newton's steps on that. */
  override workPerRow(verb: 'apply' | 'invert'): number {
    const w = 4 * this.network.hidden * this.d * Math.max(1, this.network.layers);
    return verb === 'apply' ? w : 20 * w * this.d;
  }

  /**
   * T(x) in float64, in blocks of rows held column by column (Float64Network.forwardColumns): each
   * block is standardised straight into the network's input columns and mapped back from its output
   * columns, with no other copies. O(n * hidden * d * layers).
   */
  protected applyPoints(x: Points): Mapped {
    const { d, net } = this;
    const n = x.n;
    const out = new Float64Array(n * d);
    const clamp = this.header.settings.tails !== 'linear';
    const B = Math.min(ROWS_PER_BLOCK, n);
    const z = net.columns(B);
    const f = net.columns(B);
    const { lo, hi, mean: ms, scale: ss } = this.source;
    const { mean: mt, scale: st } = this.target;
    const data = x.data;
    // Per row of the block: whether any coordinate lay outside the fitted range.
    const far = new Uint8Array(B);
    let outside = 0;
    for (let start = 0; start < n; start += B) {
      const rows = Math.min(B, n - start);
      far.fill(0, 0, rows);
      // Standardise the block (clamping to the fitted range with tails = clamp), noting rows outside it.
      for (let k = 0; k < d; k++) {
        const col = z[k];
        const l = lo[k];
        const h = hi[k];
        const m = ms[k];
        const s = ss[k];
        for (let r = 0, j = start * d + k; r < rows; r++, j += d) {
          let v = data[j];
          if (v < l || v > h) {
            far[r] = 1;
            if (clamp) v = v < l ? l : h;
          }
          col[r] = (v - m) / s;
        }
      }
      for (let r = 0; r < rows; r++) outside += far[r];
      net.forwardColumns(z, rows, f);
      for (let k = 0; k < d; k++) {
        const col = f[k];
        const m = mt[k];
        const s = st[k];
        for (let r = 0, j = start * d + k; r < rows; r++, j += d) out[j] = m + s * col[r];
      }
    }
    return { n, d, data: out, outside };
  }

  /**
   * T^-1(y) row by row by Newton's method with backtracking (newton-inverse.ts).
   * @throws RemapError (kind 'num') naming the first row that did not converge
   *   (this needs a Jacobian so ill-conditioned that float64 cannot resolve it).
   */
  protected invertPoints(y: Points): Mapped {
    const { d } = this;
    const out = new Float64Array(y.n * d);
    const row = new Float64Array(d);
    const x = new Float64Array(d);
    const clamp = this.header.settings.tails !== 'linear';
    let outside = 0;
    for (let i = 0; i < y.n; i++) {
      if (this.load(y.data, i, row, this.target, clamp)) outside++;
      const r = newtonInverse(this.net, row, x);
      if (!r.converged) {
        throw new RemapError(
          `invert (gradient-net): Newton's method did not converge for row ${i + 1} ` +
            `(residual ${r.residual.toExponential(2)} after ${r.iterations} iterations); ` +
            "check that the values are of the target's size, or refit with more steps.",
          'num',
        );
      }
      for (let k = 0; k < d; k++) out[i * d + k] = this.source.mean[k] + this.source.scale[k] * x[k];
    }
    return { n: y.n, d, data: out, outside };
  }

  /**
   * The Jacobian of T at one point x (original units), d x d row-major:
   * D_t J_F D_s^-1 at the standardised point, similar to the symmetric positive
   * definite J_F (symmetric itself when all columns share one scale). O(hidden * d^2).
   * @throws RemapError if x does not have d values.
   */
  jacobianAt(x: ArrayLike<number>): Float64Array {
    if (x.length !== this.d) throw new RemapError(`jacobianAt (gradient-net): the point has ${x.length} values; give ${this.d}.`);
    const row = new Float64Array(this.d);
    const d = this.d;
    for (let k = 0; k < d; k++) row[k] = (x[k] - this.source.mean[k]) / this.source.scale[k];
    const jac = new Float64Array(d * d);
    this.net.jacobian(row, jac);
    for (let i = 0; i < d; i++) for (let k = 0; k < d; k++) jac[i * d + k] *= this.target.scale[i] / this.source.scale[k];
    return jac;
  }

  protected params(): unknown {
    const p = this.network;
    const frame = (f: Frame) => ({ mean: Array.from(f.mean), scale: Array.from(f.scale), lo: Array.from(f.lo), hi: Array.from(f.hi) });
    return {
      network: {
        hidden: p.hidden,
        layers: p.layers,
        w: Array.from(p.w),
        b: Array.from(p.b),
        c: Array.from(p.c),
        v: Array.from(p.v),
        alpha: p.alpha,
        beta: Array.from(p.beta),
      },
      source: frame(this.source),
      target: frame(this.target),
    };
  }

  /**
   * Restores a map from `toJSON()` output (envelope already checked). O(size of params).
   * @throws RemapError if the parameters are missing, mis-sized or not finite.
   */
  static fromJSON(json: MapJSON): GradientNetMap {
    const fn = 'load (gradient-net)';
    const raw = json.params as Record<string, unknown> | null;
    const net = (raw && typeof raw === 'object' ? raw.network : null) as Record<string, unknown> | null;
    if (!net || typeof net !== 'object') throw new RemapError(`${fn}: the saved map has no network parameters; save the map again from a fresh fit.`);
    const d = json.d;
    const network: NetworkParams = {
      d,
      hidden: Number(net.hidden),
      layers: Number(net.layers),
      w: numbers(net.w, 'w', fn),
      b: numbers(net.b, 'b', fn),
      c: numbers(net.c, 'c', fn),
      v: numbers(net.v, 'v', fn),
      alpha: Number(net.alpha),
      beta: numbers(net.beta, 'beta', fn),
    };
    checkNetworkParams(network, fn);
    const source = frameOf((raw as Record<string, unknown>).source, d, 'source', fn);
    const target = frameOf((raw as Record<string, unknown>).target, d, 'target', fn);
    const header: MapHeader = { method: 'gradient-net', d, settings: json.settings, columns: json.columns, n: json.n, dropped: json.dropped };
    return new GradientNetMap(header, json.fitted, network, source, target);
  }

  /** Copies standardised row i into `row`; clamps if asked; returns true if it lay outside the frame's range. */
  private load(data: Float64Array, i: number, row: Float64Array, f: Frame, clamp: boolean): boolean {
    let out = false;
    for (let k = 0; k < this.d; k++) {
      let v = data[i * this.d + k];
      if (v < f.lo[k] || v > f.hi[k]) {
        out = true;
        if (clamp) v = Math.min(f.hi[k], Math.max(f.lo[k], v));
      }
      row[k] = (v - f.mean[k]) / f.scale[k];
    }
    return out;
  }
}

function numbers(v: unknown, name: string, fn: string): Float64Array {
  if (!Array.isArray(v)) throw new RemapError(`${fn}: the saved gradient-net parameter ${name} is not a list of numbers; save the map again from a fresh fit.`);
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (typeof x !== 'number' || !Number.isFinite(x))
      throw new RemapError(`${fn}: the saved gradient-net parameter ${name}[${i}] is ${String(x)}, not a finite number.`);
    out[i] = x;
  }
  return out;
}

function frameOf(v: unknown, d: number, name: string, fn: string): Frame {
  const o = v as Record<string, unknown> | null;
  if (!o || typeof o !== 'object') throw new RemapError(`${fn}: the saved map has no ${name} frame; save the map again from a fresh fit.`);
  const mean = numbers(o.mean, `${name}.mean`, fn);
  const lo = numbers(o.lo, `${name}.lo`, fn);
  const hi = numbers(o.hi, `${name}.hi`, fn);
  // Maps saved before per-column scales hold one number for all columns.
  const scale = typeof o.scale === 'number' ? new Float64Array(d).fill(o.scale) : numbers(o.scale, `${name}.scale`, fn);
  if (mean.length !== d || lo.length !== d || hi.length !== d || scale.length !== d)
    throw new RemapError(`${fn}: the saved ${name} frame does not have ${d} columns; save the map again.`);
  for (let k = 0; k < d; k++) {
    if (!(scale[k] > 0)) throw new RemapError(`${fn}: the saved ${name} scale of column ${k + 1} is ${scale[k]}; it must be a positive number.`);
  }
  return { mean, scale, lo, hi };
}
