import type { Random } from '../stats/random';

/**
 * Deterministic mini-batches of row indices from our own seeded generator.
 * Unweighted rows: shuffled passes (each row once per pass, Fisher-Yates).
 * Weighted rows: draws with replacement, row i with probability w_i / sum w
 * (inverse of the cumulative weights by binary search), so a weighted sample is
 * trained on as the distribution it stands for. A batch of size >= n without
 * weights is the full sample in order.
 */
export class BatchSampler {
  readonly size: number;
  private readonly n: number;
  private readonly cumulative: Float64Array | null;
  private readonly order: Uint32Array;
  private cursor: number;
  private readonly rng: Random;

  /**
   * @param n rows, >= 1. @param size batch size, >= 1 (capped at n when unweighted).
   * @param weights row weights or null. @param rng seeded generator (advanced by draws).
   * Cost O(n) to build, O(size) (unweighted) or O(size log n) (weighted) per batch.
   * @example new BatchSampler(5, 2, null, new Random(1)).next() // two distinct row indices
   */
  constructor(n: number, size: number, weights: Float64Array | null, rng: Random) {
    this.n = n;
    this.rng = rng;
    this.size = weights ? size : Math.min(size, n);
    this.order = new Uint32Array(n);
    for (let i = 0; i < n; i++) this.order[i] = i;
    this.cursor = n;
    if (weights) {
      const c = new Float64Array(n);
      let s = 0;
      for (let i = 0; i < n; i++) {
        s += weights[i];
        c[i] = s;
      }
      this.cumulative = c;
    } else {
      this.cumulative = null;
    }
  }

  /** True when every batch is the whole sample in order (nothing to resample). */
  get isFull(): boolean {
    return this.cumulative === null && this.size >= this.n;
  }

  /** The next batch of row indices (a new array). */
  next(): Uint32Array {
    const out = new Uint32Array(this.size);
    if (this.cumulative) {
      const c = this.cumulative;
      const total = c[this.n - 1];
      for (let b = 0; b < this.size; b++) {
        const u = this.rng.uniform() * total;
        let lo = 0;
        let hi = this.n - 1;
        while (lo < hi) {
          const mid = (lo + hi) >>> 1;
          if (c[mid] > u) hi = mid;
          else lo = mid + 1;
        }
        out[b] = lo;
      }
      return out;
    }
    if (this.isFull) return out.map((_, i) => i);
    for (let b = 0; b < this.size; b++) {
      if (this.cursor >= this.n) this.shuffle();
      out[b] = this.order[this.cursor++];
    }
    return out;
  }

  private shuffle(): void {
    const o = this.order;
    for (let i = this.n - 1; i > 0; i--) {
      const j = this.rng.int(i + 1);
      const t = o[i];
      o[i] = o[j];
      o[j] = t;
    }
    this.cursor = 0;
  }
}

/** Gathers rows `idx` of a row-major n x d array into a Float32Array (for a tensor). O(|idx| d). */
export function gatherRows(data: Float64Array, d: number, idx: Uint32Array): Float32Array {
  const out = new Float32Array(idx.length * d);
  for (let b = 0; b < idx.length; b++) {
    const o = idx[b] * d;
    for (let k = 0; k < d; k++) out[b * d + k] = data[o + k];
  }
  return out;
}
