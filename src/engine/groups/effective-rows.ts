/**
 * Kish's effective sample size of a weighted sample, (sum w)^2 / sum w^2
 * (Kish, "Survey Sampling", Wiley 1965, section 11.7): the number of equally
 * weighted rows that would give an estimate of a mean the same variance. With
 * no weights (null) it is the row count; rows of weight zero add nothing.
 * Cost: O(n).
 * @param n rows.
 * @param weights null, or n non-negative finite weights.
 * @example kishRows(4, Float64Array.of(1, 1, 1, 1)) // 4; kishRows(2, Float64Array.of(3, 1)) // 1.6
 */
export function kishRows(n: number, weights: ArrayLike<number> | null): number {
  if (weights === null) return n;
  let s = 0;
  let s2 = 0;
  for (let i = 0; i < n; i++) {
    const w = weights[i];
    s += w;
    s2 += w * w;
  }
  return s2 > 0 ? (s * s) / s2 : 0;
}
