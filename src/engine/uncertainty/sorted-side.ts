import type { Sample } from '../points';
import { sortWithOrder } from '../stats/sort';

/** One 1-D sample sorted once: its distinct values, where each row's value sits among them, and the full-sample weights. */
export interface SortedSide {
  /** The distinct values, ascending. */
  readonly distinct: Float64Array;
  /** distinctOf[i] = index into `distinct` of row i's value. */
  readonly distinctOf: Int32Array;
  /** Full-sample weight of each distinct value (row weights, or 1 per row, added up). */
  readonly weight: Float64Array;
  /**
   * ends[k] = the number of rows whose value is at most distinct[k] (the
   * sorted positions of value k are ends[k-1] .. ends[k] - 1); null when no
   * two rows tie, so that position k holds value k.
   */
  readonly ends: Int32Array | null;
}

/**
 * Sorts one column once and merges ties. Cost: O(n log n) (O(n) above 4,096 rows, see sortWithOrder).
 * @param s a validated sample; its first column is used.
 * @example sortSide(sample([3, 1, 3])) // distinct [1, 3], distinctOf [1, 0, 1], weight [1, 2], ends [1, 3]
 */
export function sortSide(s: Sample): SortedSide {
  const col = s.data.length === s.n ? s.data : s.data.subarray(0, s.n);
  const { sorted, order } = sortWithOrder(col);
  const n = s.n;
  const distinctOf = new Int32Array(n);
  const tmp = new Float64Array(n);
  const w = new Float64Array(n);
  const ends = new Int32Array(n);
  let k = -1;
  for (let i = 0; i < n; i++) {
    if (k < 0 || sorted[i] !== tmp[k]) tmp[++k] = sorted[i];
    distinctOf[order[i]] = k;
    w[k] += s.weights ? s.weights[order[i]] : 1;
    ends[k] = i + 1;
  }
  return { distinct: tmp.slice(0, k + 1), distinctOf, weight: w.slice(0, k + 1), ends: k + 1 === n ? null : ends.slice(0, k + 1) };
}
