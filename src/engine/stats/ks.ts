import { RemapError } from '../errors';
import { weightedCdf, type WeightedCdf } from './weighted-cdf';

/**
 * Checks a column and its weights, then builds its merged empirical CDF with
 * the shared `weightedCdf` (weighted-cdf.ts: sorted distinct values and their
 * cumulative weights). Shared by `ksStatistic` and the one-column case of
 * `energyDistance`, whose messages name the column. Cost: O(n log n).
 * Never mutates its inputs.
 * @param values the column, n >= 1 finite numbers.
 * @param weights optional, one per value, finite and >= 0, not all zero.
 * @param name what messages call the column ("a", "b").
 * @param fn the calling function, for messages.
 * @throws RemapError for an empty column, a non-finite value, a wrong weight count, a negative or non-finite weight, or all-zero weights.
 * @example checkedCdf([3, 1, 2], [1, 1, 2], 'a', 'f') // values [1, 2, 3], cumulative [1, 3, 4], total 4
 */
export function checkedCdf(values: ArrayLike<number>, weights: ArrayLike<number> | null | undefined, name: string, fn: string): WeightedCdf {
  const n = values.length;
  if (n < 1) throw new RemapError(`${fn}: ${name} is empty; give at least one number.`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i])) throw new RemapError(`${fn}: ${name} holds ${values[i]} at position ${i + 1}; give finite numbers only.`);
  }
  if (weights == null) return weightedCdf(values, null);
  if (weights.length !== n) throw new RemapError(`${fn}: ${weights.length} weights for the ${n} values of ${name}; give one weight per value.`);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const w = weights[i];
    if (!(w >= 0) || !Number.isFinite(w)) throw new RemapError(`${fn}: weight ${i + 1} of ${name} is ${w}; weights must be finite and zero or positive.`);
    total += w;
  }
  if (!(total > 0) || !Number.isFinite(total))
    throw new RemapError(`${fn}: the weights of ${name} add up to ${total}; give at least one positive weight (and rescale huge ones).`);
  return weightedCdf(values, weights);
}

/**
 * Walks the two empirical distribution functions F (of `a`) and G (of `b`)
 * over the merged sorted values and reports sup |F - G| and the integral of
 * (F - G)^2. Both are exact for step functions. Cost: O(n + m).
 * Never mutates its inputs.
 * @param a, b merged CDFs (`checkedCdf`, `weightedCdf`).
 * @example ecdfGap(checkedCdf([0], null, 'a', 'f'), checkedCdf([1], null, 'b', 'f')) // { sup: 1, squaredIntegral: 1 }
 */
export function ecdfGap(a: WeightedCdf, b: WeightedCdf): { sup: number; squaredIntegral: number } {
  const xa = a.values;
  const xb = b.values;
  const n = xa.length;
  const m = xb.length;
  const abs = Math.abs;
  let i = 0;
  let j = 0;
  let sup = 0;
  let area = 0;
  // Each pass consumes at least one distinct value, so the loop ends after at most n + m passes.
  while (i < n || j < m) {
    const t = j >= m || (i < n && xa[i] <= xb[j]) ? xa[i] : xb[j];
    if (i < n && xa[i] === t) i++;
    if (j < m && xb[j] === t) j++;
    const f = i > 0 ? a.cumulative[i - 1] / a.total : 0;
    const g = j > 0 ? b.cumulative[j - 1] / b.total : 0;
    const gap = f - g;
    if (abs(gap) > sup) sup = abs(gap);
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
  return ecdfGap(checkedCdf(a, wa, 'a', fn), checkedCdf(b, wb, 'b', fn)).sup;
}
