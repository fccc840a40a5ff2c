import { RemapError } from '../errors';

/**
 * One column sorted ascending. Unweighted: every value, each of mass 1/n (w null).
 * Weighted: the distinct values, each with its total weight scaled so all sum to one.
 */
export interface SortedWeighted {
  readonly x: Float64Array;
  readonly w: Float64Array | null;
}

/**
 * Copies a column, checks it, and sorts it ascending, carrying weights along
 * (scaled to sum to one; with weights, equal values are merged into one entry
 * holding their total weight). Shared by `ksStatistic` and the one-column case of
 * `energyDistance`. Cost: O(n log n): a native typed-array sort, plus n binary searches when weighted.
 * Never mutates its inputs.
 * @param values the column, n >= 1 finite numbers.
 * @param weights optional, one per value, finite and >= 0, not all zero.
 * @param name what messages call the column ("a", "b").
 * @param fn the calling function, for messages.
 * @throws RemapError for an empty column, a non-finite value, a wrong weight count, a negative or non-finite weight, or all-zero weights.
 * @example sortedWithWeights([3, 1, 2], [1, 1, 2], 'a', 'f') // { x: [1, 2, 3], w: [0.25, 0.5, 0.25] }
 */
export function sortedWithWeights(values: ArrayLike<number>, weights: ArrayLike<number> | null | undefined, name: string, fn: string): SortedWeighted {
  const n = values.length;
  if (n < 1) throw new RemapError(`${fn}: ${name} is empty; give at least one number.`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i])) throw new RemapError(`${fn}: ${name} holds ${values[i]} at position ${i + 1}; give finite numbers only.`);
  }
  if (weights == null) {
    const x = Float64Array.from(values);
    x.sort();
    return { x, w: null };
  }
  if (weights.length !== n) throw new RemapError(`${fn}: ${weights.length} weights for the ${n} values of ${name}; give one weight per value.`);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const w = weights[i];
    if (!(w >= 0) || !Number.isFinite(w)) throw new RemapError(`${fn}: weight ${i + 1} of ${name} is ${w}; weights must be finite and zero or positive.`);
    total += w;
  }
  if (!(total > 0) || !Number.isFinite(total)) throw new RemapError(`${fn}: the weights of ${name} add up to ${total}; give at least one positive weight (and rescale huge ones).`);
  // Ties merged: sort the values natively, keep the distinct ones, then add each
  // weight to its value found by binary search (much faster than a comparator sort).
  const sorted = Float64Array.from(values);
  sorted.sort();
  let u = 0;
  for (let r = 0; r < n; r++) if (r === 0 || sorted[r] !== sorted[u - 1]) sorted[u++] = sorted[r];
  const x = sorted.slice(0, u);
  const w = new Float64Array(u);
  for (let i = 0; i < n; i++) {
    const v = values[i];
    let lo = 0;
    let hi = u - 1;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (x[mid] < v) lo = mid + 1;
      else hi = mid;
    }
    w[lo] += weights[i] / total;
  }
  return { x, w };
}

/**
 * Walks the two empirical distribution functions F (of `a`) and G (of `b`)
 * over the merged sorted values and reports sup |F - G| and the integral of
 * (F - G)^2. Both are exact for step functions. Cost: O(n + m).
 * Never mutates its inputs.
 * @param a, b columns from `sortedWithWeights`.
 * @example ecdfGap(sortedWithWeights([0], null, 'a', 'f'), sortedWithWeights([1], null, 'b', 'f')) // { sup: 1, squaredIntegral: 1 }
 */
export function ecdfGap(a: SortedWeighted, b: SortedWeighted): { sup: number; squaredIntegral: number } {
  const xa = a.x;
  const xb = b.x;
  const n = xa.length;
  const m = xb.length;
  let i = 0;
  let j = 0;
  let ca = 0;
  let cb = 0;
  let sup = 0;
  let area = 0;
  // Each pass consumes at least one value, so the loop ends after at most n + m passes.
  while (i < n || j < m) {
    const t = j >= m || (i < n && xa[i] <= xb[j]) ? xa[i] : xb[j];
    if (a.w) while (i < n && xa[i] === t) ca += a.w[i++];
    else while (i < n && xa[i] === t) i++;
    if (b.w) while (j < m && xb[j] === t) cb += b.w[j++];
    else while (j < m && xb[j] === t) j++;
    const f = a.w ? ca : i / n;
    const g = b.w ? cb : j / m;
    const gap = f - g;
    if (Math.abs(gap) > sup) sup = Math.abs(gap);
    if (i < n || j < m) {
      const next = j >= m || (i < n && xa[i] <= xb[j]) ? xa[i] : xb[j];
      area += gap * gap * (next - t);
    }
  }
  return { sup: Math.min(1, sup), squaredIntegral: area };
}

/**
 * Two-sample Kolmogorov-Smirnov statistic sup_t |F_a(t) - G_b(t)| between the
 * (weighted) empirical distribution functions of two columns: F_a(t) is the
 * share of a's weight on values <= t. Ties, within or across the columns, are
 * handled exactly (the functions jump together). No p-value: the statistic
 * compares a mapped sample with its target (0 = identical distributions, 1 =
 * disjoint ranges).
 * Cost: O((n + m) log(n + m)) for the sorts, then one merged walk.
 * Never mutates its inputs.
 *
 * @param a first column, n >= 1 finite numbers.
 * @param b second column, m >= 1 finite numbers.
 * @param wa optional weights of a (finite, >= 0, not all zero); omitted = equal.
 * @param wb optional weights of b, likewise.
 * @returns a number in [0, 1].
 * @throws RemapError for an empty column, non-finite values, or bad weights.
 * @example ksStatistic([1, 2, 3, 4], [3, 4, 5, 6]) // 0.5
 */
export function ksStatistic(a: ArrayLike<number>, b: ArrayLike<number>, wa?: ArrayLike<number> | null, wb?: ArrayLike<number> | null): number {
  const fn = 'ksStatistic';
  return ecdfGap(sortedWithWeights(a, wa, 'a', fn), sortedWithWeights(b, wb, 'b', fn)).sup;
}
