import { isSortedAscending, sortedCopy, sortOrder, sortWithOrder, sortWithWeights } from '../../../src/engine/stats/sort';
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
});
