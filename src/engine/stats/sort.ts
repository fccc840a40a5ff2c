import { RemapError } from '../errors';

/**
 * Sorting for 1-D samples: plain values, and values with row weights kept
 * alongside. Both copy their input once into a Float64Array and never mutate
 * what they were given. Sorting without a comparator function is about five
 * times faster than with one (see PLATFORM-NOTES), so the weighted sort packs
 * each row's index into the low bits of a copy of its value and sorts that one
 * typed array natively.
 */

/** True when `a` is in non-decreasing order. O(n), stops at the first descent. */
export function isSortedAscending(a: ArrayLike<number>): boolean {
  for (let i = 1; i < a.length; i++) if (a[i] < a[i - 1]) return false;
  return true;
}

/**
 * A sorted copy of `values` (ascending), as a new Float64Array, in the order of
 * Float64Array.prototype.sort (-0 before +0).
 * Cost: O(n) when already sorted or from RADIX_MIN values up (see `radixSort`),
 * else O(n log n) by the native typed sort.
 * @param values finite numbers (not checked here; NaN would sort last).
 * @example sortedCopy([3, 1, 2]) // Float64Array [1, 2, 3]
 */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  if (isSortedAscending(values)) return Float64Array.from(values);
  if (values.length >= RADIX_MIN) {
    // The radix sort writes only to its own buffers, so a Float64Array needs no copy first.
    const r = radixSort(values instanceof Float64Array ? values : Float64Array.from(values), false);
    if (r !== null) return r.sorted;
  }
  return Float64Array.from(values).sort();
}

/** Values and their weights, both in ascending order of value. */
export interface SortedWeighted {
  readonly values: Float64Array;
  readonly weights: Float64Array;
}

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
/** Index of the low and high 32-bit word of a double in a Uint32Array view. */
const LO = LITTLE_ENDIAN ? 0 : 1;
const HI = 1 - LO;

/**
 * The permutation that sorts `values` ascending: `order[i]` is the row of the
 * i-th smallest value. -0 sorts before +0 (as Float64Array.prototype.sort does).
 * Input already in ascending order keeps its rows in place. Otherwise rows
 * with equal values come out in a fixed order: ascending row number for
 * values from +0 up, descending for negative values and -0 (the order the
 * sort has always given, kept so that weight sums over tied rows add up in the
 * same order and fits stay bit-identical).
 *
 * How: below RADIX_MIN values, each value is copied into a Float64Array whose
 * lowest ceil(log2 n) mantissa bits are overwritten with the row index; one
 * native sort of that array orders the rows by value except among values
 * that differ only in those low bits, which an insertion pass on the true
 * values then puts right (with a comparator sort as the fallback when values
 * crowd within a few ulps). From RADIX_MIN values up, a radix sort of the
 * 64-bit patterns (see `radixSort`), which carries the rows along.
 * Cost: O(n log n) time below RADIX_MIN, O(n) above; 16n to 24n bytes.
 * @param values finite numbers, at most 2^32 of them.
 * @throws RemapError on a non-finite value.
 * @example sortOrder([3, 1, 2]) // Uint32Array [1, 2, 0]
 */
export function sortOrder(values: ArrayLike<number>): Uint32Array {
  return sortWithOrder(values).order;
}

/** A sorted copy of the values and the permutation that sorts them. */
export interface SortedWithOrder {
  /** sorted[i] = values[order[i]], ascending. */
  readonly sorted: Float64Array;
  readonly order: Uint32Array;
}

/**
 * `sortOrder` and the sorted values together (the sort computes both).
 * Cost: O(n log n) time below RADIX_MIN values, O(n) above and when already
 * sorted; 20n bytes (28n during a radix sort).
 * @throws RemapError on a non-finite value.
 * @example sortWithOrder([3, 1, 2]) // { sorted: [1, 2, 3], order: [1, 2, 0] }
 */
export function sortWithOrder(values: ArrayLike<number>): SortedWithOrder {
  const n = values.length;
  // One pass up to the first descent checks both "already ascending" and, that far, finiteness.
  let ascending = true;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v - v !== 0) throw notFinite(i, v);
    if (i > 0 && v < values[i - 1]) {
      ascending = false;
      break;
    }
  }
  if (ascending) {
    const order = new Uint32Array(n);
    for (let i = 0; i < n; i++) order[i] = i;
    return { sorted: Float64Array.from(values), order };
  }
  if (n >= RADIX_MIN && n <= 0xffffffff) {
    const r = radixSort(values instanceof Float64Array ? values : Float64Array.from(values), true);
    if (r !== null && r.order !== null) return { sorted: r.sorted, order: r.order };
  }
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v - v !== 0) throw notFinite(i, v);
  }
  return packedOrder(values);
}

function notFinite(i: number, v: number): RemapError {
  return new RemapError(`sortOrder: value ${i + 1} is ${v}; only finite numbers can be sorted. Remove or replace it.`);
}

/** The packed index sort (see `sortOrder`), for finite values not already ascending. */
function packedOrder(values: ArrayLike<number>): SortedWithOrder {
  const n = values.length;
  const order = new Uint32Array(n);
  const bits = Math.ceil(Math.log2(Math.max(2, n)));
  if (!LITTLE_ENDIAN || bits > 32) return comparatorOrder(values);
  const keys = Float64Array.from(values);
  const words = new Uint32Array(keys.buffer);
  const mask = bits === 32 ? 0xffffffff : (1 << bits) - 1;
  const keep = ~mask;
  for (let i = 0; i < n; i++) words[2 * i] = ((words[2 * i] & keep) | i) >>> 0;
  keys.sort();
  // Reuse the key buffer for the sorted true values once each index is read.
  const sorted = keys;
  let disorder = false;
  for (let i = 0; i < n; i++) {
    const r = (words[2 * i] & mask) >>> 0;
    order[i] = r;
    const v = values[r];
    sorted[i] = v;
    if (i > 0 && v < sorted[i - 1]) disorder = true;
  }
  if (!disorder) return { sorted, order };
  // Only rows whose values differ in the overwritten low bits can be out of
  // order: an insertion pass puts them right, with a budget against crowding.
  let budget = 8 * n + 1024;
  for (let i = 1; i < n; i++) {
    const v = sorted[i];
    if (!(v < sorted[i - 1])) continue;
    const r = order[i];
    let j = i - 1;
    while (j >= 0 && sorted[j] > v) {
      sorted[j + 1] = sorted[j];
      order[j + 1] = order[j];
      j--;
      if (--budget < 0) return comparatorOrder(values);
    }
    sorted[j + 1] = v;
    order[j + 1] = r;
  }
  return { sorted, order };
}

/** Comparator sort with the same order as the others: -0 before +0, ties as `sortOrder` says. */
function comparatorOrder(values: ArrayLike<number>): SortedWithOrder {
  const idx = Array.from({ length: values.length }, (_, i) => i);
  idx.sort((a, b) => {
    const x = values[a];
    const y = values[b];
    if (x !== y) return x < y ? -1 : 1;
    const nx = x < 0 || 1 / x < 0;
    const ny = y < 0 || 1 / y < 0;
    if (nx !== ny) return nx ? -1 : 1; // -0 before +0
    return nx ? b - a : a - b;
  });
  const order = Uint32Array.from(idx);
  const sorted = new Float64Array(order.length);
  for (let i = 0; i < order.length; i++) sorted[i] = values[order[i]];
  return { sorted, order };
}

/**
 * From this many values up the radix sort beats the native typed sort (about
 * 0.6x its time without rows carried, 0.9x with them, at n = 1,000,000;
 * bench/quantile.bench.ts); below it the fixed cost of its counts dominates.
 */
export const RADIX_MIN = 4096;

/** The result of `radixSort`: `order` is null when rows were not asked for. */
export interface RadixSorted {
  readonly sorted: Float64Array;
  readonly order: Uint32Array | null;
}

const RADIX = 2048;

/**
 * Sorts finite doubles by their bit patterns: an LSD radix sort (Knuth, "The
 * Art of Computer Programming" vol. 3, sec. 5.2.5) on six digits of 11, 11
 * and 10 bits from the low and the high 32-bit word. Finite doubles of one
 * sign order like their bit patterns read as unsigned integers (ascending for
 * positive, descending for negative, the IEEE 754 layout), so the last pass,
 * on the digit that holds the sign bit, puts the negative buckets first in
 * falling order and fills each from its end. The result is the order of
 * Float64Array.prototype.sort (-0 before +0) with no comparison at all; rows
 * of equal values keep their order for values from +0 up and come out
 * reversed for negative values and -0 (see `sortOrder`). One counting pass
 * makes all six histograms; a digit that every value shares is skipped.
 * Cost: O(n) time (7 passes at most), 16n bytes (24n with `withOrder`).
 * Never writes to `values`.
 * @param values the values; any non-finite one makes the result null.
 * @param withOrder carry the row numbers along (`order[i]` = row of `sorted[i]`).
 * @returns the sorted copy (and order), or null when a value is NaN or infinite.
 * @example radixSort(Float64Array.of(2, -1, 0), true) // { sorted: [-1, 0, 2], order: [1, 2, 0] }
 */
export function radixSort(values: Float64Array, withOrder: boolean): RadixSorted | null {
  const n = values.length;
  const counts = new Int32Array(6 * RADIX);
  if (!histograms(new Uint32Array(values.buffer, values.byteOffset, 2 * n), n, counts)) return null;
  let aF = values;
  let aI: Uint32Array | null = null; // null: rows are still in input order
  let bF: Float64Array | null = null;
  let bI: Uint32Array | null = null;
  const cF: Float64Array | null = null;
  const cI: Uint32Array | null = null;
  const pos = new Int32Array(RADIX);
  for (let d = 0; d < 6; d++) {
    const base = d * RADIX;
    const top = d === 5;
    const width = top ? RADIX >>> 1 : RADIX;
    let single = -1;
    for (let q = 0; q < width; q++) if (counts[base + q] === n) single = q;
    // A shared digit moves nothing; on the sign digit only if it is positive (negatives get reversed).
    if (single >= 0 && (!top || single < width >>> 1)) continue;
    if (bF === null) {
      bF = new Float64Array(n);
      if (withOrder) bI = new Uint32Array(n);
    }
    const aW = new Uint32Array(aF.buffer, aF.byteOffset, 2 * n);
    if (top) {
      // Negative digits (sign bit set: q >= half) first, highest digit first, each bucket filled from its end.
      const half = width >>> 1;
      let s = 0;
      for (let q = width - 1; q >= half; q--) pos[q] = s += counts[base + q];
      for (let q = 0; q < half; q++) {
        pos[q] = s;
        s += counts[base + q];
      }
      if (!withOrder) scatterSign(aF, aW, bF, pos, n);
      else if (aI === null) scatterSignRows(aF, aW, bF, bI as Uint32Array, pos, n);
      else scatterSignOrder(aF, aW, aI, bF, bI as Uint32Array, pos, n);
    } else {
      let s = 0;
      for (let q = 0; q < RADIX; q++) {
        pos[q] = s;
        s += counts[base + q];
      }
      const word = d < 3 ? LO : HI;
      const shift = (d % 3) * 11;
      if (!withOrder) scatter(aF, aW, bF, word, shift, pos, n);
      else if (aI === null) scatterRows(aF, aW, bF, bI as Uint32Array, word, shift, pos, n);
      else scatterOrder(aF, aW, aI, bF, bI as Uint32Array, word, shift, pos, n);
    }
    // The output becomes the next input; the old input (never the caller's array) the next output.
    const nextF: Float64Array | null = aF === values ? cF : aF;
    const nextI: Uint32Array | null = aI === null ? cI : aI;
    aF = bF;
    aI = bI;
    bF = nextF;
    bI = nextI;
  }
  if (aF === values) aF = Float64Array.from(values);
  let order: Uint32Array | null = null;
  if (withOrder) {
    if (aI === null) {
      aI = new Uint32Array(n);
      for (let i = 0; i < n; i++) aI[i] = i;
    }
    order = aI;
  }
  return { sorted: aF, order };
}

/** The six digit histograms in one pass. False if a value is NaN or infinite (exponent bits all ones). */
function histograms(w: Uint32Array, n: number, c: Int32Array): boolean {
  const L = LO;
  const H = HI;
  for (let i = 0; i < n; i++) {
    const lo = w[2 * i + L];
    const hi = w[2 * i + H];
    if ((hi & 0x7ff00000) === 0x7ff00000) return false;
    c[lo & 2047]++;
    c[2048 + ((lo >>> 11) & 2047)]++;
    c[4096 + (lo >>> 22)]++;
    c[6144 + (hi & 2047)]++;
    c[8192 + ((hi >>> 11) & 2047)]++;
    c[10240 + (hi >>> 22)]++;
  }
  return true;
}

// One small function per pass kind, so each hot loop stays monomorphic and free of global lookups.
function scatter(aF: Float64Array, aW: Uint32Array, bF: Float64Array, word: number, shift: number, pos: Int32Array, n: number): void {
  for (let i = 0; i < n; i++) bF[pos[(aW[2 * i + word] >>> shift) & 2047]++] = aF[i];
}

function scatterRows(aF: Float64Array, aW: Uint32Array, bF: Float64Array, bI: Uint32Array, word: number, shift: number, pos: Int32Array, n: number): void {
  for (let i = 0; i < n; i++) {
    const t = pos[(aW[2 * i + word] >>> shift) & 2047]++;
    bF[t] = aF[i];
    bI[t] = i;
  }
}

function scatterOrder(
  aF: Float64Array,
  aW: Uint32Array,
  aI: Uint32Array,
  bF: Float64Array,
  bI: Uint32Array,
  word: number,
  shift: number,
  pos: Int32Array,
  n: number,
): void {
  for (let i = 0; i < n; i++) {
    const t = pos[(aW[2 * i + word] >>> shift) & 2047]++;
    bF[t] = aF[i];
    bI[t] = aI[i];
  }
}

function scatterSign(aF: Float64Array, aW: Uint32Array, bF: Float64Array, pos: Int32Array, n: number): void {
  const H = HI;
  for (let i = 0; i < n; i++) {
    const q = aW[2 * i + H] >>> 22;
    bF[q >= 512 ? --pos[q] : pos[q]++] = aF[i];
  }
}

function scatterSignRows(aF: Float64Array, aW: Uint32Array, bF: Float64Array, bI: Uint32Array, pos: Int32Array, n: number): void {
  const H = HI;
  for (let i = 0; i < n; i++) {
    const q = aW[2 * i + H] >>> 22;
    const t = q >= 512 ? --pos[q] : pos[q]++;
    bF[t] = aF[i];
    bI[t] = i;
  }
}

function scatterSignOrder(aF: Float64Array, aW: Uint32Array, aI: Uint32Array, bF: Float64Array, bI: Uint32Array, pos: Int32Array, n: number): void {
  const H = HI;
  for (let i = 0; i < n; i++) {
    const q = aW[2 * i + H] >>> 22;
    const t = q >= 512 ? --pos[q] : pos[q]++;
    bF[t] = aF[i];
    bI[t] = aI[i];
  }
}

/**
 * Copies of `values` and `weights`, both reordered so the values ascend.
 * Cost: O(n) when already sorted, else O(n log n) (see `sortOrder`).
 * @param values finite numbers.
 * @param weights one finite non-negative weight per value (not checked here).
 * @throws RemapError if the lengths differ or a value is not finite.
 * @example sortWithWeights([3, 1], [5, 7]) // { values: [1, 3], weights: [7, 5] }
 */
export function sortWithWeights(values: ArrayLike<number>, weights: ArrayLike<number>): SortedWeighted {
  const n = values.length;
  if (weights.length !== n) {
    throw new RemapError(`sortWithWeights: ${weights.length} weights were given for ${n} values; give one weight per value.`);
  }
  if (isSortedAscending(values)) return { values: Float64Array.from(values), weights: Float64Array.from(weights) };
  const { sorted, order } = sortWithOrder(values);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) w[i] = weights[order[i]];
  return { values: sorted, weights: w };
}
