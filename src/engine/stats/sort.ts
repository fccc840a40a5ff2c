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
 * A sorted copy of `values` (ascending), as a new Float64Array.
 * Cost: O(n) when already sorted, else O(n log n) by the native typed sort.
 * @param values finite numbers (not checked here; NaN would sort last).
 * @example sortedCopy([3, 1, 2]) // Float64Array [1, 2, 3]
 */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  const out = Float64Array.from(values);
  if (!isSortedAscending(out)) out.sort();
  return out;
}

/** Values and their weights, both in ascending order of value. */
export interface SortedWeighted {
  readonly values: Float64Array;
  readonly weights: Float64Array;
}

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * The permutation that sorts `values` ascending: `order[i]` is the row of the
 * i-th smallest value. Ties come out in a fixed order that depends only on the input.
 *
 * How: each value is copied into a Float64Array whose lowest ceil(log2 n)
 * mantissa bits are overwritten with the row index; one native sort of that
 * array orders the rows by value except among values that differ only in those
 * low bits, which an insertion pass on the true values then puts right. If that
 * pass would move too much (values crowded within a few ulps), it falls back to
 * a comparator sort, so the cost stays O(n log n).
 * Cost: O(n log n) time, 16n bytes.
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
 * Cost: O(n log n) time (O(n) when already sorted), 20n bytes.
 * @throws RemapError on a non-finite value.
 * @example sortWithOrder([3, 1, 2]) // { sorted: [1, 2, 3], order: [1, 2, 0] }
 */
export function sortWithOrder(values: ArrayLike<number>): SortedWithOrder {
  const n = values.length;
  const order = new Uint32Array(n);
  let ascending = true;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v - v !== 0) throw new RemapError(`sortOrder: value ${i + 1} is ${v}; only finite numbers can be sorted. Remove or replace it.`);
    if (i > 0 && v < values[i - 1]) ascending = false;
  }
  if (ascending) {
    for (let i = 0; i < n; i++) order[i] = i;
    return { sorted: Float64Array.from(values), order };
  }
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

function comparatorOrder(values: ArrayLike<number>): SortedWithOrder {
  const idx = Array.from({ length: values.length }, (_, i) => i);
  idx.sort((a, b) => values[a] - values[b] || a - b);
  const order = Uint32Array.from(idx);
  const sorted = new Float64Array(order.length);
  for (let i = 0; i < order.length; i++) sorted[i] = values[order[i]];
  return { sorted, order };
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
