import { RemapError } from '../errors';
import type { WeightedCdf } from '../stats/weighted-cdf';
import type { ColumnMap } from './column-map';
import { OneWayMap } from './one-way-map';
import { plain, readNumbers, readRecord, sameLength } from './params';
import { stepTable } from './step-table';

/**
 * The step map of one column: T(x) = G^-1(F(x)) with F the source's empirical
 * CDF (share of weight <= x) and G^-1(p) = inf{y : G(y) >= p} the target's step
 * quantile function; every result is a target sample value. The inverse is
 * F^-1(G(y)), every result a source value. Between source values T holds the
 * value of the largest source value below (F is a right-continuous step).
 * Tails beyond the data range follow `OneWayMap` ('linear' continues the chord
 * through the two end entries).
 * Cost: O(ks + kt).
 * @param src,tgt merged CDFs, each with at least two distinct values.
 * @throws RemapError ('num') if a side has a single distinct value.
 * @example stepColumn(weightedCdf([1, 2, 3]), weightedCdf([10, 20, 40]), 'fit').forward.vals // [10, 20, 40]
 */
export function stepColumn(src: WeightedCdf, tgt: WeightedCdf, where: string): ColumnMap {
  for (const [cdf, side] of [
    [src, 'source'],
    [tgt, 'target'],
  ] as const) {
    if (cdf.values.length < 2) {
      throw new RemapError(
        `${where}: every ${side} row with positive weight holds the same value (${cdf.values[0]}); the step map needs at least two different values on each side. Check the range.`,
        'num',
      );
    }
  }
  return make(src.values.slice(), stepTable(src, tgt), tgt.values.slice(), stepTable(tgt, src));
}

function make(sv: Float64Array, toTarget: Float64Array, tv: Float64Array, toSource: Float64Array): ColumnMap {
  return {
    forward: new OneWayMap(sv, toTarget, 'step', sv[0], sv[sv.length - 1]),
    inverse: new OneWayMap(tv, toSource, 'step', tv[0], tv[tv.length - 1]),
    params: () => ({ source: plain(sv), toTarget: plain(toTarget), target: plain(tv), toSource: plain(toSource) }),
  };
}

/**
 * Rebuilds a column saved by `stepColumn(...).params`, bit-identically. Cost: O(k).
 * @throws RemapError if the saved numbers are missing, not finite or out of order.
 */
export function stepColumnFromParams(raw: unknown, where: string): ColumnMap {
  const rec = readRecord(raw, where);
  const sv = readNumbers(rec, 'source', where, 'strict', 2);
  const toTarget = readNumbers(rec, 'toTarget', where, 'rising', 2);
  const tv = readNumbers(rec, 'target', where, 'strict', 2);
  const toSource = readNumbers(rec, 'toSource', where, 'rising', 2);
  sameLength(sv, toTarget, 'source and toTarget', where);
  sameLength(tv, toSource, 'target and toSource', where);
  return make(sv, toTarget, tv, toSource);
}
