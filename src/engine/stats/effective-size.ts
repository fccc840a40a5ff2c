/**
 * Kish's effective sample size of weighted rows, (sum w)^2 / sum w^2 (Kish,
 * "Survey Sampling", Wiley 1965): the number of equally weighted rows that
 * would give an estimate of a mean the same variance as these weighted rows.
 * It equals the row count when all weights are equal (or `weights` is null)
 * and shrinks as the weights grow uneven; rows of weight 0 do not count.
 * Cost: O(n). Never mutates its input.
 * @param weights row weights (finite, >= 0, not all 0), or null for n equal weights.
 * @param n the row count used when `weights` is null.
 * @returns a number in [1, n] for valid weights; 0 when every weight is 0.
 * @example kishEffectiveSize(Float64Array.of(1, 1, 2), 3) // 16 / 6 = 2.667
 */
export function kishEffectiveSize(weights: ArrayLike<number> | null, n: number): number {
  if (weights === null) return n;
  let sum = 0;
  let sumSq = 0;
  // Scale by the largest weight first, so that squares of huge or tiny weights neither overflow nor underflow.
  let big = 0;
  for (let i = 0; i < weights.length; i++) if (weights[i] > big) big = weights[i];
  if (!(big > 0)) return 0;
  for (let i = 0; i < weights.length; i++) {
    const w = weights[i] / big;
    sum += w;
    sumSq += w * w;
  }
  return (sum * sum) / sumSq;
}
