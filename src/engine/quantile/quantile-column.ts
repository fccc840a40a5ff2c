import { RemapError } from '../errors';
import type { WeightedCdf } from '../stats/weighted-cdf';
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
 * Cost: O(ks + kt).
 * @param src,tgt merged CDFs, each with at least two distinct values.
 * @throws RemapError ('num') if a side has a single distinct value.
 * @example quantileColumn(weightedCdf([1, 2, 3]), weightedCdf([10, 20, 40]), 'fit').forward.vals // [10, 20, 40]
 */
export function quantileColumn(src: WeightedCdf, tgt: WeightedCdf, where: string): ColumnMap {
  for (const [cdf, side] of [[src, 'source'], [tgt, 'target']] as const) {
    if (cdf.values.length < 2) {
      throw new RemapError(`${where}: every ${side} row with positive weight holds the same value (${cdf.values[0]}); a continuous map needs at least two different values on each side. Check the range, or use method linear.`, 'num');
    }
  }
  // Equal grids (equal sizes and weights): buildKnots would return the value arrays themselves.
  const { xs, ys } = sameHazenGrids(src, tgt) ? { xs: src.values, ys: tgt.values } : buildKnots(hazenGrid(src), hazenGrid(tgt), true);
  if (xs.length < 2) {
    throw new RemapError(`${where}: the source and target positions collapse to a single point (values too close together to tell apart); rescale the data.`, 'num');
  }
  const sLo = src.values[0];
  const sHi = src.values[src.values.length - 1];
  const tLo = tgt.values[0];
  const tHi = tgt.values[tgt.values.length - 1];
  return make(xs, ys, sLo, sHi, tLo, tHi);
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
