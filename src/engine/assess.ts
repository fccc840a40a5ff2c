import { RemapError } from './errors';
import type { ComparisonRows, TransportMap } from './map';
import type { Points, Sample } from './points';
import { energyDistance } from './stats/energy-distance';
import { ksStatistic } from './stats/ks';
import { columnOf } from './points';
import { checkFinite, checkSameColumns } from './validate';

/** Rows per side used for the energy distances when d > 1 (seeded subsample above this). */
export const COMPARISON_MAX_ROWS = 1000;
/** Seed of that subsample. */
export const COMPARISON_SEED = 0;

/** How close the mapped source came to the target, and on which rows that was measured. */
export interface Comparisons {
  readonly energyBefore: number;
  readonly energyAfter: number;
  readonly ksMaxAfter: number;
  readonly comparison: ComparisonRows;
}

/**
 * Energy distance source vs target and mapped source vs target, and the
 * largest per-column Kolmogorov-Smirnov statistic of mapped source vs target,
 * all with the samples' weights. For d > 1 the energy distances use a seeded
 * subsample of at most COMPARISON_MAX_ROWS rows per side (the same rows before
 * and after, since the seed is fixed), so their cost does not grow with n; the
 * result's `comparison` says how many rows each figure used and on what basis.
 * Cost: O(d (n + m) log(n + m)) for KS, plus O(min(n, 1000)^2 d) for energy (O((n + m) log(n + m)) when d = 1).
 * @param basis 'fitting rows' when source and target are the map's own fitting samples, 'rows given' otherwise.
 * @example compareFit(source, sourceWeights, mapped, target, targetWeights) // { energyBefore: 1.9, energyAfter: 0.01, ksMaxAfter: 0.03, comparison: {...} }
 */
export function compareFit(
  source: Points,
  sourceWeights: Float64Array | null,
  mapped: Points,
  target: Points,
  targetWeights: Float64Array | null,
  basis: ComparisonRows['basis'] = 'fitting rows',
): Comparisons {
  const options = { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED };
  const before = energyDistance(source, target, sourceWeights, targetWeights, options);
  const energyAfter = energyDistance(mapped, target, sourceWeights, targetWeights, options).value;
  let ksMaxAfter = 0;
  for (let k = 0; k < mapped.d; k++) {
    ksMaxAfter = Math.max(ksMaxAfter, ksStatistic(columnOf(mapped, k), columnOf(target, k), sourceWeights, targetWeights));
  }
  const ks = { source: source.n, target: target.n };
  const energy = { source: before.rows.a, target: before.rows.b };
  return { energyBefore: before.value, energyAfter, ksMaxAfter, comparison: comparisonRows(basis, ks, energy, before.subsampled ? COMPARISON_SEED : null) };
}

/**
 * Which rows a comparison used, with the note in words. O(1).
 * @example comparisonRows('fitting rows', { source: 1500, target: 1500 }, { source: 1000, target: 1000 }, 0).note
 *   // 'Measured on this map's own fitting rows (1500 source, 1500 target); ...'
 */
export function comparisonRows(
  basis: ComparisonRows['basis'],
  ks: { readonly source: number; readonly target: number },
  energy: { readonly source: number; readonly target: number },
  seed: number | null,
): ComparisonRows {
  const where =
    basis === 'fitting rows'
      ? `Measured on this map's own fitting rows (${ks.source} source, ${ks.target} target): maps fitted on different rows are not comparable on these figures`
      : `Measured on the rows given (${ks.source} source, ${ks.target} target), the same rows for every map compared on them`;
  const sub =
    seed === null
      ? 'the energy distances use every row'
      : `the energy distances use a seeded random subsample of ${energy.source} source and ${energy.target} target rows (seed ${seed}), the same rows before and after mapping`;
  return { basis, ks, energy, seed, note: `${where}; ${sub}.` };
}

/**
 * Compares a fitted map on rows the caller chooses: energy distance from
 * `source` to `target` before and after mapping `source` with `map`, and the
 * largest per-column KS statistic after, with each sample's weights. Several
 * maps compared on the same `source` and `target` give figures that can be put
 * side by side (each map's own diagnostics are measured on its own fitting
 * rows, which may differ between maps).
 * Cost: one `map.apply` on source plus compareFit's cost.
 * @param map a fitted map with `map.d` columns.
 * @param source rows to map (finite; weights optional, >= 0).
 * @param target rows to compare with (same columns; weights optional).
 * @throws RemapError for different column counts, non-finite values, or a map
 *   that cannot map these rows (pairs maps only their own fitting rows).
 * @example compareOn(linearMap, sample(rows), sample(targetRows)).comparison.basis // 'rows given'
 */
export function compareOn(map: TransportMap, source: Sample, target: Sample): Comparisons {
  const fn = 'compareOn';
  checkSameColumns(source, target, fn);
  if (source.d !== map.d)
    throw new RemapError(`${fn}: the rows have ${source.d} columns but the ${map.method} map takes ${map.d}; give rows with the map's columns.`);
  if (source.n < 1 || target.n < 1)
    throw new RemapError(`${fn}: the source has ${source.n} rows and the target ${target.n}; give at least one row on each side.`);
  checkFinite(source, 'source', fn);
  checkFinite(target, 'target', fn);
  let mapped: Points;
  try {
    mapped = map.apply(source);
  } catch (e) {
    if (e instanceof RemapError)
      throw new RemapError(`${fn}: the ${map.method} map cannot map these rows (${e.message}); compare it on its own fitting rows instead.`, e.kind);
    throw e;
  }
  return compareFit(source, source.weights, mapped, target, target.weights, 'rows given');
}
