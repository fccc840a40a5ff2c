import { BaseMap, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitRecord, MapJSON, Mapped } from '../map';
import type { Points } from '../points';
import { checkFinite } from '../validate';
import { barycentricMap } from './barycentric-map';
import { newtonInverse } from './newton-inverse';
import { TruncatedSoftmax } from './truncated-softmax';

/**
 * What an entropic map needs to map new rows both ways. The supports and potentials are in fitted
 * units: raw x is fitted as (x - sourceCentre) / scales column by column, and a fitted target value
 * z is reported as targetCentre + scales * z.
 */
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
  /** Per-column divisors (1 for units = raw) and the two samples' means, in raw units (length d each). */
  readonly scales: Float64Array;
  readonly sourceCentre: Float64Array;
  readonly targetCentre: Float64Array;
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
  /** Absent in maps saved before fitting in standardised units: read as 1 and 0. */
  readonly scales?: number[];
  readonly sourceCentre?: number[];
  readonly targetCentre?: number[];
}

/**
 * A fitted entropic transport map. `apply` evaluates the entropic map of
 * Pooladian & Niles-Weed (2021, arXiv 2109.12004)
 *   T(x) = sum_j y_j softmax_j( log b_j + (g_j - |x - y_j|^2 / 2) / eps )
 * in fitted units (see EntropicParts), the gradient of a convex function, on any
 * rows, through `TruncatedSoftmax` (the rows whose weight is below e^-(23.1 + log m)
 * of the largest are left out; with rounding, the result is within 1e-10 times the
 * diameter of the fitted target rows of the exact untruncated map, for every row not
 * far outside the data (the condition is in TruncatedSoftmax); a row's result does not
 * depend on the rows mapped with it).
 * About 30-40 us of one thread per row at m = 4,000, d = 8. `invert` is the exact inverse of that
 * map, T^-1(y), by Newton's method on the convex potential (`newtonInverse`,
 * tolerance 1e-10 relative), started from the reverse entropic map; a value with
 * no preimage (outside the convex hull of the target rows, or too close to its
 * edge for double precision) is an error naming the row.
 * Both directions stay inside a convex hull: apply inside the target rows'
 * hull (outside.ts words it for the report), and invert accepts only values inside it.
 * `Mapped.outside` counts rows with a coordinate outside the per-column range
 * of the fitted source (apply) or target (invert).
 * Cost: apply O(r m d) for r rows (plus O(kept rows * d) per row); invert
 * O(r * steps * m d^2).
 */
export class EntropicMap extends BaseMap {
  readonly parts: EntropicParts;
  private readonly sourceRange: { lo: Float64Array; hi: Float64Array };
  private readonly targetRange: { lo: Float64Array; hi: Float64Array };
  private softmax: TruncatedSoftmax | null = null;
  private readonly h: Float64Array;

  /**
   * @param header how the map was fitted (settings show the eps used).
   * @param fitted fit-time cost, convergence and warnings.
   * @param parts supports, log-masses and potentials (kept by reference; never mutated).
   */
  constructor(header: MapHeader, fitted: FitRecord, parts: EntropicParts) {
    super(header, fitted);
    this.parts = parts;
    this.sourceRange = columnRange(toRaw(parts.source.data, parts.source.d, parts.sourceCentre, parts.scales));
    this.targetRange = columnRange(toRaw(parts.target.data, parts.target.d, parts.targetCentre, parts.scales));
    this.h = new Float64Array(parts.target.n);
    for (let j = 0; j < this.h.length; j++) this.h[j] = parts.targetLogMass[j] + parts.g[j] / parts.eps;
  }

  /**
   * Apply: a distance to every target row and the weighted sum, about 3 m d a row. Invert: the reverse map as a start,
   * then Newton's method, each step a pass over the m target rows with a d x d matrix: about 10 m d^2 a row.
   */
  override workPerRow(verb: 'apply' | 'invert'): number {
    const { d } = this;
    return verb === 'apply' ? 3 * this.parts.target.n * d : this.parts.source.n * d + 10 * this.parts.target.n * d * d;
  }

  protected applyPoints(x: Points): Mapped {
    checkFinite(x, 'values', 'apply (entropic)');
    const p = this.parts;
    if (!this.softmax) this.softmax = new TruncatedSoftmax(p.target, this.h, p.eps);
    const data = this.softmax.map(toFittedPoints(x, p.sourceCentre, p.scales));
    return { n: x.n, d: x.d, data: toRaw(data, x.d, p.targetCentre, p.scales).data, outside: countOutside(x, this.sourceRange) };
  }

  protected invertPoints(y: Points): Mapped {
    checkFinite(y, 'values', 'invert (entropic)');
    const p = this.parts;
    const fitted = toFittedPoints(y, p.targetCentre, p.scales);
    const start = barycentricMap(fitted, p.source, p.sourceLogMass, p.f, p.eps);
    const r = newtonInverse(fitted, p.target, this.h, p.eps, start);
    if (r.failed.length > 0) {
      const i = r.failed[0];
      const shown = Array.from(y.data.subarray(i * y.d, i * y.d + Math.min(y.d, 5))).join(', ') + (y.d > 5 ? ', ...' : '');
      throw new RemapError(
        `invert (entropic): row ${i + 1} of the values (${shown}) is not a value the map produces (${r.failed.length} row${r.failed.length === 1 ? '' : 's'} failed): ` +
          "the entropic map only reaches the inside of the convex hull of the target rows, and Newton's method did not converge there. Invert values inside the range of the mapped data.",
        'num',
      );
    }
    return { n: y.n, d: y.d, data: toRaw(r.data, y.d, p.sourceCentre, p.scales).data, outside: countOutside(y, this.targetRange) };
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
      scales: Array.from(p.scales),
      sourceCentre: Array.from(p.sourceCentre),
      targetCentre: Array.from(p.targetCentre),
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
    const optional = (name: 'scales' | 'sourceCentre' | 'targetCentre', fill: number): Float64Array => {
      if (q[name] === undefined) return new Float64Array(d).fill(fill);
      const v = arr(name);
      if (v.length !== d) bad(`"${name}" must hold ${d} numbers`);
      return v;
    };
    const scales = optional('scales', 1);
    if (!scales.every((v) => v > 0)) bad('"scales" must be positive');
    const header: MapHeader = { method: 'entropic', d, settings: json.settings, columns: json.columns, n: json.n, dropped: json.dropped };
    return new EntropicMap(header, json.fitted, {
      eps: eps as number,
      source: { n: ns, d, data: src },
      sourceLogMass,
      f,
      target: { n: nt, d, data: tgt },
      targetLogMass,
      g,
      scales,
      sourceCentre: optional('sourceCentre', 0),
      targetCentre: optional('targetCentre', 0),
    });
  }
}

/** (x - centre) / scales column by column, as new Points. O(n d). */
function toFittedPoints(x: Points, centre: Float64Array, scales: Float64Array): Points {
  const { n, d, data } = x;
  const out = new Float64Array(n * d);
  for (let t = 0; t < out.length; t++) {
    const k = t % d;
    out[t] = (data[t] - centre[k]) / scales[k];
  }
  return { n, d, data: out };
}

/** centre + scales * z column by column, as new Points. O(n d). */
function toRaw(z: Float64Array, d: number, centre: Float64Array, scales: Float64Array): Points {
  const out = new Float64Array(z.length);
  for (let t = 0; t < out.length; t++) {
    const k = t % d;
    out[t] = centre[k] + scales[k] * z[t];
  }
  return { n: z.length / d, d, data: out };
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
