import { RemapError } from '../errors';
import { fitHeader, jsonHeader } from '../base';
import { sizeWarnings } from '../base';
import type { CostReport, FitContext, FitRecord, MapJSON, MethodName, Warning } from '../map';
import { columnOf, type Sample } from '../points';
import { TAILS_SETTING, type SettingSpec, type Settings } from '../settings';
import { outsideBothTails } from '../outside';
import type { MethodSpec } from '../method';
import { sortedCopy, sortWithOrder, sortWithWeights, type SortedWithOrder } from '../stats/sort';
import { transportCosts1d } from '../stats/wasserstein-1d';
import { kishEffectiveSize } from '../stats/effective-size';
import { weightedCdfSorted, type WeightedCdf } from '../stats/weighted-cdf';
import type { ColumnMap, FittedSource } from './column-map';
import type { Tails } from './one-way-map';
import { OneColumnMap } from './one-column-map';

/** How one of the column-by-column methods builds, checks and restores a column. */
export interface ColumnRecipe {
  readonly method: MethodName;
  /** Builds the column map from the two merged CDFs. `where` starts error messages. */
  build(src: WeightedCdf, tgt: WeightedCdf, where: string, settings: Settings): ColumnMap;
  /** The method's own settings (beyond the common `tails`), if any. */
  readonly settings?: readonly SettingSpec[];
  /** Checks a raw column before fitting (e.g. whole numbers). */
  check?(values: Float64Array, where: string): void;
  /** Rebuilds a column from its saved params. */
  restore(raw: unknown, where: string): ColumnMap;
  /** Warn when source rows share values (they all map to one value)? */
  readonly warnTies: boolean;
}

/**
 * Fits every column on its own with `recipe` and assembles the map: header,
 * size warnings, a 'marginals-only' warning for several columns, a 'ties'
 * warning where the recipe asks, the exact 1-D cost per column (W2^2 and, for
 * one column, W1, between the two empirical distributions), and the smallest
 * slope of the fitted maps as the monotonicity certificate.
 * Cost: O(d (n log n + m log m)).
 * @param source,target validated samples with the same d (see `prepareFit`).
 * @throws RemapError from the recipe (e.g. a side with one distinct value), or
 *   (kind 'num') when the cost overflows (values of size 1e154 and beyond).
 * @example fitOneColumnMap(recipe, sample([0, 1, 3]), sample([5, 6, 8]), { tails: 'clamp' }, {}).cost().w2Squared // 25
 */
export function fitOneColumnMap(recipe: ColumnRecipe, source: Sample, target: Sample, settings: Settings, ctx: FitContext): OneColumnMap {
  const d = source.d;
  const header = fitHeader(recipe.method, source, target, settings, ctx);
  const columns: ColumnMap[] = [];
  const w2: number[] = [];
  let w1 = 0;
  let minSlope = Infinity;
  const tied: string[] = [];
  const compacted: string[] = [];
  for (let k = 0; k < d; k++) {
    const where = `fit (${recipe.method})${d > 1 || ctx.columns ? `: ${columnName(ctx, k)}` : ''}`;
    const src = columnCdf(recipe, source, k, `${where}: source`, d === 1);
    const s = src.cdf;
    const t = columnCdf(recipe, target, k, `${where}: target`, false).cdf;
    const c = recipe.build(s, t, where, settings);
    columns.push(src.sorted ? { ...c, fittedSource: mapFittedSource(c, src.raw, src.sorted, tails(settings)) } : c);
    const cost = transportCosts1d(s, t);
    w2.push(cost.w2Squared);
    if (d === 1) w1 = cost.w1;
    const slope = c.forward.minSlope();
    if (slope < minSlope) minSlope = slope;
    if (recipe.warnTies && s.tiedRows > 0) tied.push(`${s.tiedRows} of ${s.rows} in ${columnName(ctx, k)}`);
    if (c.compaction)
      compacted.push(
        `${columnName(ctx, k)}: ${c.compaction.knots} of ${c.compaction.fullKnots} knots, largest difference ${c.compaction.largestError.toPrecision(3)} in mapped values (${c.compaction.largestErrorInverse.toPrecision(3)} inverting)`,
      );
  }
  const effectiveSize = { source: kishEffectiveSize(source.weights, source.n), target: kishEffectiveSize(target.weights, target.n) };
  const warnings: Warning[] = sizeWarnings(header, effectiveSize);
  if (d > 1) {
    warnings.push({
      code: 'marginals-only',
      message: `The ${recipe.method} method maps each of the ${d} columns on its own: each column of the mapped source matches the target's column, but the dependence between columns (correlation, joint shape) is not matched.`,
      action: 'If the relation between columns matters, use a joint method (linear, entropic, pairs or gradient-net).',
    });
  }
  if (tied.length > 0) {
    warnings.push({
      code: 'ties',
      message: `Some source rows share a value with other rows (${tied.join('; ')}); rows with the same value all map to one value, so the mapped column has fewer distinct values than the target.`,
      action: 'If the values are whole-number scores, method ordinal spreads each score over its unit interval; otherwise this is expected.',
    });
  }
  if (compacted.length > 0) {
    warnings.push({
      code: 'compacted',
      message: `To keep the map small it keeps fewer knots than the full map, which would keep one per data value (${compacted.join('; ')}); the difference from the full map is largest there and never larger, over the fitted range and beyond it.`,
      action: 'If that difference matters, set knots to a larger number (above the row count keeps every knot).',
    });
  }
  const total = w2.reduce((a, b) => a + b, 0);
  if (!Number.isFinite(total) || (d === 1 && !Number.isFinite(w1))) {
    // Values near 1e154 or beyond: the squared distances overflow. A cost of Infinity would be
    // shown as a number (and lost in the saved JSON), so refuse, as the linear and pairs fits do.
    throw new RemapError(
      `fit (${recipe.method}): the squared distances between source and target values are too large to represent (the cost overflows); rescale the columns (for example to thousands or millions) and fit again.`,
      'num',
    );
  }
  const cost: CostReport =
    d === 1
      ? {
          kind: 'exact-1d',
          w2Squared: total,
          w2: Math.sqrt(total),
          w1,
          bound: 'exact',
          label: 'squared W2, exact',
          note: 'Exact squared 2-Wasserstein distance (and W1) between the source and target samples, from their quantile functions.',
        }
      : {
          kind: 'per-column-1d',
          w2Squared: total,
          w2: Math.sqrt(total),
          perColumn: w2,
          bound: 'lower',
          label: 'squared W2, lower bound (sum of per-column costs; dependence ignored)',
          note: `Sum over the ${d} columns of the exact squared 2-Wasserstein distance between source and target columns: a lower bound on the joint squared W2, since the joint optimal coupling's column marginals are couplings of the columns, so the joint cost is at least the sum of the per-column costs; the gap grows with the difference in dependence between columns.`,
        };
  const fitted: FitRecord = { cost, minJacobianEigenvalue: minSlope, effectiveSize, warnings };
  return new OneColumnMap(header, fitted, columns);
}

/**
 * Restores a map saved by a map of `recipe`'s method (envelope already
 * checked), bit-identically. Cost: O(total knots).
 * @throws RemapError if the saved params are damaged.
 * @example restoreOneColumnMap(recipe, map.toJSON()).apply(x) // the same numbers as map.apply(x)
 */
export function restoreOneColumnMap(recipe: ColumnRecipe, json: MapJSON): OneColumnMap {
  const where = `load (${recipe.method})`;
  const params = json.params as { columns?: unknown } | null;
  const saved = params && typeof params === 'object' ? params.columns : undefined;
  if (!Array.isArray(saved) || saved.length !== json.d) {
    throw new RemapError(
      `${where}: the saved map should hold ${json.d} fitted column${json.d === 1 ? '' : 's'} but does not; the saved map is damaged. Fit the map again.`,
    );
  }
  const columns = saved.map((raw, k) => recipe.restore(raw, `${where}, column ${k + 1}`));
  const header = { ...jsonHeader(json), method: recipe.method };
  return new OneColumnMap(header, json.fitted, columns);
}

function columnName(ctx: FitContext, k: number): string {
  const name = ctx.columns?.[k];
  return name ? `column "${name}"` : `column ${k + 1}`;
}

function tails(settings: Settings): Tails {
  return settings.tails === 'linear' ? 'linear' : 'clamp';
}

interface ColumnSort {
  readonly cdf: WeightedCdf;
  /** The column as given (a copy when the order is kept, else maybe the sample's own data: read only). */
  readonly raw: Float64Array;
  readonly sorted: SortedWithOrder | null;
}

/**
 * Runs the recipe's check on column k, sorts it (with weights) and merges
 * ties. `keepOrder`: copy the column once, sort it by index and keep the copy
 * and the order, to map the fitted source without a search. Otherwise a
 * single column is read in place (the sorts copy; nothing writes to it).
 */
function columnCdf(recipe: ColumnRecipe, s: Sample, k: number, where: string, keepOrder: boolean): ColumnSort {
  const col = keepOrder || s.d !== 1 ? columnOf(s, k) : s.data.length === s.n ? s.data : s.data.subarray(0, s.n);
  recipe.check?.(col, where);
  if (keepOrder) {
    const sorted = sortWithOrder(col);
    let w: Float64Array | null = null;
    if (s.weights) {
      w = new Float64Array(col.length);
      for (let i = 0; i < w.length; i++) w[i] = s.weights[sorted.order[i]];
    }
    return { cdf: weightedCdfSorted(sorted.sorted, w, true), raw: col, sorted };
  }
  // The sorted copies are ours alone and never written, so the merged CDF may share them.
  if (s.weights === null) return { cdf: weightedCdfSorted(sortedCopy(col), null, true), raw: col, sorted: null };
  const sw = sortWithWeights(col, s.weights);
  return { cdf: weightedCdfSorted(sw.values, sw.weights, true), raw: col, sorted: null };
}

/** Maps the sorted source rows by one merge walk, writing each result straight to its row. O(n). */
function mapFittedSource(c: ColumnMap, raw: Float64Array, s: SortedWithOrder, t: Tails): FittedSource {
  const mapped = new Float64Array(raw.length);
  const outside = c.forward.evaluateAscending(s.sorted, mapped, t, null, s.order);
  return { values: raw, mapped, outside };
}

/**
 * The MethodSpec of a one-column method from its recipe: each column matched on
 * its own, row weights taken, at least 2 rows per sample, settings `tails`
 * (TAILS_SETTING) and the recipe's own. The three 1-D methods differ only in their recipes.
 */
export function oneColumnMethod(recipe: ColumnRecipe, summary: string): MethodSpec {
  return {
    name: recipe.method,
    summary,
    shape: 'one-column',
    settings: [TAILS_SETTING, ...(recipe.settings ?? [])],
    outside: outsideBothTails(recipe.method),
    minRows: () => 2,
    weights: true,
    fit: (source, target, settings, ctx) => fitOneColumnMap(recipe, source, target, settings, ctx),
    fromJSON: (json) => restoreOneColumnMap(recipe, json),
  };
}
