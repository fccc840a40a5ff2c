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

/**
 * True when the two samples have the same total and cumulative weights and
 * their Hazen positions increase strictly (equal sizes and weights, the common
 * case): then `hazenGrid(a)` and `hazenGrid(b)` are bit-identical (same
 * numbers, same arithmetic) and the quantile map's knots are simply the two
 * value arrays (see `buildKnots`), found without building the grids. False
 * does not mean the grids differ (weights scaled by a constant give the same
 * positions from different totals); `buildKnots` still finds those.
 * Cost: O(k), no allocation; stops at the first difference.
 * @example sameHazenGrids(weightedCdf([1, 2]), weightedCdf([5, 9])) // true
 */
export function sameHazenGrids(a: WeightedCdf, b: WeightedCdf): boolean {
  const k = a.values.length;
  if (b.values.length !== k || a.total !== b.total) return false;
  const ca = a.cumulative;
  const cb = b.cumulative;
  const twoW = 2 * a.total;
  if (!Number.isFinite(twoW)) return false; // the rare split branch of hazenGrid: let it build the grids
  let prev = 0;
  let last = -1;
  for (let i = 0; i < k; i++) {
    const c = ca[i];
    if (c !== cb[i]) return false;
    const p = (prev + c) / twoW;
    if (!(p > last)) return false;
    last = p;
    prev = c;
  }
  return true;
}
