import { RemapError } from '../errors';

/**
 * Compact 1-D maps: a few of a piecewise-linear map's knots, chosen so that
 * the map through them stays within a bound of the full map.
 *
 * Both maps are straight between knots and the kept knots are full knots, so
 * their difference is straight between full knots: its largest size over the
 * whole fitted range is reached at a full knot and is found exactly by one
 * pass over them (`largestDifference`). The first and last segments are always
 * kept, so the end slopes (tails=linear) and end values (tails=clamp) are the
 * full map's own, and the difference stays the same beyond the fitted range.
 */

/**
 * The kept knot indices of a greedy walk with tolerances `eps` (vertical: the
 * mapped value) and `epsX` (horizontal: the inverse): from each kept knot i,
 * the next kept knot is the farthest j such that the chord from knot i to knot
 * j passes within eps vertically and epsX horizontally of every knot between
 * them (tracked as an interval of allowed slopes, so one pass). Always keeps
 * 0, 1, K-2, K-1.
 * Cost: O(K).
 * @param xs strictly increasing, ys strictly increasing (the quantile map's knots), same length K >= 2.
 * @param eps, epsX >= 0 (Infinity: no bound that way).
 * @example compactIndices(f64([0, 1, 2, 3, 4]), f64([0, 1, 2, 3, 4]), 0, 0) // [0, 1, 3, 4]
 */
export function compactIndices(xs: ArrayLike<number>, ys: ArrayLike<number>, eps: number, epsX = Infinity): Uint32Array {
  const K = xs.length;
  if (K <= 4) return Uint32Array.from({ length: K }, (_, i) => i);
  const keep = new Uint32Array(K);
  let m = 0;
  keep[m++] = 0;
  keep[m++] = 1;
  let i = 1;
  const end = K - 2;
  while (i < end) {
    let lo = -Infinity;
    let hi = Infinity;
    let j = i + 1;
    const xi = xs[i];
    const yi = ys[i];
    // Extend while the chord to j + 1 fits the knots i+1 .. j.
    for (; j < end; j++) {
      const dx = xs[j] - xi;
      const a = (ys[j] - eps - yi) / dx;
      const b = (ys[j] + eps - yi) / dx;
      if (a > lo) lo = a;
      if (b < hi) hi = b;
      // Horizontal: the chord reaches ys[j] within epsX of xs[j] (slopes are positive).
      const dy = ys[j] - yi;
      const c = dy / (dx + epsX);
      const e = dx - epsX > 0 ? dy / (dx - epsX) : Infinity;
      if (c > lo) lo = c;
      if (e < hi) hi = e;
      const s = (ys[j + 1] - yi) / (xs[j + 1] - xi);
      if (!(s >= lo && s <= hi)) break;
    }
    keep[m++] = j;
    i = j;
  }
  keep[m++] = K - 1;
  return keep.slice(0, m);
}

/**
 * The largest |full(x) - compact(x)| over all x, where compact is the map through
 * the knots `keep` (sorted, including both ends). Exact (see above). O(K).
 * @param keys,vals the full map's knots (keys strictly increasing).
 * @example largestDifference(f64([0, 1, 2]), f64([0, 2, 2]), Uint32Array.of(0, 2)) // 1
 */
export function largestDifference(keys: ArrayLike<number>, vals: ArrayLike<number>, keep: Uint32Array): number {
  let worst = 0;
  for (let s = 0; s + 1 < keep.length; s++) {
    const a = keep[s];
    const b = keep[s + 1];
    const x0 = keys[a];
    const y0 = vals[a];
    const dy = vals[b] - y0;
    const dx = keys[b] - x0;
    for (let k = a + 1; k < b; k++) {
      const e = Math.abs(y0 + dy * ((keys[k] - x0) / dx) - vals[k]);
      if (e > worst) worst = e;
    }
  }
  return worst;
}

/** A compacted knot table and what it cost. */
export interface Compacted {
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  readonly fullKnots: number;
  /** Largest difference from the full map, in target units (apply) and source units (invert). */
  readonly largestError: number;
  readonly largestErrorInverse: number;
}

/**
 * Keeps at most `budget` knots, with the smallest tolerance (found by bisection
 * over eps, 60 halvings at most) whose greedy walk fits in the budget; the
 * horizontal tolerance is eps x `ratioX` (e.g. source IQR / target IQR).
 * Cost: O(K log(range / precision)) (about 60 passes over the knots).
 * @param budget at least 4.
 * @throws RemapError for a budget below 4.
 * @example compactToBudget(xs, ys, 2000).xs.length // <= 2000
 */
export function compactToBudget(xs: Float64Array, ys: Float64Array, budget: number, ratioX = Infinity): Compacted {
  if (!(budget >= 4)) throw new RemapError(`compact knots: the knots setting must be at least 4 (or 0 for the automatic choice), not ${budget}.`);
  const K = xs.length;
  if (K <= budget)
    return compacted(
      xs,
      ys,
      Uint32Array.from({ length: K }, (_, i) => i),
    );
  let lo = 0;
  let hi = ys[K - 1] - ys[0];
  let best = compactIndices(xs, ys, hi, hi * ratioX);
  for (let it = 0; it < 60 && hi - lo > 1e-15 * Math.max(Math.abs(ys[0]), Math.abs(ys[K - 1]), hi); it++) {
    const mid = 0.5 * (lo + hi);
    const keep = compactIndices(xs, ys, mid, mid * ratioX);
    if (keep.length <= budget) {
      best = keep;
      hi = mid;
    } else lo = mid;
  }
  return compacted(xs, ys, best);
}

/**
 * Keeps the knots of one greedy walk with tolerances eps (mapped values) and
 * epsX (inverse): the map through them is within about those of the full map
 * everywhere (the exact figures are measured and returned). O(K).
 * @example compactToTolerance(xs, ys, 1e-3 * iqrT, 1e-3 * iqrS).largestError // <= 1e-3 * iqrT (to rounding)
 */
export function compactToTolerance(xs: Float64Array, ys: Float64Array, eps: number, epsX = Infinity): Compacted {
  return compacted(xs, ys, compactIndices(xs, ys, eps, epsX));
}

function compacted(xs: Float64Array, ys: Float64Array, keep: Uint32Array): Compacted {
  const cx = new Float64Array(keep.length);
  const cy = new Float64Array(keep.length);
  for (let k = 0; k < keep.length; k++) {
    cx[k] = xs[keep[k]];
    cy[k] = ys[keep[k]];
  }
  return {
    xs: cx,
    ys: cy,
    fullKnots: xs.length,
    largestError: largestDifference(xs, ys, keep),
    largestErrorInverse: largestDifference(ys, xs, keep),
  };
}
