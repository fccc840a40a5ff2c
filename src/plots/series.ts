import { stepQuantile, weightedCdf } from '../engine/stats/weighted-cdf';

/**
 * The data a plot takes, and the small pieces of arithmetic every plot shares:
 * dropping non-finite values, sorting with weights, weighted quantiles.
 */

/** One named sample of numbers, with optional non-negative weights (one per value). */
export interface Series {
  readonly name: string;
  readonly values: ArrayLike<number>;
  readonly weights?: ArrayLike<number> | null;
}

/** A series cleaned for plotting: its distinct finite values with positive weight, ascending, with cumulative shares. */
export interface SortedSeries {
  readonly name: string;
  /** The distinct values, ascending (tied values merged, their weights added). */
  readonly sorted: Float64Array;
  /** cum[i] = share of total weight on values <= sorted[i]; cum[last] = 1. */
  readonly cum: Float64Array;
  /** The share of the total weight on each distinct value (sums to 1). */
  readonly share: Float64Array;
  /** Values plotted (finite, with positive weight), ties counted one by one. */
  readonly rows: number;
  /** Values left out: non-finite value or weight, or weight <= 0. */
  readonly skipped: number;
  /** The weighted empirical distribution itself, for quantiles. */
  readonly cdf: ReturnType<typeof weightedCdf> | null;
}

/**
 * Sorts a series with its weights into its empirical distribution (the
 * engine's weighted CDF), leaving out non-finite values and non-positive or
 * non-finite weights (counted in `skipped`). Never mutates the input.
 * Cost: O(n log n).
 * @throws Error when weights are given with a different length than values.
 * @example sortSeries({ name: 'a', values: [3, NaN, 1] }) // sorted [1, 3], cum [0.5, 1], skipped 1
 */
export function sortSeries(s: Series): SortedSeries {
  const n = s.values.length;
  const w = s.weights ?? null;
  if (w && w.length !== n) throw new Error(`plot: series "${s.name}" has ${n} values but ${w.length} weights; give one weight per value.`);
  const keptValues: number[] = [];
  const keptWeights: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = s.values[i];
    if (!Number.isFinite(v)) continue;
    if (w && !(Number.isFinite(w[i]) && w[i] > 0)) continue;
    keptValues.push(v);
    if (w) keptWeights.push(w[i]);
  }
  const rows = keptValues.length;
  if (rows === 0) return { name: s.name, sorted: new Float64Array(0), cum: new Float64Array(0), share: new Float64Array(0), rows, skipped: n, cdf: null };
  const cdf = weightedCdf(keptValues, w ? keptWeights : null);
  const k = cdf.values.length;
  const cum = new Float64Array(k);
  const share = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    cum[j] = cdf.cumulative[j] / cdf.total;
    share[j] = (cdf.cumulative[j] - (j > 0 ? cdf.cumulative[j - 1] : 0)) / cdf.total;
  }
  cum[k - 1] = 1;
  return { name: s.name, sorted: cdf.values, cum, share, rows, skipped: n - rows, cdf };
}

/**
 * The weighted quantile at probability p (0..1) of a sorted series: the
 * smallest value whose cumulative share reaches p (the inverse of the
 * empirical CDF, R type 1; Hyndman & Fan 1996), by the engine's stepQuantile.
 * NaN for an empty series. O(log n).
 * @example quantileOf(sortSeries({ name: 'a', values: [1, 2, 3, 4] }), 0.5) // 2
 */
export function quantileOf(s: SortedSeries, p: number): number {
  if (!s.cdf) return NaN;
  return stepQuantile(s.cdf, Math.min(1, Math.max(0, p)));
}

/** The smallest and largest finite value over several sorted series ([NaN, NaN] if all are empty). O(#series). */
export function extentOf(series: readonly SortedSeries[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    if (s.sorted.length === 0) continue;
    lo = Math.min(lo, s.sorted[0]);
    hi = Math.max(hi, s.sorted[s.sorted.length - 1]);
  }
  return lo <= hi ? [lo, hi] : [NaN, NaN];
}
