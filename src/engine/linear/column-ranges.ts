import type { Points } from '../points';

/** Per-column smallest and largest value. */
export interface ColumnRanges {
  readonly min: Float64Array;
  readonly max: Float64Array;
}

/**
 * The smallest and largest value of each column over the rows with positive
 * weight (all rows when `weights` is null): the range a map was fitted on.
 * Rows of weight zero are not part of the fitted distribution and do not count.
 * Cost: O(n d). Never mutates its inputs.
 * @param p the rows (n >= 1 with at least one positive weight; finite values).
 * @param weights optional, one per row, >= 0.
 * @example columnRanges({ n: 2, d: 2, data: Float64Array.from([1, 5, 3, 4]) }, null) // { min: [1, 4], max: [3, 5] }
 */
export function columnRanges(p: Points, weights: ArrayLike<number> | null): ColumnRanges {
  const { n, d, data } = p;
  const min = new Float64Array(d).fill(Infinity);
  const max = new Float64Array(d).fill(-Infinity);
  for (let i = 0, j = 0; i < n; i++) {
    if (weights !== null && !(weights[i] > 0)) {
      j += d;
      continue;
    }
    for (let k = 0; k < d; k++, j++) {
      const v = data[j];
      if (v < min[k]) min[k] = v;
      if (v > max[k]) max[k] = v;
    }
  }
  return { min, max };
}
