import { RemapError } from '../errors';
import type { Points } from '../points';
import { checkedCdf, ecdfGap } from './ks';
import { Random } from './random';

/** What `energyDistance` returns. */
export interface EnergyResult {
  /** 2 E|X - Y| - E|X - X'| - E|Y - Y'| (>= 0; 0 only for identical distributions). */
  readonly value: number;
  /** True when at least one side was cut down to `maxRows` rows at random (seeded). */
  readonly subsampled: boolean;
  /** Rows actually used from each side. */
  readonly rows: { readonly a: number; readonly b: number };
}

export interface EnergyOptions {
  /** Most rows used per side when d > 1 (integer >= 2, default 2,000); ignored when d = 1 (always exact). */
  readonly maxRows?: number;
  /** Seed of the subsample (integer 0 .. 2^32 - 1, default 0). */
  readonly seed?: number;
}

export const ENERGY_MAX_ROWS = 2000;

/**
 * Energy distance between two samples (Szekely & Rizzo, "Energy statistics: a
 * class of statistics based on distances", J. Stat. Planning and Inference
 * 143, 2013): 2 E|X - Y| - E|X - X'| - E|Y - Y'| with |.| the
 * Euclidean norm. Normalisation: the V-statistic of the weighted empirical
 * distributions, i.e. X, X' drawn independently from a (row i with probability
 * wa_i / sum(wa)), Y, Y' from b, pairs of a row with itself included at
 * distance 0. It is >= 0 and 0 exactly when the two weighted samples are equal
 * as distributions.
 *
 * d = 1: exact for every n via the identity energy = 2 * integral (F - G)^2 dt
 * with F, G the empirical distribution functions (the one-dimensional link
 * to Cramer's distance in the same paper), computed by sorting and one merged
 * walk. Cost O((n + m) log(n + m)).
 * d > 1: the double sums directly, cost O((n + m)^2 d), after cutting each
 * side with more than `maxRows` rows (of positive weight) down to a seeded
 * uniform random subset of `maxRows` rows, weights kept and renormalised; the
 * result then says `subsampled: true`. Same inputs and seed give the same value.
 * Rounding below zero is reported as 0.
 * Never mutates its inputs.
 *
 * @param a first sample, n >= 1 finite rows.
 * @param b second sample, m >= 1 finite rows, same d as a.
 * @param wa optional weights of a's rows (finite, >= 0, not all zero).
 * @param wb optional weights of b's rows, likewise.
 * @param options maxRows (integer >= 2, default 2,000) and seed (integer 0..2^32-1, default 0).
 * @throws RemapError for different column counts, empty samples, non-finite values, bad weights or options.
 * @example energyDistance(column([0]), column([1])) // { value: 2, subsampled: false, rows: { a: 1, b: 1 } }
 */
export function energyDistance(a: Points, b: Points, wa?: ArrayLike<number> | null, wb?: ArrayLike<number> | null, options: EnergyOptions = {}): EnergyResult {
  const fn = 'energyDistance';
  const maxRows = options.maxRows ?? ENERGY_MAX_ROWS;
  const seed = options.seed ?? 0;
  if (!(Number.isInteger(maxRows) && maxRows >= 2)) throw new RemapError(`${fn}: maxRows is ${maxRows}; give a whole number of at least 2.`);
  if (!(Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff)) throw new RemapError(`${fn}: seed is ${seed}; give a whole number from 0 to 4294967295.`);
  if (a.d !== b.d) throw new RemapError(`${fn}: a has ${a.d} columns and b has ${b.d}; give both the same columns.`);
  checkShape(a, 'a', fn);
  checkShape(b, 'b', fn);
  const d = a.d;

  if (d === 1) {
    const gap = ecdfGap(checkedCdf(a.data, wa, 'a', fn), checkedCdf(b.data, wb, 'b', fn));
    return { value: 2 * gap.squaredIntegral, subsampled: false, rows: { a: a.n, b: b.n } };
  }

  checkFinite(a, 'a', fn);
  checkFinite(b, 'b', fn);
  const sa = subsample(a, wa, 'a', maxRows, seed, fn);
  const sb = subsample(b, wb, 'b', maxRows, (seed ^ 0x5bd1e995) >>> 0, fn);
  const exy = crossMean(sa, sb, d);
  const exx = withinMean(sa, d);
  const eyy = withinMean(sb, d);
  const value = Math.max(0, 2 * exy - exx - eyy);
  return { value, subsampled: sa.cut || sb.cut, rows: { a: sa.n, b: sb.n } };
}

interface Rows {
  readonly n: number;
  readonly x: Float64Array;
  /** Normalised weights. */
  readonly w: Float64Array;
  readonly cut: boolean;
}

function checkShape(p: Points, name: string, fn: string): void {
  if (!(Number.isInteger(p.n) && p.n >= 1)) throw new RemapError(`${fn}: ${name} has ${p.n} rows; give at least one row.`);
  if (!(Number.isInteger(p.d) && p.d >= 1)) throw new RemapError(`${fn}: ${name} has ${p.d} columns; give at least one column.`);
  if (p.data.length !== p.n * p.d) throw new RemapError(`${fn}: ${name} holds ${p.data.length} numbers but n x d = ${p.n * p.d}; build it with points().`);
}

function checkFinite(p: Points, name: string, fn: string): void {
  for (let j = 0; j < p.data.length; j++) {
    if (!Number.isFinite(p.data[j]))
      throw new RemapError(`${fn}: ${name} holds ${p.data[j]} in row ${Math.floor(j / p.d) + 1}, column ${(j % p.d) + 1}; give finite numbers only.`);
  }
}

/** Rows of positive weight, cut to `maxRows` by a seeded partial shuffle; weights normalised. */
function subsample(p: Points, weights: ArrayLike<number> | null | undefined, name: string, maxRows: number, seed: number, fn: string): Rows {
  const { n, d, data } = p;
  let keep: Uint32Array;
  if (weights == null) {
    keep = new Uint32Array(n);
    for (let i = 0; i < n; i++) keep[i] = i;
  } else {
    if (weights.length !== n) throw new RemapError(`${fn}: ${weights.length} weights for the ${n} rows of ${name}; give one weight per row.`);
    let count = 0;
    for (let i = 0; i < n; i++) {
      const w = weights[i];
      if (!(w >= 0) || !Number.isFinite(w)) throw new RemapError(`${fn}: weight ${i + 1} of ${name} is ${w}; weights must be finite and zero or positive.`);
      if (w > 0) count++;
    }
    if (count === 0) throw new RemapError(`${fn}: all weights of ${name} are zero; give at least one positive weight.`);
    keep = new Uint32Array(count);
    for (let i = 0, c = 0; i < n; i++) if (weights[i] > 0) keep[c++] = i;
  }
  let cut = false;
  if (keep.length > maxRows) {
    const chosen = new Random(seed).choose(keep.length, maxRows);
    const all = keep;
    keep = new Uint32Array(maxRows);
    for (let t = 0; t < maxRows; t++) keep[t] = all[chosen[t]];
    cut = true;
  }
  const m = keep.length;
  const x = new Float64Array(m * d);
  const w = new Float64Array(m);
  let total = 0;
  for (let r = 0; r < m; r++) {
    const i = keep[r];
    for (let k = 0; k < d; k++) x[r * d + k] = data[i * d + k];
    w[r] = weights == null ? 1 : weights[i];
    total += w[r];
  }
  if (!Number.isFinite(total)) throw new RemapError(`${fn}: the weights of ${name} add up to more than the largest number; rescale them.`);
  for (let r = 0; r < m; r++) w[r] /= total;
  return { n: m, x, w, cut };
}

/** sum_i sum_j wa_i wb_j |a_i - b_j|. */
/** A local alias: global lookups inside hot loops are slow in some hosts (jest's sandboxed contexts). */
const sqrt = Math.sqrt;

function crossMean(a: Rows, b: Rows, d: number): number {
  const ax = a.x;
  const bx = b.x;
  const aw = a.w;
  const bw = b.w;
  const na = a.n;
  const nb = b.n;
  let total = 0;
  for (let i = 0; i < na; i++) {
    const oi = i * d;
    let s = 0;
    for (let j = 0, oj = 0; j < nb; j++, oj += d) {
      let q = 0;
      for (let k = 0; k < d; k++) {
        const t = ax[oi + k] - bx[oj + k];
        q += t * t;
      }
      s += bw[j] * sqrt(q);
    }
    total += aw[i] * s;
  }
  return total;
}

/** sum_i sum_j w_i w_j |x_i - x_j|, using symmetry (each unordered pair once, doubled). */
function withinMean(a: Rows, d: number): number {
  const x = a.x;
  const w = a.w;
  const n = a.n;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const oi = i * d;
    let s = 0;
    for (let j = i + 1, oj = (i + 1) * d; j < n; j++, oj += d) {
      let q = 0;
      for (let k = 0; k < d; k++) {
        const t = x[oi + k] - x[oj + k];
        q += t * t;
      }
      s += w[j] * sqrt(q);
    }
    total += w[i] * s;
  }
  return 2 * total;
}
