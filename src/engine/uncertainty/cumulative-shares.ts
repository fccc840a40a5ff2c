/**
 * Reading a weighted 1-D sample held as cumulative weights over its distinct
 * values: c[k] = the weight of rows with value at most distinct[k], for every
 * distinct value of the full sample, including values a replicate gives no
 * weight (their c[k] repeats c[k-1]). The helpers find the values that carry
 * weight and their Hazen positions without building the merged CDF, with the
 * arithmetic of `hazenGrid` and `weightedCdfSorted`, so the positions are the
 * same numbers, bit for bit. Each is O(1) or O(log K) for K distinct values,
 * plus the zero-weight values stepped over.
 */

/**
 * A view of one side's cumulative weights c (length K, total W = c[K-1]),
 * reset for each replicate. Methods rather than free functions, so the hot
 * loops that call them millions of times pay no module lookup.
 * @example const v = new CumulativeWeights(); v.reset(Float64Array.of(0, 2, 2, 3)); v.after(-1) // 1; v.hazen(1) // 1/3
 */
export class CumulativeWeights {
  c: Float64Array = new Float64Array(0);
  total = 0;
  private twoTotal = 0;
  private split = false;

  /** Reads new cumulative weights (not copied; not written). O(1). */
  reset(c: Float64Array): void {
    this.c = c;
    this.total = c.length > 0 ? c[c.length - 1] : 0;
    this.twoTotal = 2 * this.total;
    this.split = !Number.isFinite(this.twoTotal);
  }

  /** Does distinct value k carry weight? */
  carries(k: number): boolean {
    const c = this.c;
    return k === 0 ? c[0] > 0 : c[k] > c[k - 1];
  }

  /** The largest k' <= k whose value carries weight, or -1. */
  atOrBefore(k: number): number {
    const c = this.c;
    while (k > 0 && !(c[k] > c[k - 1])) k--;
    return k === 0 && !(c[0] > 0) ? -1 : k;
  }

  /** The smallest k' > k whose value carries weight, or -1. */
  after(k: number): number {
    const c = this.c;
    const K = c.length;
    k++;
    if (k === 0) {
      if (c[0] > 0) return 0;
      k = 1;
    }
    while (k < K && !(c[k] > c[k - 1])) k++;
    return k < K ? k : -1;
  }

  /**
   * The Hazen position (c[k-1] + c[k]) / (2 W) of value k (see `hazenGrid`,
   * including its split form for totals near the largest double). For a value
   * without weight this is c[k] / W, which lies between the positions of the
   * weighted values on either side, so the positions of all K values never
   * decrease and can be binary-searched.
   */
  hazen(k: number): number {
    const c = this.c;
    const prev = k === 0 ? 0 : c[k - 1];
    return this.split ? prev / this.total / 2 + c[k] / this.total / 2 : (prev + c[k]) / this.twoTotal;
  }

  /** The largest k with hazen(k) <= share, or -1. O(log K). */
  lastHazenAtOrBelow(share: number): number {
    let lo = 0;
    let hi = this.c.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.hazen(mid) <= share) lo = mid + 1;
      else hi = mid;
    }
    return lo - 1;
  }
}

/**
 * Running totals of per-value weights into `c` (length K): the cumulative
 * weights `weightedCdfSorted` would add up, in the same order. Returns false
 * when a positive weight is too small to change the total (the merged CDF
 * would then hold two equal cumulative weights, which these helpers do not
 * read the same way). O(K).
 */
export function cumulateWeights(w: Float64Array, c: Float64Array): boolean {
  let total = 0;
  for (let k = 0; k < w.length; k++) {
    const wk = w[k];
    if (wk > 0) {
      const next = total + wk;
      if (!(next > total)) return false;
      total = next;
    }
    c[k] = total;
  }
  return true;
}

/**
 * Cumulative counts per distinct value from counts per cell: cells are the
 * sorted rows (ends[k] = rows with value at most value k, see `SortedSide`) or,
 * when ends is null, the distinct values themselves. The counts must add up
 * to less than 2^31 (one replicate's draws). O(cells).
 */
export function cumulateCounts(counts: Int32Array, ends: Int32Array | null, c: Float64Array): void {
  // Whole numbers below 2^31 (the draws of one replicate): an integer running total is exact and adds faster than a double one.
  let total = 0;
  if (ends === null) {
    for (let k = 0; k < c.length; k++) {
      total = (total + counts[k]) | 0;
      c[k] = total;
    }
    return;
  }
  let r = 0;
  for (let k = 0; k < c.length; k++) {
    const e = ends[k];
    for (; r < e; r++) total = (total + counts[r]) | 0;
    c[k] = total;
  }
}

/** Per-value weights back from cumulative ones (exact for whole-number counts). O(K). */
export function differences(c: Float64Array, w: Float64Array): void {
  let prev = 0;
  for (let k = 0; k < c.length; k++) {
    w[k] = c[k] - prev;
    prev = c[k];
  }
}
