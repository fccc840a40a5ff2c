import type { Points, Sample } from '../points';

/** A sample reduced to its rows of positive weight, with log-masses that sum (in exp) to one. */
export interface WeightedSupport {
  readonly points: Points;
  /** log of each kept row's probability mass; exp(logMass) sums to 1. */
  readonly logMass: Float64Array;
}

/**
 * Turns a sample into a probability vector on its rows: rows of zero weight are
 * dropped (they carry no mass and would put log 0 = -Infinity into the Sinkhorn
 * potentials), the rest get mass w_i / sum(w), or 1/n without weights. The data
 * are copied; the sample is never mutated. O(n d).
 * @param s a validated sample (finite values, weights finite, >= 0, not all zero).
 * @example supportOf(sample([1, 2, 3], [1, 0, 3])) // points [1, 3], logMass [log 0.25, log 0.75]
 */
export function supportOf(s: Sample): WeightedSupport {
  const { n, d } = s;
  if (!s.weights) {
    const logMass = new Float64Array(n).fill(-Math.log(n));
    return { points: { n, d, data: Float64Array.from(s.data) }, logMass };
  }
  const w = s.weights;
  let total = 0;
  let kept = 0;
  for (let i = 0; i < n; i++) {
    if (w[i] > 0) {
      total += w[i];
      kept++;
    }
  }
  const data = new Float64Array(kept * d);
  const logMass = new Float64Array(kept);
  const logTotal = Math.log(total);
  for (let i = 0, r = 0; i < n; i++) {
    if (!(w[i] > 0)) continue;
    data.set(s.data.subarray(i * d, (i + 1) * d), r * d);
    logMass[r] = Math.log(w[i]) - logTotal;
    r++;
  }
  return { points: { n: kept, d, data }, logMass };
}
