import type { WeightedCdf } from '../stats/weighted-cdf';
import type { ShareGrid } from './grid';

/**
 * The continuised CDF of whole-number scores used in equipercentile equating
 * (Kolen & Brennan, "Test Equating, Scaling, and Linking", ch. 2: percentile
 * ranks): each score k is spread evenly over [k - 0.5, k + 0.5], so the CDF
 * F*(x) = F(k - 1) + (x - (k - 0.5)) f(k) for x in [k - 0.5, k + 0.5] is a broken
 * line through (k_min - 0.5, 0) and (k + 0.5, F(k)). Scores inside the range
 * with zero frequency make flat stretches of F*; a run of them is stored as two
 * points with the same share (only their ends matter), so the grid has at most
 * 2k + 1 points however wide the score range.
 * Cost: O(k) for k distinct scores.
 * @param cdf a merged CDF whose values are whole numbers (see `checkWholeNumbers`).
 * @example ordinalGrid(weightedCdf([0, 0, 2, 3])) // p [0, 0.5, 0.5, 0.75, 1], v [-0.5, 0.5, 1.5, 2.5, 3.5]
 */
export function ordinalGrid(cdf: WeightedCdf): ShareGrid {
  const k = cdf.values.length;
  const p = new Float64Array(2 * k + 1);
  const v = new Float64Array(2 * k + 1);
  const W = cdf.total;
  let m = 0;
  p[m] = 0;
  v[m++] = cdf.values[0] - 0.5;
  for (let i = 0; i < k; i++) {
    const s = cdf.values[i];
    if (i > 0 && s > cdf.values[i - 1] + 1) {
      p[m] = cdf.cumulative[i - 1] / W;
      v[m++] = s - 0.5;
    }
    p[m] = cdf.cumulative[i] / W;
    v[m++] = s + 0.5;
  }
  return { p: p.slice(0, m), v: v.slice(0, m) };
}
