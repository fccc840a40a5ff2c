import { isSortedAscending, RADIX_MIN, radixSort, sortedCopy, sortOrder, sortWithOrder, sortWithWeights } from '../../../src/engine/stats/sort';
import { RemapError } from '../../../src/engine/errors';

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Same length and the same bits, -0 and +0 told apart. */
function sameBits(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

const isNegative = (v: number) => v < 0 || Object.is(v, -0);

/** The order `sortOrder` promises, by a comparator: value (-0 before +0), then rows up for v >= +0, down for negatives. */
function referenceOrder(v: ArrayLike<number>): number[] {
  const idx = Array.from({ length: v.length }, (_, i) => i);
  return idx.sort((a, b) => {
    const x = v[a];
    const y = v[b];
    if (x !== y) return x < y ? -1 : 1;
    if (isNegative(x) !== isNegative(y)) return isNegative(x) ? -1 : 1;
    return isNegative(x) ? b - a : a - b;
  });
}

/** Test columns: random, tied, negative, signed zeros, subnormal and huge values. */
function columns(n: number, seed: number): Record<string, Float64Array> {
  const r = rng(seed);
  const make = (f: (i: number) => number) => Float64Array.from({ length: n }, (_, i) => f(i));
  return {
    random: make(() => (r() - 0.5) * 1e6),
    positive: make(() => 50 + 10 * (r() + r() + r() - 1.5)),
    tied: make(() => Math.floor(r() * 7) - 3),
    negativeTied: make(() => -Math.floor(r() * 5) * 0.25),
    zeros: make((i) => (i % 3 === 0 ? -0 : i % 3 === 1 ? 0 : (r() - 0.5) * 1e-300)),
    subnormal: make(() => (r() - 0.5) * 4 * Number.MIN_VALUE * 1e6),
    huge: make(() => (r() < 0.5 ? -1 : 1) * Number.MAX_VALUE * r()),
    mixedScales: make(() => (r() - 0.5) * 10 ** Math.floor(r() * 600 - 300)),
    allEqualNegative: make(() => -2.5),
    allEqual: make(() => 7),
  };
}

describe('stats/sort', () => {
  test('isSortedAscending accepts ties and rejects a descent', () => {
    expect(isSortedAscending([1, 1, 2])).toBe(true);
    expect(isSortedAscending([1, 3, 2])).toBe(false);
    expect(isSortedAscending([])).toBe(true);
  });

  test('sortedCopy sorts numerically into a new array and leaves the input alone', () => {
    const input = Object.freeze([10, 9, 100, -1]);
    const out = sortedCopy(input);
    expect(Array.from(out)).toEqual([-1, 9, 10, 100]); // Source: common practice (numeric, not text, order)
    expect(input).toEqual([10, 9, 100, -1]);
  });

  test('sortOrder gives the permutation that sorts, for negative, tied and crowded values', () => {
    const r = rng(3);
    const v = new Float64Array(5000);
    for (let i = 0; i < v.length; i++) v[i] = i % 7 === 0 ? 1 + (i % 3) * Number.EPSILON : (r() - 0.5) * 1e6;
    v[10] = -0;
    v[11] = 0;
    const before = v.slice();
    const order = sortOrder(v);
    expect(v).toEqual(before);
    const expected = Array.from(v).sort((a, b) => a - b);
    expect(Array.from(order, (i) => v[i])).toEqual(expected); // Source: Array.prototype.sort with a numeric comparator
    expect(new Set(order).size).toBe(v.length);
  });

  test('sortWithOrder returns the sorted values with the order, and falls back when values crowd within ulps', () => {
    const n = 3000;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = 1 + ((n - i) % 1024) * Number.EPSILON; // differ only in the lowest bits
    const { sorted, order } = sortWithOrder(v);
    for (let i = 1; i < n; i++) expect(sorted[i] >= sorted[i - 1]).toBe(true);
    for (let i = 0; i < n; i++) expect(sorted[i]).toBe(v[order[i]]);
  });

  test('sortWithWeights keeps each weight with its value', () => {
    const values = Object.freeze([3, 1, 2, 1]);
    const weights = Object.freeze([30, 10, 20, 11]);
    const s = sortWithWeights(values, weights);
    expect(Array.from(s.values)).toEqual([1, 1, 2, 3]);
    const pairs = Array.from(s.values, (x, i) => `${x}:${s.weights[i]}`).sort();
    expect(pairs).toEqual(['1:10', '1:11', '2:20', '3:30']);
  });

  test('sortOrder rejects a non-finite value and sortWithWeights a length mismatch', () => {
    expect(() => sortOrder([1, NaN])).toThrow(RemapError);
    expect(() => sortOrder([1, Infinity])).toThrow(/value 2 is Infinity/);
    expect(() => sortWithWeights([1, 2], [1])).toThrow(/1 weights were given for 2 values/);
  });

  test('radixSort sorts exactly as Float64Array.prototype.sort does, bit for bit (-0 before +0, subnormal and huge values)', () => {
    for (const n of [1, 2, 37, 1000, RADIX_MIN + 11]) {
      for (const [name, v] of Object.entries(columns(n, n))) {
        const before = v.slice();
        const plain = radixSort(v, false);
        const withOrder = radixSort(v, true);
        const expected = v.slice().sort(); // Source: Float64Array.prototype.sort (ECMAScript TypedArray SortCompare)
        expect([name, sameBits(plain?.sorted ?? [], expected)]).toEqual([name, true]);
        expect([name, sameBits(withOrder?.sorted ?? [], expected)]).toEqual([name, true]);
        expect(plain?.order).toBeNull();
        expect(sameBits(v, before)).toBe(true); // the input is never written
      }
    }
  });

  test('radixSort carries the rows: sorted[i] is values[order[i]], ties in the order sortOrder promises', () => {
    for (const n of [3, 500, RADIX_MIN + 5]) {
      for (const [name, v] of Object.entries(columns(n, 7 * n))) {
        const r = radixSort(v, true);
        const order = r?.order ?? new Uint32Array(0);
        expect([
          name,
          sameBits(
            Array.from(order, (i) => v[i]),
            r?.sorted ?? [],
          ),
        ]).toEqual([name, true]);
        // Source: common practice (a stable sort), with negative ties reversed as the packed sort gave them
        expect([name, Array.from(order)]).toEqual([name, referenceOrder(v)]);
      }
    }
  });

  test('radixSort refuses NaN and infinite values by returning null', () => {
    const v = columns(RADIX_MIN, 1).random;
    for (const bad of [NaN, Infinity, -Infinity]) {
      const w = v.slice();
      w[100] = bad;
      expect(radixSort(w, true)).toBeNull();
      expect(radixSort(w, false)).toBeNull();
    }
  });

  test('sortWithOrder and sortedCopy give the same result below and above RADIX_MIN', () => {
    for (const [name, big] of Object.entries(columns(RADIX_MIN + 100, 99))) {
      const frozen = Object.freeze(Array.from(big)); // a plain list takes the same path as a typed array
      const large = sortWithOrder(frozen);
      const identity = Array.from(big, (_, i) => i);
      // Input already ascending keeps its rows in place (ties included); else the tie rule applies.
      expect([name, Array.from(large.order)]).toEqual([name, isSortedAscending(big) ? identity : referenceOrder(big)]);
      expect([name, sameBits(sortedCopy(big), big.slice().sort())]).toEqual([name, true]);
      // the packed sort (below RADIX_MIN) on a slice: the same rule
      const small = big.subarray(0, RADIX_MIN - 1);
      expect([name, Array.from(sortWithOrder(small).order)]).toEqual([
        name,
        isSortedAscending(small) ? identity.slice(0, small.length) : referenceOrder(small),
      ]);
      expect([name, sameBits(sortedCopy(small), small.slice().sort())]).toEqual([name, true]);
    }
    expect(() => sortWithOrder(Float64Array.from({ length: RADIX_MIN }, (_, i) => (i === 4000 ? NaN : -i)))).toThrow(/value 4001 is NaN/);
  });

  test('the comparator fallback for crowded values keeps the same tie rule', () => {
    const n = 3000;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = (i % 2 === 0 ? -1 : 1) * (1 + ((n - i) % 512) * Number.EPSILON); // ties that differ only in the lowest bits
    expect(Array.from(sortOrder(v))).toEqual(referenceOrder(v));
  });
});
