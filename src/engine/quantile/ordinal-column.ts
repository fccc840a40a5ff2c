import type { WeightedCdf } from '../stats/weighted-cdf';
import type { ColumnMap } from './column-map';
import { buildKnots, type Knots } from './knots';
import { OneWayMap } from './one-way-map';
import { ordinalGrid } from './ordinal-grid';
import { plain, readNumbers, readRecord, sameLength } from './params';

/**
 * The equipercentile map of one column of whole-number scores (Kolen &
 * Brennan, "Test Equating, Scaling, and Linking", ch. 2): e(x) = G*^-1(F*(x)),
 * with F*, G* the continuised CDFs (each score spread evenly over
 * [k - 0.5, k + 0.5], see `ordinalGrid`). F*(x) is the percentile rank P(x)/100,
 *   P(x) = 100 [F(x* - 1) + (x - (x* - 0.5)) f(x*)],  x* the score nearest x;
 * and G*^-1(P/100) = (P/100 - G(y*_U - 1)) / g(y*_U) + y*_U - 0.5 with y*_U the
 * smallest score whose cumulative share is above P/100, which steps over scores
 * of zero frequency. The map is piecewise linear between the shares where
 * either CDF bends, so it is stored as knots; the inverse applies the same
 * rule the other way (its own knots), since a flat stretch one way is a jump
 * the other way.
 * Range: [lowest score - 0.5, highest score + 0.5] on each side; beyond it,
 * tails follow `OneWayMap`. apply and invert accept any number there (the
 * percentile-rank formula is defined between whole scores too).
 * Cost: O(ks + kt).
 * @param src,tgt merged CDFs of whole numbers (checked by the caller).
 * @example ordinalColumn(weightedCdf([0, 1]), weightedCdf([0, 2])) // maps score 0 to 0 and score 1 to 2
 */
export function ordinalColumn(src: WeightedCdf, tgt: WeightedCdf): ColumnMap {
  const gs = ordinalGrid(src);
  const gt = ordinalGrid(tgt);
  return make(buildKnots(gs, gt, false), buildKnots(gt, gs, false));
}

function make(fwd: Knots, inv: Knots): ColumnMap {
  const f = fwd.xs.length - 1;
  const i = inv.xs.length - 1;
  return {
    forward: new OneWayMap(fwd.xs, fwd.ys, 'linear', fwd.xs[0], fwd.xs[f]),
    inverse: new OneWayMap(inv.xs, inv.ys, 'linear', inv.xs[0], inv.xs[i]),
    params: () => ({ xs: plain(fwd.xs), ys: plain(fwd.ys), inverseYs: plain(inv.xs), inverseXs: plain(inv.ys) }),
  };
}

/**
 * Rebuilds a column saved by `ordinalColumn(...).params`, bit-identically. Cost: O(k).
 * @throws RemapError if the saved numbers are missing, not finite or out of order.
 */
export function ordinalColumnFromParams(raw: unknown, where: string): ColumnMap {
  const rec = readRecord(raw, where);
  const xs = readNumbers(rec, 'xs', where, 'rising', 2);
  const ys = readNumbers(rec, 'ys', where, 'rising', 2);
  const iy = readNumbers(rec, 'inverseYs', where, 'rising', 2);
  const ix = readNumbers(rec, 'inverseXs', where, 'rising', 2);
  sameLength(xs, ys, 'xs and ys', where);
  sameLength(iy, ix, 'inverseYs and inverseXs', where);
  return make({ xs, ys }, { xs: iy, ys: ix });
}
