import { isSortedAscending } from '../stats/sort';

/** What happens beyond the fitted range: hold the end value, or continue the end slope. */
export type Tails = 'clamp' | 'linear';

/**
 * One direction of a fitted 1-D map (source to target, or back), as a table of
 * knots read right-continuously: for an input x, k is the largest index with
 * keys[k] <= x, and the result is
 *   'linear': vals[k] + (vals[k+1] - vals[k]) (x - keys[k]) / (keys[k+1] - keys[k]),
 *   'step':   vals[k].
 * Equal keys (allowed for 'linear' only) are jumps: the later knot wins.
 *
 * Range and tails: [lo, hi] is the range of the data this direction maps from
 * (lo <= keys[0], keys[last] <= hi). Inside it the map is the fitted one; where
 * the knots stop short of the data range (one sample's end shares lie outside
 * the other's) the map holds the end value, as the fitted formula says. Outside
 * [lo, hi] the input counts as "outside" and:
 *   clamp:  the result is the value at the range end (vals[0] or vals[last]);
 *   linear: the result continues from that end value with the slope of the
 *           first (last) knot segment of positive width, 0 if there is none.
 * Results for the same input are bit-identical whichever search is used
 * (binary search, bucket index, or a merge walk for ascending input).
 * @example
 * new OneWayMap(Float64Array.of(0, 1, 3), Float64Array.of(0, 10, 20), 'linear', 0, 3)
 *   .evaluate(Float64Array.of(2, 5), out, 'linear', null) // out = [15, 25], returns 1
 */
export class OneWayMap {
  readonly keys: Float64Array;
  readonly vals: Float64Array;
  readonly kind: 'linear' | 'step';
  readonly lo: number;
  readonly hi: number;
  readonly slopeLo: number;
  readonly slopeHi: number;
  private index: KnotIndex | null = null;

  /**
   * @param keys non-decreasing (strictly increasing for 'step'), at least one.
   * @param vals non-decreasing, same length as keys.
   * @param lo,hi the data range, lo <= keys[0] and keys[last] <= hi.
   * Cost: O(k). Not checked here; the builders and the JSON reader check.
   */
  constructor(keys: Float64Array, vals: Float64Array, kind: 'linear' | 'step', lo: number, hi: number) {
    this.keys = keys;
    this.vals = vals;
    this.kind = kind;
    this.lo = lo;
    this.hi = hi;
    const k = keys.length;
    let a = 0;
    while (a + 1 < k && !(keys[a + 1] > keys[a])) a++;
    this.slopeLo = a + 1 < k ? (vals[a + 1] - vals[a]) / (keys[a + 1] - keys[a]) : 0;
    let b = k - 1;
    while (b > 0 && !(keys[b] > keys[b - 1])) b--;
    this.slopeHi = b > 0 ? (vals[b] - vals[b - 1]) / (keys[b] - keys[b - 1]) : 0;
  }

  /** Smallest slope over knot segments of positive width ('step' maps: 0). O(k). */
  minSlope(): number {
    if (this.kind === 'step') return 0;
    let s = Infinity;
    const { keys, vals } = this;
    for (let k = 0; k + 1 < keys.length; k++) {
      const dx = keys[k + 1] - keys[k];
      if (dx > 0) {
        const q = (vals[k + 1] - vals[k]) / dx;
        if (q < s) s = q;
      }
    }
    return s === Infinity ? 0 : s;
  }

  /**
   * Maps every value of `input` into `out` (same length; may not alias input).
   * Marks rows outside [lo, hi] in `flags` (when given) and returns their count.
   * Cost: O(n + k) for ascending input, else O(n log k) worst case and about
   * O(n) for large inputs (a bucket index over the keys, built once, O(k)).
   */
  evaluate(input: Float64Array, out: Float64Array, tails: Tails, flags: Uint8Array | null): number {
    const n = input.length;
    const K = this.keys.length;
    if (n === 0) return 0;
    if (K >= 2 && n * Math.log2(K) > 2 * (n + K) && isSortedAscending(input)) return this.walk(input, out, tails, flags, null);
    if (K >= 64 && n >= 2048) return this.lookup(input, out, tails, flags);
    let outside = 0;
    const { keys, lo, hi } = this;
    const k0 = keys[0];
    const kLast = keys[K - 1];
    for (let r = 0; r < n; r++) {
      const x = input[r];
      if (!(x >= lo && x <= hi)) {
        if (x !== x) {
          out[r] = NaN;
          continue;
        }
        outside++;
        if (flags) flags[r] = 1;
        out[r] = this.tail(x, tails);
        continue;
      }
      if (x < k0) {
        out[r] = this.vals[0];
        continue;
      }
      if (x >= kLast) {
        out[r] = this.vals[K - 1];
        continue;
      }
      let a = 0;
      let b = K;
      while (a < b) {
        const mid = (a + b) >>> 1;
        if (keys[mid] <= x) a = mid + 1;
        else b = mid;
      }
      out[r] = this.at(a - 1, x);
    }
    return outside;
  }

  /**
   * Many unsorted inputs: a bucket index over the keys (see `KnotIndex`) finds
   * each knot with about one memory miss, where a binary search takes ~log k.
   * Same knot, same formula as `at`, so the same bits.
   */
  private lookup(input: Float64Array, out: Float64Array, tails: Tails, flags: Uint8Array | null): number {
    if (this.index === null) this.index = buildIndex(this.keys, this.vals);
    const { buckets, scale, pairs } = this.index;
    const B1 = buckets.length - 2;
    const { lo, hi } = this;
    const K = this.keys.length;
    const k0 = this.keys[0];
    const kLast = this.keys[K - 1];
    const step = this.kind === 'step';
    const floor = Math.floor;
    let outside = 0;
    for (let r = 0; r < input.length; r++) {
      const x = input[r];
      if (!(x >= lo && x <= hi)) {
        if (x !== x) {
          out[r] = NaN;
          continue;
        }
        outside++;
        if (flags) flags[r] = 1;
        out[r] = this.tail(x, tails);
        continue;
      }
      if (x < k0) {
        out[r] = this.vals[0];
        continue;
      }
      if (x >= kLast) {
        out[r] = this.vals[K - 1];
        continue;
      }
      let q = floor((x - k0) * scale);
      if (q > B1) q = B1;
      let a = buckets[q];
      let b = buckets[q + 1];
      if (b - a > 8) {
        while (a < b) {
          const mid = (a + b) >>> 1;
          if (pairs[2 * mid] <= x) a = mid + 1;
          else b = mid;
        }
      } else {
        while (a < b && pairs[2 * a] <= x) a++;
      }
      const k = 2 * (a - 1);
      const v0 = pairs[k + 1];
      if (step) {
        out[r] = v0;
        continue;
      }
      const x0 = pairs[k];
      const v1 = pairs[k + 3];
      const y = v0 + (v1 - v0) * ((x - x0) / (pairs[k + 2] - x0));
      out[r] = y > v1 ? v1 : y;
    }
    return outside;
  }

  /**
   * Like `evaluate`, for input known to be ascending (NaN anywhere is allowed):
   * one merge walk over input and keys, with the same results, bit for bit.
   * With `order`, the result for input[r] goes to out[order[r]] (rows put back
   * in their original places as the walk goes); `order` must be a permutation
   * of 0..n-1. Marks flags in the same places. Cost: O(n + k).
   * @example map.evaluateAscending(Float64Array.of(1, 2), out, 'clamp', null, Uint32Array.of(1, 0)) // out[1] = T(1), out[0] = T(2)
   */
  evaluateAscending(input: Float64Array, out: Float64Array, tails: Tails, flags: Uint8Array | null, order: Uint32Array | null): number {
    if (input.length === 0) return 0;
    return this.walk(input, out, tails, flags, order);
  }

  /** Ascending input: one merge walk over input and keys; results to out[order[r]] (or out[r]). */
  private walk(input: Float64Array, out: Float64Array, tails: Tails, flags: Uint8Array | null, order: Uint32Array | null): number {
    const { keys, vals, lo, hi } = this;
    const K = keys.length;
    const k0 = keys[0];
    const kLast = keys[K - 1];
    const v0 = vals[0];
    const vLast = vals[K - 1];
    const step = this.kind === 'step';
    let outside = 0;
    let k = 0;
    for (let r = 0; r < input.length; r++) {
      const x = input[r];
      const o = order === null ? r : order[r];
      if (!(x >= lo && x <= hi)) {
        if (x !== x) {
          out[o] = NaN;
          continue;
        }
        outside++;
        if (flags) flags[o] = 1;
        out[o] = this.tail(x, tails);
        continue;
      }
      if (x < k0) {
        out[o] = v0;
        continue;
      }
      if (x >= kLast) {
        out[o] = vLast;
        continue;
      }
      // Ascending input only moves forward; the step back covers a NaN that hid a descent.
      while (k > 0 && keys[k] > x) k--;
      while (keys[k + 1] <= x) k++;
      // The formula of `at`, written out so the loop reads no fields.
      const a = vals[k];
      if (step) {
        out[o] = a;
        continue;
      }
      const xa = keys[k];
      const b = vals[k + 1];
      const y = a + (b - a) * ((x - xa) / (keys[k + 1] - xa));
      out[o] = y > b ? b : y;
    }
    return outside;
  }

  /** The map at x, given keys[k] <= x < keys[k+1]. */
  private at(k: number, x: number): number {
    const v0 = this.vals[k];
    if (this.kind === 'step') return v0;
    const k0 = this.keys[k];
    const v1 = this.vals[k + 1];
    const r = v0 + (v1 - v0) * ((x - k0) / (this.keys[k + 1] - k0));
    return r > v1 ? v1 : r;
  }

  private tail(x: number, tails: Tails): number {
    const K = this.vals.length;
    if (x < this.lo) return tails === 'linear' ? this.vals[0] + this.slopeLo * (x - this.lo) : this.vals[0];
    return tails === 'linear' ? this.vals[K - 1] + this.slopeHi * (x - this.hi) : this.vals[K - 1];
  }
}

/**
 * Bucket index over knots: B equal-width buckets over [keys[0], keys[last]];
 * buckets[q] is the first knot whose bucket is >= q. The bucket of x is
 * monotone in x, so the knot sought (largest k with keys[k] <= x) lies in
 * [buckets[q] - 1, buckets[q+1] - 1]: a short scan there. Correct for any
 * spacing (a crowded bucket is binary-searched); fast when knots are spread.
 * `pairs` interleaves keys and values so one lookup touches one place in memory.
 */
interface KnotIndex {
  readonly buckets: Int32Array;
  readonly scale: number;
  readonly pairs: Float64Array;
}

function buildIndex(keys: Float64Array, vals: Float64Array): KnotIndex {
  const K = keys.length;
  const pairs = new Float64Array(2 * K);
  for (let k = 0; k < K; k++) {
    pairs[2 * k] = keys[k];
    pairs[2 * k + 1] = vals[k];
  }
  const range = keys[K - 1] - keys[0];
  const B = Math.max(1, Math.min(K >> 2, 1 << 22));
  const scale = B / range;
  if (!(range > 0) || !Number.isFinite(scale) || !(scale > 0)) return { buckets: Int32Array.of(0, K), scale: 0, pairs };
  const buckets = new Int32Array(B + 1);
  let q = 0;
  for (let k = 0; k < K; k++) {
    let bk = Math.floor((keys[k] - keys[0]) * scale);
    if (bk > B - 1) bk = B - 1;
    while (q <= bk) buckets[q++] = k;
  }
  while (q <= B) buckets[q++] = K;
  return { buckets, scale, pairs };
}
