import type { Tails } from '../quantile/one-way-map';
import { SHARE_TOLERANCE } from '../quantile/step-table';
import { AtValues } from './at-values';

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
export class StepAtValues extends AtValues {
  /**
   * Maps the values under the step map fitted with cumulative weights `cs`
   * (source) and `ct` (target), writing out[order[r]].
   * @throws RemapError (as the refit would) when a side has no weight or a single weighted value.
   */
  map(cs: Float64Array, ct: Float64Array, tails: Tails, out: Float64Array): void {
    this.start(cs, ct, 'the step map needs at least two different values on each side. Check the range.');
    const { sx, ty, xs, order, unit, S, T, fs, ls, lt } = this;
    const W = S.total;
    const M = T.total;
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
