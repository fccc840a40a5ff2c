import { RemapError } from '../errors';
import { stepQuantile, type WeightedCdf } from '../stats/weighted-cdf';
import { compactToBudget, compactToTolerance } from './compact-knots';
import { AUTO_COMPACT_ABOVE, AUTO_TOLERANCE_IQR } from './quantile-settings';
import type { ColumnMap } from './column-map';
import { hazenGrid, sameHazenGrids } from './hazen-grid';
import { buildKnots } from './knots';
import { OneWayMap } from './one-way-map';
import { plain, readNumbers, readRecord, sameLength } from './params';

/**
 * The continuous quantile map of one column: T = G^-1 o F with F and G^-1 the
 * piecewise-linear curves through the Hazen positions of source and target
 * (see `hazenGrid`), stored as one pair of strictly increasing knot arrays
 * over the union of both position grids (see `buildKnots`). apply reads the
 * knots by x, invert by y: the same knots both ways, so invert(apply(x)) = x
 * to rounding inside the knot range. With equal sizes and weights the grids
 * coincide and the i-th smallest source value maps exactly to the i-th smallest
 * target value.
 * Ends: where one sample's end positions lie beyond the other's (unequal
 * sizes), the map holds its end value over the rest of the data range (the
 * flat ends of G^-1 o F); tails beyond the data range follow `OneWayMap`.
 * Compact maps: `knots` = 0 keeps every knot up to AUTO_COMPACT_ABOVE and
 * above that the fewest knots within AUTO_TOLERANCE_IQR x the target's
 * interquartile range (IQR; the range if the IQR is 0) of the full map, and
 * within the same share of the source's IQR inverting;
 * `knots` = K >= 4 keeps at most K (see compact-knots.ts). The column then
 * records how many it kept and the exact largest difference each way.
 * Cost: O(ks + kt), compacting to a count O((ks + kt) x 60).
 * @param src,tgt merged CDFs, each with at least two distinct values.
 * @param knots 0 (automatic) or the most knots to keep (>= 4).
 * @throws RemapError ('num') if a side has a single distinct value; RemapError for knots of 1 to 3.
 * @example quantileColumn(weightedCdf([1, 2, 3]), weightedCdf([10, 20, 40]), 'fit').forward.vals // [10, 20, 40]
 */
export function quantileColumn(src: WeightedCdf, tgt: WeightedCdf, where: string, knots = 0): ColumnMap {
  for (const [cdf, side] of [
    [src, 'source'],
    [tgt, 'target'],
  ] as const) {
    if (cdf.values.length < 2) {
      throw new RemapError(
        `${where}: every ${side} row with positive weight holds the same value (${cdf.values[0]}); a continuous map needs at least two different values on each side. Check the range, or use method linear.`,
        'num',
      );
    }
  }
  // Equal grids (equal sizes and weights): buildKnots would return the value arrays themselves.
  const { xs, ys } = sameHazenGrids(src, tgt) ? { xs: src.values, ys: tgt.values } : buildKnots(hazenGrid(src), hazenGrid(tgt), true);
  if (xs.length < 2) {
    throw new RemapError(
      `${where}: the source and target positions collapse to a single point (values too close together to tell apart); rescale the data.`,
      'num',
    );
  }
  if (knots > 0 && knots < 4)
    throw new RemapError(`${where}: the knots setting must be 0 (the automatic choice) or at least 4, not ${knots}; a map needs its two end segments.`);
  const sLo = src.values[0];
  const tLo0 = tgt.values[0];
  const tHi0 = tgt.values[tgt.values.length - 1];
  if (knots >= 4 ? xs.length > knots : knots === 0 && xs.length > AUTO_COMPACT_ABOVE) {
    const iqrT = spread(tgt);
    const iqrS = spread(src);
    const c = knots >= 4 ? compactToBudget(xs, ys, knots, iqrS / iqrT) : compactToTolerance(xs, ys, AUTO_TOLERANCE_IQR * iqrT, AUTO_TOLERANCE_IQR * iqrS);
    const info = { knots: c.xs.length, fullKnots: c.fullKnots, largestError: c.largestError, largestErrorInverse: c.largestErrorInverse };
    return { ...make(c.xs, c.ys, sLo, src.values[src.values.length - 1], tLo0, tHi0), compaction: info };
  }
  const sHi = src.values[src.values.length - 1];
  const tLo = tgt.values[0];
  const tHi = tgt.values[tgt.values.length - 1];
  return make(xs, ys, sLo, sHi, tLo, tHi);
}

/** The interquartile range of a sample (its range when that is 0). */
function spread(cdf: WeightedCdf): number {
  const iqr = stepQuantile(cdf, 0.75) - stepQuantile(cdf, 0.25);
  return iqr > 0 ? iqr : cdf.values[cdf.values.length - 1] - cdf.values[0];
}

function make(xs: Float64Array, ys: Float64Array, sLo: number, sHi: number, tLo: number, tHi: number): ColumnMap {
  return {
    forward: new OneWayMap(xs, ys, 'linear', sLo, sHi),
    inverse: new OneWayMap(ys, xs, 'linear', tLo, tHi),
    params: () => ({ xs: plain(xs), ys: plain(ys), source: [sLo, sHi], target: [tLo, tHi] }),
  };
}

/**
 * Rebuilds a column saved by `quantileColumn(...).params`, bit-identically.
 * Cost: O(k).
 * @throws RemapError if the saved numbers are missing, not finite or out of order.
 */
export function quantileColumnFromParams(raw: unknown, where: string): ColumnMap {
  const rec = readRecord(raw, where);
  const xs = readNumbers(rec, 'xs', where, 'strict', 2);
  const ys = readNumbers(rec, 'ys', where, 'strict', 2);
  sameLength(xs, ys, 'xs and ys', where);
  const s = readNumbers(rec, 'source', where, 'rising', 2);
  const t = readNumbers(rec, 'target', where, 'rising', 2);
  if (s.length !== 2 || t.length !== 2 || s[0] > xs[0] || s[1] < xs[xs.length - 1] || t[0] > ys[0] || t[1] < ys[ys.length - 1]) {
    throw new RemapError(`${where}: the saved source or target range does not cover the knots; the saved map is damaged. Fit the map again.`);
  }
  return make(xs, ys, s[0], s[1], t[0], t[1]);
}
