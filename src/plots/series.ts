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

/** A series cleaned for plotting: finite values with positive weight, sorted, with cumulative shares. */
export interface SortedSeries {
  readonly name: string;
  readonly sorted: Float64Array;
  /** cum[i] = share of total weight in sorted[0..i]; cum[n-1] = 1. */
  readonly cum: Float64Array;
  /** The weight of each sorted value, normalised to sum 1. */
  readonly share: Float64Array;
  /** Values left out: non-finite value or weight, or weight <= 0. */
  readonly skipped: number;
}

/**
 * Sorts a series with its weights, leaving out non-finite values and
 * non-positive or non-finite weights (counted in `skipped`). Never mutates the input.
 * Cost: O(n log n).
 * @throws Error when weights are given with a different length than values.
 * @example sortSeries({ name: 'a', values: [3, NaN, 1] }) // sorted [1, 3], cum [0.5, 1], skipped 1
 */
export function sortSeries(s: Series): SortedSeries {
  const n = s.values.length;
  const w = s.weights ?? null;
  if (w && w.length !== n) throw new Error(`plot: series "${s.name}" has ${n} values but ${w.length} weights; give one weight per value.`);
  const idx: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = s.values[i];
    if (!Number.isFinite(v)) continue;
    if (w && !(Number.isFinite(w[i]) && w[i] > 0)) continue;
    idx.push(i);
  }
  idx.sort((a, b) => s.values[a] - s.values[b] || a - b);
  const m = idx.length;
  const sorted = new Float64Array(m);
  const share = new Float64Array(m);
  let total = 0;
  for (let j = 0; j < m; j++) {
    sorted[j] = s.values[idx[j]];
    share[j] = w ? w[idx[j]] : 1;
    total += share[j];
  }
  const cum = new Float64Array(m);
  let run = 0;
  for (let j = 0; j < m; j++) {
    share[j] /= total;
    run += share[j];
    cum[j] = run;
  }
  if (m > 0) cum[m - 1] = 1;
  return { name: s.name, sorted, cum, share, skipped: n - m };
}

/**
 * The weighted quantile at probability p (0..1) of a sorted series: the
 * smallest value whose cumulative share reaches p (the inverse of the
 * empirical CDF, R type 1; Hyndman & Fan 1996). NaN for an empty series.
 * O(log n).
 * @example quantileOf(sortSeries({ name: 'a', values: [1, 2, 3, 4] }), 0.5) // 2
 */
export function quantileOf(s: SortedSeries, p: number): number {
  const n = s.sorted.length;
  if (n === 0) return NaN;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (s.cum[mid] >= p - 1e-12) hi = mid;
    else lo = mid + 1;
  }
  return s.sorted[lo];
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
