import { weightedQuantile } from 'simple-statistics';
import { cdfShare, stepQuantile, upperIndex, weightedCdf, weightedCdfSorted } from '../../../src/engine/stats/weighted-cdf';

describe('stats/weighted-cdf', () => {
  test('weightedCdf merges ties, drops zero weights and counts tied rows', () => {
    const c = weightedCdf(Object.freeze([4, 1, 1, 9]), Object.freeze([1, 1, 2, 0]));
    expect(Array.from(c.values)).toEqual([1, 4]);
    expect(Array.from(c.cumulative)).toEqual([3, 4]);
    expect(c.total).toBe(4);
    expect(c.rows).toBe(3);
    expect(c.tiedRows).toBe(2);
  });

  test('weightedCdfSorted rejects unsorted input and all-zero weights', () => {
    expect(() => weightedCdfSorted(Float64Array.of(2, 1), null)).toThrow(/sort the values first/);
    expect(() => weightedCdfSorted(Float64Array.of(1, 2), Float64Array.of(0, 0))).toThrow(/positive weight/);
  });

  test('cdfShare is the share of weight <= x (right-continuous)', () => {
    const c = weightedCdf([1, 2, 3, 4]);
    expect(cdfShare(c, 0)).toBe(0);
    expect(cdfShare(c, 2)).toBe(0.5); // Source: common practice (empirical CDF counts x itself)
    expect(cdfShare(c, 2.5)).toBe(0.5);
    expect(cdfShare(c, 9)).toBe(1);
  });

  test('stepQuantile agrees with simple-statistics weightedQuantile (first value whose cumulative weight reaches p)', () => {
    const x = [5, 1, 4, 4, 2, 8, 7];
    const w = [1, 2, 0.5, 1.5, 3, 0, 2];
    const c = weightedCdf(x, w);
    for (const p of [0, 0.01, 0.1, 0.2, 0.25, 0.5, 0.6, 0.9, 0.999, 1]) {
      // Source: simple-statistics weightedQuantile (inf{x : F(x) >= p})
      expect(stepQuantile(c, p)).toBe(weightedQuantile(x, w, p));
    }
    expect(() => stepQuantile(c, 1.5)).toThrow(/between 0 and 1/);
  });

  test('upperIndex finds the largest index with a[k] <= x', () => {
    const a = [1, 2, 2, 5];
    expect(upperIndex(a, 0)).toBe(-1);
    expect(upperIndex(a, 2)).toBe(2);
    expect(upperIndex(a, 4)).toBe(2);
    expect(upperIndex(a, 5)).toBe(3);
  });

  test('weightedCdfSorted with share: values is the sorted array itself only when every row is distinct and weighed; sorted is never written', () => {
    const distinct = Float64Array.of(1, 2, 5);
    const shared = weightedCdfSorted(distinct, null, true);
    expect(shared.values).toBe(distinct);
    expect(Array.from(shared.cumulative)).toEqual([1, 2, 3]);
    for (const [sorted, weights] of [
      [Float64Array.of(1, 2, 2, 5, 5, 6), null],
      [Float64Array.of(1, 2, 3, 4), Float64Array.of(1, 0, 2, 1)],
      [Float64Array.of(-0, 0, 3), Float64Array.of(1, 1, 1)],
    ] as const) {
      const before = sorted.slice();
      const a = weightedCdfSorted(sorted, weights, true);
      const b = weightedCdfSorted(sorted.slice(), weights, false);
      expect(a.values).not.toBe(sorted);
      expect(sorted).toEqual(before);
      expect(Array.from(a.values)).toEqual(Array.from(b.values));
      expect(Object.is(a.values[0], b.values[0])).toBe(true); // a -0/+0 block keeps its first value's sign
      expect(Array.from(a.cumulative)).toEqual(Array.from(b.cumulative));
      expect([a.total, a.rows, a.tiedRows]).toEqual([b.total, b.rows, b.tiedRows]);
    }
  });
});
