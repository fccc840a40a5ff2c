import { RemapError } from '../errors';
import { sortedCopy, sortWithWeights } from './sort';

/**
 * The empirical distribution of a weighted 1-D sample, with tied values merged:
 * `values[k]` are the distinct values carrying positive weight, ascending;
 * `cumulative[k]` is the total weight of rows <= values[k] (so the last entry is
 * `total`). Rows of weight zero are left out. This one object gives the step
 * CDF F(x) = cumulative[k]/total and the step quantile function
 * F^-1(p) = inf{x : F(x) >= p}.
 */
export interface WeightedCdf {
  readonly values: Float64Array;
  readonly cumulative: Float64Array;
  readonly total: number;
  /** Rows with positive weight. */
  readonly rows: number;
  /** Rows (with positive weight) whose value some other such row shares. */
  readonly tiedRows: number;
}

/**
 * Builds the merged CDF from values already in ascending order, with optional
 * weights in the same order (null = every row weighs 1).
 * Cost: O(n).
 * @param sorted ascending finite numbers.
 * @param weights null, or one finite non-negative weight per value with a positive total.
 * @param share true to let `values` be `sorted` itself when no two rows tie
 *   and no weight is zero (the common case; it saves a copy of n values). The
 *   caller must then not write to `sorted` afterwards. `sorted` is never
 *   written either way. Default false: `values` is always a new array.
 * @throws RemapError if the values are not ascending, the lengths differ, or no weight is positive.
 * @example weightedCdfSorted(Float64Array.of(1, 1, 4), null) // values [1, 4], cumulative [2, 3], total 3
 */
export function weightedCdfSorted(sorted: Float64Array, weights: Float64Array | null, share = false): WeightedCdf {
  const n = sorted.length;
  if (weights && weights.length !== n) {
    throw new RemapError(`weightedCdfSorted: ${weights.length} weights for ${n} values; give one weight per value.`);
  }
  // While values is sorted itself, every row so far is its own distinct value (k === i), so
  // writing values[k] = sorted[i] changes nothing; the first tie or zero weight switches to a copy.
  let values = share ? sorted : new Float64Array(n);
  const cumulative = new Float64Array(n);
  let k = 0;
  let total = 0;
  let rows = 0;
  let tiedRows = 0;
  let blockRows = 0;
  let last = -Infinity;
  // Two copies of one loop, so the common unweighted case has no per-row branch on weights.
  if (weights === null) {
    for (let i = 0; i < n; i++) {
      const v = sorted[i];
      total += 1;
      if (v === last && k > 0) {
        if (values === sorted) values = prefixCopy(sorted, k);
        cumulative[k - 1] = total;
        blockRows++;
        continue;
      }
      if (v < last) throw unsorted(i, v);
      if (blockRows > 1) tiedRows += blockRows;
      values[k] = v;
      cumulative[k++] = total;
      blockRows = 1;
      last = v;
    }
    rows = n;
  } else {
    for (let i = 0; i < n; i++) {
      const w = weights[i];
      if (!(w > 0)) {
        if (values === sorted) values = prefixCopy(sorted, k);
        continue;
      }
      const v = sorted[i];
      total += w;
      rows++;
      if (v === last && k > 0) {
        if (values === sorted) values = prefixCopy(sorted, k);
        cumulative[k - 1] = total;
        blockRows++;
        continue;
      }
      if (v < last) throw unsorted(i, v);
      if (blockRows > 1) tiedRows += blockRows;
      values[k] = v;
      cumulative[k++] = total;
      blockRows = 1;
      last = v;
    }
  }
  if (blockRows > 1) tiedRows += blockRows;
  if (!(total > 0)) throw new RemapError('weightedCdfSorted: no value has a positive weight; give at least one positive weight.');
  return k === n ? { values, cumulative, total, rows, tiedRows } : { values: values.slice(0, k), cumulative: cumulative.slice(0, k), total, rows, tiedRows };
}

/** A new array of length sorted.length holding the first k entries of `sorted`. */
function prefixCopy(sorted: Float64Array, k: number): Float64Array {
  const out = new Float64Array(sorted.length);
  out.set(sorted.subarray(0, k));
  return out;
}

function unsorted(i: number, v: number): RemapError {
  return new RemapError(`weightedCdfSorted: value ${i + 1} (${v}) is smaller than the one before it; sort the values first.`);
}

/**
 * The merged CDF of any (unsorted) sample. Copies; never mutates its inputs.
 * Cost: O(n log n) (O(n) when the values are already ascending).
 * @param values finite numbers.
 * @param weights optional non-negative weights, one per value, with a positive total.
 * @throws RemapError as `weightedCdfSorted` and `sortWithWeights`.
 * @example weightedCdf([4, 1, 1], [1, 1, 2]) // values [1, 4], cumulative [3, 4], total 4
 */
export function weightedCdf(values: ArrayLike<number>, weights?: ArrayLike<number> | null): WeightedCdf {
  if (weights == null) return weightedCdfSorted(sortedCopy(values), null);
  const s = sortWithWeights(values, weights);
  return weightedCdfSorted(s.values, s.weights);
}

/**
 * F(x): the share of the weight on values <= x. Cost: O(log k).
 * @example cdfShare(weightedCdf([1, 2, 3, 4]), 2.5) // 0.5
 */
export function cdfShare(cdf: WeightedCdf, x: number): number {
  const k = upperIndex(cdf.values, x);
  return k < 0 ? 0 : cdf.cumulative[k] / cdf.total;
}

/**
 * The step quantile function F^-1(p) = inf{x : F(x) >= p}: the smallest value
 * whose cumulative share reaches p (p = 0 gives the smallest value).
 * Cost: O(log k).
 * @param p a share between 0 and 1.
 * @throws RemapError if p is outside [0, 1].
 * @example stepQuantile(weightedCdf([1, 2, 3, 4]), 0.5) // 2
 */
export function stepQuantile(cdf: WeightedCdf, p: number): number {
  if (!(p >= 0 && p <= 1)) throw new RemapError(`stepQuantile: p is ${p}; give a share between 0 and 1.`);
  const c = cdf.cumulative;
  const target = p * cdf.total;
  let lo = 0;
  let hi = c.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (c[mid] >= target) hi = mid;
    else lo = mid + 1;
  }
  return cdf.values[lo];
}

/** Largest k with a[k] <= x, or -1 if x < a[0]. a ascending. O(log n). */
export function upperIndex(a: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}
