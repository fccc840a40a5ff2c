import type { WeightedCdf } from '../stats/weighted-cdf';

/**
 * Shares closer than this count as equal when the step map compares cumulative
 * shares across samples, so that rounding in sums of fractional weights (ten
 * weights of 0.1 do not add up to exactly 1) cannot move a value to its
 * neighbour. Real differences in share are far larger: 1e-6 for a million rows.
 */
export const SHARE_TOLERANCE = 1e-10;

/**
 * The exact inverse-CDF map between two empirical distributions, tabulated at
 * the distinct values of `from`: out[k] = G^-1(F(from.values[k])), with
 * F(x) = share of `from` weight <= x and G^-1(p) = inf{y : G(y) >= p} the step
 * quantile function of `to`. Every entry is a value of `to`; with equal sizes,
 * equal weights and no ties the i-th smallest value of `from` gets the i-th
 * smallest of `to`. (The composition G^-1 o F is the monotone rearrangement;
 * Villani, "Topics in Optimal Transportation", Thm 2.18.)
 * Cost: O(kf + kt) by one merge walk (shares ascend on both sides).
 * @param from,to merged CDFs.
 * @example stepTable(weightedCdf([1, 2, 3, 4]), weightedCdf([10, 20])) // [10, 10, 20, 20]
 */
export function stepTable(from: WeightedCdf, to: WeightedCdf): Float64Array {
  const kf = from.values.length;
  const kt = to.values.length;
  const out = new Float64Array(kf);
  let j = 0;
  for (let k = 0; k < kf; k++) {
    const share = from.cumulative[k] / from.total;
    while (j < kt - 1 && to.cumulative[j] / to.total < share - SHARE_TOLERANCE) j++;
    out[k] = to.values[j];
  }
  return out;
}
