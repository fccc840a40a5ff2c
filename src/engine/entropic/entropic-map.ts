import { BaseMap, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitRecord, MapJSON, Mapped } from '../map';
import type { Points } from '../points';
import { checkFinite } from '../validate';
import { barycentricMap } from './barycentric-map';

/** What an entropic map needs to map new rows both ways. */
export interface EntropicParts {
  readonly eps: number;
  /** Source support (rows with positive weight), log-masses and potential f. */
  readonly source: Points;
  readonly sourceLogMass: Float64Array;
  readonly f: Float64Array;
  /** Target support, log-masses and potential g. */
  readonly target: Points;
  readonly targetLogMass: Float64Array;
  readonly g: Float64Array;
}

/** The JSON form of an entropic map's parameters (plain arrays; points row-major). */
export interface EntropicParamsJSON {
  readonly eps: number;
  readonly source: number[];
  readonly sourceLogMass: number[];
  readonly f: number[];
  readonly target: number[];
  readonly targetLogMass: number[];
  readonly g: number[];
}

/**
 * A fitted entropic transport map. `apply` evaluates the entropic map of
 * Pooladian & Niles-Weed (2021, arXiv 2109.12004)
 *   T(x) = sum_j y_j softmax_j( log b_j + (g_j - |x - y_j|^2 / 2) / eps ),
 * the gradient of a convex function, on any rows. `invert` evaluates the
 * reverse entropic map, the same construction from the target side,
 *   S(y) = sum_i x_i softmax_i( log a_i + (f_i - |y - x_i|^2 / 2) / eps ):
 * an approximate inverse, not the exact functional inverse of T (S(T(x)) is
 * close to x only where eps is small against the spread of the data).
 * Both outputs are averages of fitted rows, so they always lie in the convex
 * hull of the target (apply) or source (invert) rows: far outside the fitted
 * range the map saturates at the extreme rows, much as `tails = clamp` would;
 * the `tails` setting is therefore not used. `Mapped.outside` counts rows with
 * a coordinate outside the per-column range of the fitted source (apply) or
 * target (invert). Cost of apply/invert: O(r m d) for r rows.
 */
export class EntropicMap extends BaseMap {
  readonly parts: EntropicParts;
  private readonly sourceRange: { lo: Float64Array; hi: Float64Array };
  private readonly targetRange: { lo: Float64Array; hi: Float64Array };

  /**
   * @param header how the map was fitted (settings show the eps used).
   * @param fitted fit-time cost, convergence and warnings.
   * @param parts supports, log-masses and potentials (kept by reference; never mutated).
   */
  constructor(header: MapHeader, fitted: FitRecord, parts: EntropicParts) {
    super(header, fitted);
    this.parts = parts;
    this.sourceRange = columnRange(parts.source);
    this.targetRange = columnRange(parts.target);
  }

  protected applyPoints(x: Points): Mapped {
    checkFinite(x, 'values', 'apply (entropic)');
    const p = this.parts;
    const data = barycentricMap(x, p.target, p.targetLogMass, p.g, p.eps);
    return { n: x.n, d: x.d, data, outside: countOutside(x, this.sourceRange) };
  }

  protected invertPoints(y: Points): Mapped {
    checkFinite(y, 'values', 'invert (entropic)');
    const p = this.parts;
    const data = barycentricMap(y, p.source, p.sourceLogMass, p.f, p.eps);
    return { n: y.n, d: y.d, data, outside: countOutside(y, this.targetRange) };
  }

  protected params(): EntropicParamsJSON {
    const p = this.parts;
    return {
      eps: p.eps,
      source: Array.from(p.source.data),
      sourceLogMass: Array.from(p.sourceLogMass),
      f: Array.from(p.f),
      target: Array.from(p.target.data),
      targetLogMass: Array.from(p.targetLogMass),
      g: Array.from(p.g),
    };
  }

  /**
   * Restores a map from `toJSON()` output (envelope already checked); the
   * restored map gives bit-identical results. O(size of params).
   * @throws RemapError if the parameters are missing, not finite or of inconsistent lengths.
   * @example EntropicMap.fromJSON(map.toJSON()).apply(x) // same numbers as map.apply(x)
   */
  static fromJSON(json: MapJSON): EntropicMap {
    const bad = (what: string): never => {
      throw new RemapError(`Map JSON (entropic): ${what}; give the exact text REMAP.SAVE or \`remap fit --out\` wrote.`);
    };
    const p = json.params as Partial<Record<keyof EntropicParamsJSON, unknown>> | null;
    if (!p || typeof p !== 'object') bad('the parameters are missing');
    const q = p as Record<string, unknown>;
    const arr = (name: keyof EntropicParamsJSON): Float64Array => {
      const v = q[name];
      if (!Array.isArray(v) || !v.every((z) => typeof z === 'number' && Number.isFinite(z))) bad(`"${name}" is not a list of finite numbers`);
      return Float64Array.from(v as number[]);
    };
    const eps = q.eps;
    if (typeof eps !== 'number' || !(eps > 0) || !Number.isFinite(eps)) bad('"eps" is not a positive number');
    const d = json.d;
    const src = arr('source');
    const tgt = arr('target');
    const sourceLogMass = arr('sourceLogMass');
    const targetLogMass = arr('targetLogMass');
    const f = arr('f');
    const g = arr('g');
    const ns = sourceLogMass.length;
    const nt = targetLogMass.length;
    if (ns < 1 || src.length !== ns * d || f.length !== ns) bad('the source points, log-masses and potential f have inconsistent lengths');
    if (nt < 1 || tgt.length !== nt * d || g.length !== nt) bad('the target points, log-masses and potential g have inconsistent lengths');
    const header: MapHeader = { method: 'entropic', d, settings: json.settings, columns: json.columns, n: json.n, dropped: json.dropped };
    return new EntropicMap(header, json.fitted, {
      eps: eps as number,
      source: { n: ns, d, data: src },
      sourceLogMass,
      f,
      target: { n: nt, d, data: tgt },
      targetLogMass,
      g,
    });
  }
}

function columnRange(p: Points): { lo: Float64Array; hi: Float64Array } {
  const lo = new Float64Array(p.d).fill(Infinity);
  const hi = new Float64Array(p.d).fill(-Infinity);
  for (let i = 0; i < p.n; i++) {
    for (let k = 0; k < p.d; k++) {
      const v = p.data[i * p.d + k];
      if (v < lo[k]) lo[k] = v;
      if (v > hi[k]) hi[k] = v;
    }
  }
  return { lo, hi };
}

function countOutside(x: Points, r: { lo: Float64Array; hi: Float64Array }): number {
  let out = 0;
  for (let i = 0; i < x.n; i++) {
    for (let k = 0; k < x.d; k++) {
      const v = x.data[i * x.d + k];
      if (!(v >= r.lo[k] && v <= r.hi[k])) {
        out++;
        break;
      }
    }
  }
  return out;
}
