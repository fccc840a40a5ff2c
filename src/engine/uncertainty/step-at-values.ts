import { RemapError } from '../errors';
import type { Tails } from '../quantile/one-way-map';
import { SHARE_TOLERANCE } from '../quantile/step-table';
import { CumulativeWeights } from './cumulative-shares';
import { knotUnits } from './knot-units';

/**
 * The step method's map under other weights, read only at a fixed set of
 * values: what `stepColumn` and `OneWayMap.evaluateAscending` give for the
 * refitted map, without building its table. Source and target are held as
 * cumulative weights over their distinct values (see cumulative-shares.ts).
 * The step map at x is G^-1(F(x)): F(x) the source share of the largest
 * weighted source value at or below x, G^-1(p) the smallest weighted target
 * value whose cumulative share reaches p (less SHARE_TOLERANCE), found by
 * binary search where `stepTable` walks; tails as `OneWayMap` ('linear'
 * continues the chord through the two end entries). The same comparisons and
 * divisions as the refit, so the same numbers, bit for bit.
 * Cost per call: O(v log K_t) for v values, plus the values without weight stepped over; no allocation.
 * @example new StepAtValues(sx, ty, xs, order).map(cs, ct, 'clamp', out) // out = T(xs) put back in order
 */
export class StepAtValues {
  private readonly sx: Float64Array;
  private readonly ty: Float64Array;
  private readonly xs: Float64Array;
  private readonly order: Uint32Array;
  /** unit[r] = largest k with sx[k] <= xs[r] (-1 if none). */
  private readonly unit: Int32Array;
  private readonly S = new CumulativeWeights();
  private readonly T = new CumulativeWeights();

  /**
   * @param sx,ty the distinct source and target values, ascending.
   * @param xs the values to map, ascending; `order[r]` is where the result for xs[r] goes.
   */
  constructor(sx: Float64Array, ty: Float64Array, xs: Float64Array, order: Uint32Array) {
    this.sx = sx;
    this.ty = ty;
    this.xs = xs;
    this.order = order;
    this.unit = knotUnits(sx, xs);
  }

  /**
   * Maps the values under the step map fitted with cumulative weights `cs`
   * (source) and `ct` (target), writing out[order[r]].
   * @throws RemapError (as the refit would) when a side has no weight or a single weighted value.
   */
  map(cs: Float64Array, ct: Float64Array, tails: Tails, out: Float64Array): void {
    const { sx, ty, xs, order, unit, S, T } = this;
    S.reset(cs);
    T.reset(ct);
    const W = S.total;
    const M = T.total;
    if (!(W > 0) || !(M > 0)) throw new RemapError('bounds: a replicate gives no row a positive weight.');
    const fs = S.after(-1);
    const ls = S.atOrBefore(cs.length - 1);
    const ft = T.after(-1);
    const lt = T.atOrBefore(ct.length - 1);
    for (const [a, b, v, side] of [
      [fs, ls, sx, 'source'],
      [ft, lt, ty, 'target'],
    ] as const) {
      if (a === b) {
        throw new RemapError(
          `bounds: every ${side} row with positive weight holds the same value (${v[a]}); the step map needs at least two different values on each side. Check the range.`,
          'num',
        );
      }
    }
    /** The table entry of weighted source value k: stepTable's walk, as a binary search. */
    const entry = (k: number): number => {
      const limit = cs[k] / W - SHARE_TOLERANCE;
      let lo = 0;
      let hi = ct.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (ct[mid] / M < limit) lo = mid + 1;
        else hi = mid;
      }
      // lo: the first value reaching the share. It carries weight unless it is value 0 without any (then the first weighted one follows).
      const j = T.after(lo - 1);
      return ty[j < 0 ? lt : j];
    };
    const lo = sx[fs];
    const hi = sx[ls];
    const y0 = entry(fs);
    const yL = entry(ls);
    const linear = tails === 'linear';
    let slopeLo = 0;
    let slopeHi = 0;
    if (linear) {
      const s1 = S.after(fs);
      slopeLo = (entry(s1) - y0) / (sx[s1] - lo);
      const sP = S.atOrBefore(ls - 1);
      slopeHi = (yL - entry(sP)) / (hi - sx[sP]);
    }
    for (let r = 0; r < xs.length; r++) {
      const x = xs[r];
      const o = order[r];
      if (!(x >= lo && x <= hi)) {
        if (x !== x) out[o] = NaN;
        else if (x < lo) out[o] = linear ? y0 + slopeLo * (x - lo) : y0;
        else out[o] = linear ? yL + slopeHi * (x - hi) : yL;
        continue;
      }
      out[o] = x >= hi ? yL : entry(S.atOrBefore(unit[r]));
    }
  }
}
