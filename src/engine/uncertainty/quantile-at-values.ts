import type { Tails } from '../quantile/one-way-map';
import { AtValues } from './at-values';
import type { CumulativeWeights } from './cumulative-shares';

/**
 * The quantile method's map under other weights, read only at a fixed set of
 * values: what `quantileColumn` and `OneWayMap.evaluateAscending` give for the
 * refitted map, without building its knots. Source and target are held as
 * cumulative weights over their distinct values (see cumulative-shares.ts).
 *
 * The quantile map's knots sit at every Hazen position of either sample
 * within [pLo, pHi] (the positions both samples cover); the knot at share s
 * is (F^-1(s), G^-1(s)), each read exactly at that sample's own positions and
 * by linear interpolation between them (see `buildKnots`). The map at x is
 * read between the two knots around x. Here those few knots are found
 * directly: the source values around x bound the shares to look at, and the
 * target positions in between are found by binary search. Each knot and each
 * result is computed with the arithmetic of the knot builder and of
 * `OneWayMap`, so the results are the refitted map's own, bit for bit.
 * The builder drops a knot that rounding makes no larger than the one before
 * (values a few units in the last place apart); where that could happen,
 * `map` returns false and the caller refits the general way.
 * Cost per call: O(v (log K_t + steps)) for v values, plus the values without
 * weight stepped over (O(1) on average for bootstrap counts); no allocation.
 * @example new QuantileAtValues(sx, ty, xs, order).map(cs, ct, 'clamp', out) // true; out = T(xs) put back in order
 */
export class QuantileAtValues extends AtValues {
  // The cursor: a share s, the weighted source values i, iN around it (p(i) <= s < p(iN), -1 for none) and target values j, jN likewise.
  private s = 0;
  private i = 0;
  private iN = 0;
  private j = 0;
  private jN = 0;
  /** The knot at the cursor. */
  private kx = 0;
  private ky = 0;

  /**
   * Maps the values under the quantile map fitted with cumulative weights `cs`
   * (source) and `ct` (target), writing out[order[r]]. Returns false, having
   * written nothing reliable, when rounding could have merged knots.
   * @throws RemapError (as the refit would) when a side has no weight or a single weighted value.
   */
  map(cs: Float64Array, ct: Float64Array, tails: Tails, out: Float64Array): boolean {
    this.start(cs, ct, 'a continuous map needs at least two different values on each side. Check the range, or use method linear.');
    const { sx, xs, order, unit, S, T, fs, ls, ft, lt } = this;
    const pLo = Math.max(S.hazen(fs), T.hazen(ft));
    const pHi = Math.min(S.hazen(ls), T.hazen(lt));
    // The first two and the last two knots: the ends, and the slopes the linear tails continue.
    this.seek(pLo);
    const x0 = this.kx;
    const y0 = this.ky;
    this.forward();
    if (!(this.kx > x0 && this.ky > y0)) return false;
    const slopeLo = (this.ky - y0) / (this.kx - x0);
    this.seek(pHi);
    const xL = this.kx;
    const yL = this.ky;
    this.back();
    const xP = this.kx;
    const yP = this.ky;
    if (!(xL > xP && yL > yP)) return false;
    if (this.s > pLo) {
      this.back();
      if (!(xP > this.kx && yP > this.ky)) return false;
    }
    const slopeHi = (yL - yP) / (xL - xP);
    const lo = sx[fs];
    const hi = sx[ls];
    const linear = tails === 'linear';
    let jFrom = 0;
    for (let r = 0; r < xs.length; r++) {
      const x = xs[r];
      const o = order[r];
      if (!(x >= lo && x <= hi)) {
        if (x !== x) out[o] = NaN;
        else if (x < lo) out[o] = linear ? y0 + slopeLo * (x - lo) : y0;
        else out[o] = linear ? yL + slopeHi * (x - hi) : yL;
        continue;
      }
      if (x < x0) {
        out[o] = y0;
        continue;
      }
      if (x >= xL) {
        out[o] = yL;
        continue;
      }
      // The knot at or below x: start at the source value below x (or at pLo), step over target positions.
      const i = S.atOrBefore(unit[r]);
      const a = S.hazen(i);
      const s = a > pLo ? a : pLo;
      this.s = s;
      this.i = i;
      this.iN = S.after(i);
      // Values ascend, so the target value sought is at or after the last one found: gallop from there.
      const J = lastAtOrBelowFrom(T, jFrom, s);
      jFrom = J < 0 ? 0 : J;
      this.j = T.atOrBefore(J);
      this.jN = T.after(this.j);
      this.knot();
      let cx = this.kx;
      let cy = this.ky;
      if (s > pLo) {
        // The builder keeps this knot only if it rises above the one before.
        const { i: ci, iN: cn, j: cj, jN: cjn } = this;
        this.back();
        if (!(cx > this.kx && cy > this.ky)) return false;
        this.s = s;
        this.i = ci;
        this.iN = cn;
        this.j = cj;
        this.jN = cjn;
      }
      for (;;) {
        this.forward();
        if (!(this.kx > cx && this.ky > cy)) return false;
        if (this.kx > x) break;
        cx = this.kx;
        cy = this.ky;
      }
      // OneWayMap's formula between knots (cx, cy) and (kx, ky).
      const b = this.ky;
      const y = cy + (b - cy) * ((x - cx) / (this.kx - cx));
      out[o] = y > b ? b : y;
    }
    return true;
  }

  /** Places the cursor at share s (within [pLo, pHi]) and reads its knot. */
  private seek(s: number): void {
    const { S, T } = this;
    this.s = s;
    this.i = S.atOrBefore(S.lastHazenAtOrBelow(s));
    this.iN = S.after(this.i);
    this.j = T.atOrBefore(T.lastHazenAtOrBelow(s));
    this.jN = T.after(this.j);
    this.knot();
  }

  /** Moves the cursor to the next position of either sample and reads its knot. */
  private forward(): void {
    const { S, T } = this;
    const si = this.iN >= 0 ? S.hazen(this.iN) : Infinity;
    const sj = this.jN >= 0 ? T.hazen(this.jN) : Infinity;
    const s = si < sj ? si : sj;
    if (si === s) {
      this.i = this.iN;
      this.iN = S.after(this.iN);
    }
    if (sj === s) {
      this.j = this.jN;
      this.jN = T.after(this.jN);
    }
    this.s = s;
    this.knot();
  }

  /** Moves the cursor to the previous position of either sample (one exists above pLo) and reads its knot. */
  private back(): void {
    const { S, T, s } = this;
    const pi = S.hazen(this.i);
    const qj = T.hazen(this.j);
    const iP = pi < s ? this.i : S.atOrBefore(this.i - 1);
    const jP = qj < s ? this.j : T.atOrBefore(this.j - 1);
    const si = pi < s ? pi : iP >= 0 ? S.hazen(iP) : -Infinity;
    const sj = qj < s ? qj : jP >= 0 ? T.hazen(jP) : -Infinity;
    if (!(pi < s)) {
      this.iN = this.i;
      this.i = iP;
    }
    if (!(qj < s)) {
      this.jN = this.j;
      this.j = jP;
    }
    this.s = si > sj ? si : sj;
    this.knot();
  }

  /** The knot at the cursor: each coordinate exact at its sample's own position, else interpolated (buildKnots' `interpolate`). */
  private knot(): void {
    this.kx = at(this.S, this.sx, this.i, this.iN, this.s);
    this.ky = at(this.T, this.ty, this.j, this.jN, this.s);
  }
}

/** v[k] at share p(k) exactly, else the line to value kN, clamped to the segment (buildKnots' `interpolate`). */
function at(w: CumulativeWeights, v: Float64Array, k: number, kN: number, s: number): number {
  const p0 = w.hazen(k);
  const v0 = v[k];
  if (p0 === s) return v0;
  const v1 = v[kN];
  const r = v0 + (v1 - v0) * ((s - p0) / (w.hazen(kN) - p0));
  return r < v0 ? v0 : r > v1 ? v1 : r;
}

/** The largest k with hazen(k) <= s (or -1), searched from `from` on by galloping then bisection: O(log distance) when hazen(from) <= s. */
function lastAtOrBelowFrom(w: CumulativeWeights, from: number, s: number): number {
  const K = w.c.length;
  if (w.hazen(from) > s) return w.lastHazenAtOrBelow(s);
  let lo = from;
  let step = 1;
  let hi = from + 1;
  while (hi < K && w.hazen(hi) <= s) {
    lo = hi;
    step *= 2;
    hi = lo + step;
  }
  if (hi > K) hi = K;
  // hazen(lo) <= s; hazen(hi) > s or hi = K.
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (w.hazen(mid) <= s) lo = mid;
    else hi = mid;
  }
  return lo;
}
