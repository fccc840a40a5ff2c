import { sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { CostReport, FitRecord, TransportMap, Warning } from '../map';
import { fitMapSync, getMethod, settingSpecs } from '../methods';
import type { Sample } from '../points';
import { OneColumnMap } from '../quantile/one-column-map';
import type { ShareGrid } from '../quantile/grid';
import { hazenGrid } from '../quantile/hazen-grid';
import { buildKnots } from '../quantile/knots';
import { quantileColumnFromParams } from '../quantile/quantile-column';
import { resolveSettings } from '../settings';
import { weightedCdf } from '../stats/weighted-cdf';
import { frequencySample, frequencyTotal, type FrequencyTable } from './frequency-table';
import { tableInterpolationError } from './interpolation-error';
import type { QuantileTable } from './quantile-table';

/** One side of a 1-D map: a sample of rows, a quantile table or a frequency table. */
export type Distribution1d =
  | { readonly kind: 'sample'; readonly sample: Sample }
  | { readonly kind: 'quantiles'; readonly table: QuantileTable }
  | { readonly kind: 'frequencies'; readonly table: FrequencyTable };

/** Beyond a quantile table's first and last probability: hold its end values (default) or continue its end steps as straight lines. */
export type TableBeyond = 'hold' | 'extend';

/** Fewer points than this, or a step in probability wider than COARSE_STEP, makes a table coarse (design choice). */
export const COARSE_POINTS = 20;
export const COARSE_STEP = 0.1;

/**
 * Fits a 1-D map whose source and target may each be a sample, a quantile
 * table or a frequency table.
 * - A frequency table is a weighted sample (one row per value, weighted by its
 *   count or share), so every 1-D method fits it exactly as it fits the same
 *   values written out row by row; with counts the report gives the total count
 *   as the row count.
 * - A quantile table is a quantile function read linearly between its points
 *   (in probability); only method quantile takes it. The map is
 *   T = Q_target o F_source with each side's curve through its points (a
 *   sample's curve through its Hazen positions, as method quantile reads it),
 *   so a uniform source on [0, 1] is mapped onto the table's values exactly at
 *   the table's probabilities. Beyond the table's first and last probability
 *   `beyond` = 'hold' keeps the table's end value (the map is flat there);
 *   'extend' continues the end steps as straight lines, an extrapolation.
 *   Warnings: a coarse table (fewer than 20 points or a step wider than 0.1 in
 *   probability), with the estimated interpolation error; a source share
 *   beyond the table's probabilities, with the values where that starts.
 * The result is an ordinary map of its method (JSON, apply, invert as usual).
 * Cost: O((n + K) log(n + K)).
 * @param method 'quantile' (default), or step / ordinal when no side is a quantile table.
 * @throws RemapError for a quantile table with another method, bad settings, or whatever the method refuses.
 * @example
 * fitFromTables('quantile', { kind: 'quantiles', table: quantileTable([0, 1], [0, 1], 's') }, { kind: 'quantiles', table: normalTable })
 *   .apply(column([0.975])) // 1.96 when the table holds (0.975, 1.96)
 */
export function fitFromTables(
  method: string,
  source: Distribution1d,
  target: Distribution1d,
  settings: Readonly<Record<string, unknown>> = {},
  beyond: TableBeyond = 'hold',
): TransportMap {
  const name = (method || 'quantile').trim().toLowerCase();
  const fn = `fit from tables (${name})`;
  if (beyond !== 'hold' && beyond !== 'extend') throw new RemapError(`${fn}: beyond is "${String(beyond)}"; choose hold or extend.`);
  if (source.kind !== 'quantiles' && target.kind !== 'quantiles') return fitFrequencies(name, source, target, settings);
  if (name !== 'quantile') {
    throw new RemapError(
      `${fn}: a quantile table is a continuous curve, which only method quantile reads; choose method quantile, or give the data as a frequency table for method ${name}.`,
    );
  }
  const resolved = resolveSettings('quantile', settingSpecs(getMethod('quantile')), settings);
  const s = sideGrid(source, 'source', fn);
  const t = sideGrid(target, 'target', fn);
  if (beyond === 'extend') {
    const lo = Math.min(s.grid.p[0], t.grid.p[0]);
    const hi = Math.max(s.grid.p[s.grid.p.length - 1], t.grid.p[t.grid.p.length - 1]);
    if (s.table) s.grid = extend(s.grid, lo, hi);
    if (t.table) t.grid = extend(t.grid, lo, hi);
  }
  const knots = buildKnots(s.grid, t.grid, true);
  if (knots.xs.length < 2)
    throw new RemapError(`${fn}: the source and target cover no common range of probabilities; check that both tables' probabilities overlap.`, 'num');
  const sv = s.grid.v;
  const tv = t.grid.v;
  const column = quantileColumnFromParams(
    {
      xs: Array.from(knots.xs),
      ys: Array.from(knots.ys),
      source: [Math.min(sv[0], knots.xs[0]), Math.max(sv[sv.length - 1], knots.xs[knots.xs.length - 1])],
      target: [Math.min(tv[0], knots.ys[0]), Math.max(tv[tv.length - 1], knots.ys[knots.ys.length - 1])],
    },
    fn,
  );
  const header: MapHeader = {
    method: 'quantile',
    d: 1,
    settings: resolved,
    columns: null,
    n: { source: s.rows, target: t.rows },
    dropped: { source: 0, target: 0 },
  };
  const warnings: Warning[] = [];
  for (const side of [s, t]) {
    if (!side.table && side.rows < 30) {
      warnings.push({
        code: 'small-sample',
        message: `Only ${side.rows} rows in the ${side.which}; with fewer than 30 rows the map is a rough estimate.`,
        action: 'Add rows if you can, and review mapped values before relying on them.',
      });
    }
  }
  for (const side of [s, t]) if (side.table) warnings.push(...tableWarnings(side, side === s ? t : s, knots, beyond));
  const cost = curveCost(s.grid, t.grid, describe(s, t, beyond));
  const fitted: FitRecord = { cost, minJacobianEigenvalue: column.forward.minSlope(), warnings };
  const map = new OneColumnMap(header, fitted, [column]);
  const sample = (d: Distribution1d) => (d.kind === 'sample' ? d.sample : d.kind === 'frequencies' ? frequencySample(d.table) : null);
  const ss = sample(source);
  const ts = sample(target);
  if (ss && ts) map.attachSamples(ss, ts);
  return map;
}

/** Neither side a quantile table: a weighted sample each, fitted by the method; counts give the row count. */
function fitFrequencies(method: string, source: Distribution1d, target: Distribution1d, settings: Readonly<Record<string, unknown>>): TransportMap {
  const s = asSample(source);
  const t = asSample(target);
  const map = fitMapSync(method, s, t, settings);
  if (!(map instanceof OneColumnMap) || map.d !== 1)
    throw new RemapError(`fit from tables (${method}): tables are one column; choose quantile, step or ordinal.`);
  const rows = (d: Distribution1d, fallback: number) => (d.kind === 'frequencies' && d.table.counts ? frequencyTotal(d.table) : fallback);
  const header: MapHeader = { ...map.header, n: { source: rows(source, s.n), target: rows(target, t.n) } };
  const shares = (source.kind === 'frequencies' && !source.table.counts) || (target.kind === 'frequencies' && !target.table.counts);
  const warnings: Warning[] = sizeWarnings(header).filter((w) => !(shares && w.code === 'small-sample'));
  warnings.push(...map.fitted.warnings.filter((w) => w.code !== 'small-sample' && w.code !== 'rows-dropped'));
  if (shares) {
    warnings.push({
      code: 'small-sample',
      message:
        'A frequency table gives shares rather than counts, so the number of people or records behind it is unknown and the small-sample check could not be made.',
      action: 'Give counts if you have them; a map from a few hundred records or fewer is rough.',
    });
  }
  const out = new OneColumnMap(header, { ...map.fitted, warnings }, map.columnMaps);
  out.attachSamples(s, t);
  return out;
}

function asSample(d: Distribution1d): Sample {
  if (d.kind === 'sample') return d.sample;
  if (d.kind === 'frequencies') return frequencySample(d.table);
  throw new RemapError('fit from tables: a quantile table is not a sample; method quantile reads it as a curve.');
}

interface SideGrid {
  grid: ShareGrid;
  readonly table: QuantileTable | null;
  readonly rows: number;
  readonly which: 'source' | 'target';
}

function sideGrid(d: Distribution1d, which: 'source' | 'target', fn: string): SideGrid {
  if (d.kind === 'quantiles') return { grid: { p: d.table.p, v: d.table.v }, table: d.table, rows: d.table.p.length, which };
  const s = d.kind === 'sample' ? d.sample : frequencySample(d.table);
  if (s.d !== 1) throw new RemapError(`${fn}: the ${which} has ${s.d} columns; tables are one column, so give one column.`);
  const cdf = weightedCdf(s.data.subarray(0, s.n), s.weights);
  if (cdf.values.length < 2)
    throw new RemapError(`${fn}: every ${which} row holds the same value (${cdf.values[0]}); give at least two different values.`, 'num');
  const rows = d.kind === 'frequencies' && d.table.counts ? frequencyTotal(d.table) : s.n;
  return { grid: hazenGrid(cdf), table: null, rows, which };
}

/** The grid continued to shares lo and hi along its end steps (only where it stops short). */
function extend(g: ShareGrid, lo: number, hi: number): ShareGrid {
  const { p, v } = g;
  const K = p.length;
  const P: number[] = [];
  const V: number[] = [];
  if (lo < p[0]) {
    P.push(lo);
    V.push(v[0] - ((v[1] - v[0]) / (p[1] - p[0])) * (p[0] - lo));
  }
  for (let k = 0; k < K; k++) {
    P.push(p[k]);
    V.push(v[k]);
  }
  if (hi > p[K - 1]) {
    P.push(hi);
    V.push(v[K - 1] + ((v[K - 1] - v[K - 2]) / (p[K - 1] - p[K - 2])) * (hi - p[K - 1]));
  }
  return { p: Float64Array.from(P), v: Float64Array.from(V) };
}

function tableWarnings(side: SideGrid, other: SideGrid, knots: { xs: Float64Array; ys: Float64Array }, beyond: TableBeyond): Warning[] {
  const t = side.table!;
  const out: Warning[] = [];
  const K = t.p.length;
  let widest = 0;
  for (let k = 1; k < K; k++) widest = Math.max(widest, t.p[k] - t.p[k - 1]);
  const err = tableInterpolationError(t);
  if (K < COARSE_POINTS || widest > COARSE_STEP) {
    out.push({
      code: 'small-sample',
      message: `The ${side.which} quantile table is coarse (${K} points, widest step ${fmt(widest)} in probability). Between its points its quantile function is read as a straight line, which from the table's curvature may be off by about ${fmt(err.largest)} (largest between probabilities ${fmt(err.at.from)} and ${fmt(err.at.to)}).`,
      action: 'Use a table with more points (percentiles, or every 5 %) if you have one; treat mapped values between sparse points as approximate.',
    });
  }
  const op = other.grid.p;
  const below = t.p[0] - op[0];
  const above = op[op.length - 1] - t.p[K - 1];
  if (below > 0 || above > 0) {
    const parts: string[] = [];
    const xs = side.which === 'target' ? knots.xs : knots.ys;
    const ends = side.which === 'target' ? knots.ys : knots.xs;
    const verb = side.which === 'target' ? 'source' : 'target';
    if (below > 0) parts.push(`${verb} values below ${fmt(xs[0])} (about ${pct(t.p[0])} of the ${verb}) lie below its first probability ${fmt(t.p[0])}`);
    if (above > 0)
      parts.push(`${verb} values above ${fmt(xs[xs.length - 1])} (about ${pct(1 - t.p[K - 1])}) lie above its last probability ${fmt(t.p[K - 1])}`);
    out.push({
      code: 'extrapolation',
      message: `The ${side.which} quantile table does not reach the ends of the distribution: ${parts.join('; ')}. ${
        beyond === 'hold'
          ? `There the map holds the table's end value${side.which === 'target' ? `s (${fmt(ends[0])} and ${fmt(ends[ends.length - 1])})` : 's'}, so distinct values come out equal.`
          : "There the map continues the table's end steps as straight lines: an extrapolation the table does not support."
      }`,
      action: 'Use a table that reaches further into the tails (0.01 and 0.99, or its minimum and maximum), or treat results in the tails as approximate.',
    });
  }
  return out;
}

/**
 * Squared W2 (and W1) between the two curves, over the shares both cover:
 * the quantile functions are linear between the merged points, so the squared
 * difference integrates exactly, h (a^2 + a b + b^2) / 3 per step; divided by the
 * width of the common range (the cost of the distributions conditioned to it).
 */
function curveCost(s: ShareGrid, t: ShareGrid, note: string): CostReport {
  const lo = Math.max(s.p[0], t.p[0]);
  const hi = Math.min(s.p[s.p.length - 1], t.p[t.p.length - 1]);
  const ps = new Set<number>([lo, hi]);
  for (const g of [s, t]) for (const p of g.p) if (p > lo && p < hi) ps.add(p);
  const grid = [...ps].sort((a, b) => a - b);
  let w2 = 0;
  let w1 = 0;
  let prev = at(s, grid[0]) - at(t, grid[0]);
  for (let k = 1; k < grid.length; k++) {
    const h = grid[k] - grid[k - 1];
    const d = at(s, grid[k]) - at(t, grid[k]);
    w2 += (h * (prev * prev + prev * d + d * d)) / 3;
    w1 += prev * d >= 0 ? (h * (Math.abs(prev) + Math.abs(d))) / 2 : (h * (prev * prev + d * d)) / (2 * (Math.abs(prev) + Math.abs(d)));
    prev = d;
  }
  const width = hi - lo;
  const w2Squared = width > 0 ? w2 / width : 0;
  if (!Number.isFinite(w2Squared)) throw new RemapError('fit from tables: the squared distances overflow; rescale the values.', 'num');
  return { kind: 'exact-1d', w2Squared, w2: Math.sqrt(w2Squared), w1: width > 0 ? w1 / width : 0, note };
}

/** The curve at share p (p within its range; a repeated share takes the later point). */
function at(g: ShareGrid, p: number): number {
  const { p: P, v: V } = g;
  let a = 0;
  let b = P.length - 1;
  if (p <= P[0]) return V[0];
  if (p >= P[b]) return V[b];
  while (b - a > 1) {
    const m = (a + b) >>> 1;
    if (P[m] <= p) a = m;
    else b = m;
  }
  return V[a] + (V[b] - V[a]) * ((p - P[a]) / (P[b] - P[a]));
}

function describe(s: SideGrid, t: SideGrid, beyond: TableBeyond): string {
  const one = (g: SideGrid) =>
    g.table
      ? `the ${g.which} is a quantile table read linearly between its ${g.table.p.length} points (probabilities ${fmt(g.table.p[0])} to ${fmt(g.table.p[g.table.p.length - 1])}; beyond them: ${beyond === 'hold' ? 'its end values held' : 'its end steps extended'}; estimated interpolation error up to ${fmt(tableInterpolationError(g.table).largest)})`
      : `the ${g.which} is read through its Hazen positions`;
  return `Squared 2-Wasserstein distance between the two quantile curves over the probabilities both cover (exact for piecewise-linear curves); ${one(s)}; ${one(t)}.`;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

function pct(x: number): string {
  return `${Number((100 * x).toPrecision(3))} %`;
}
