import type { WeightedCdf } from '../stats/weighted-cdf';
import type { ShareGrid } from './grid';

/**
 * Hazen plotting positions of a merged weighted sample: each distinct value
 * sits at the middle of its block of cumulative weight,
 *   p_k = (C_{k-1} + C_k) / (2 W),
 * with C_k the weight of rows <= value k and W the total. With equal weights and
 * no ties this is (i - 0.5)/n (Hazen, "Flood flows", 1914; type 5 in Hyndman &
 * Fan, "Sample quantiles in statistical packages", Am. Stat. 1996). Tied rows
 * are one value already (see `weightedCdfSorted`), so a tie block sits at the
 * middle of its block. Two samples with the same size and weights get
 * bit-identical positions, which is what makes x_(i) map exactly to y_(i).
 * The grid shares `cdf.values` (nothing here writes to it).
 * Cost: O(k) for k distinct values.
 * @param cdf a merged CDF (values strictly increasing).
 * @example hazenGrid(weightedCdf([10, 20, 30, 40])).p // [0.125, 0.375, 0.625, 0.875]
 */
export function hazenGrid(cdf: WeightedCdf): ShareGrid {
  const k = cdf.values.length;
  const p = new Float64Array(k);
  const twoW = 2 * cdf.total;
  let prev = 0;
  if (Number.isFinite(twoW)) {
    for (let i = 0; i < k; i++) {
      const c = cdf.cumulative[i];
      p[i] = (prev + c) / twoW;
      prev = c;
    }
  } else {
    // Weights adding up to more than half the largest double: 2W (and prev + c) would overflow
    // to Infinity and the positions to NaN, so take each half share on its own.
    const W = cdf.total;
    for (let i = 0; i < k; i++) {
      const c = cdf.cumulative[i];
      p[i] = prev / W / 2 + c / W / 2;
      prev = c;
    }
  }
  return { p, v: cdf.values };
}
