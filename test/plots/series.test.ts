import { extentOf, quantileOf, sortSeries } from '../../src/plots/series';

describe('sortSeries', () => {
  test('sorts values with their weights, leaves out non-finite values and non-positive weights, and never mutates inputs', () => {
    // Source: worked example
    const values = Object.freeze([3, NaN, 1, 2, 5]);
    const weights = Object.freeze([1, 1, 3, 0, 1]);
    const s = sortSeries({ name: 'a', values, weights });
    expect(Array.from(s.sorted)).toEqual([1, 3, 5]);
    expect(Array.from(s.cum)).toEqual([0.6, 0.8, 1]);
    expect(s.skipped).toBe(2);
  });
  test('throws when weights and values differ in length', () => {
    expect(() => sortSeries({ name: 'a', values: [1, 2], weights: [1] })).toThrow(/one weight per value/);
  });
});

describe('quantileOf', () => {
  test('is the inverse of the empirical CDF (R type 1)', () => {
    // Source: Hyndman & Fan (1996), definition 1
    const s = sortSeries({ name: 'a', values: [4, 1, 3, 2] });
    expect(quantileOf(s, 0.25)).toBe(1);
    expect(quantileOf(s, 0.26)).toBe(2);
    expect(quantileOf(s, 0.5)).toBe(2);
    expect(quantileOf(s, 1)).toBe(4);
    expect(quantileOf(sortSeries({ name: 'e', values: [] }), 0.5)).toBeNaN();
  });
  test('extentOf spans all non-empty series', () => {
    // Source: worked example
    expect(extentOf([sortSeries({ name: 'a', values: [1, 5] }), sortSeries({ name: 'b', values: [-2] }), sortSeries({ name: 'c', values: [] })])).toEqual([
      -2, 5,
    ]);
  });
});

describe('sortSeries on the weighted empirical distribution', () => {
  test('merges tied values, adding their weights, and counts every plotted row', () => {
    // Source: worked example (values 1, 2, 2 with weights 1, 1, 2: P(1) = 1/4, P(2) = 3/4)
    const s = sortSeries({ name: 't', values: [2, 1, 2], weights: [1, 1, 2] });
    expect(Array.from(s.sorted)).toEqual([1, 2]);
    expect(Array.from(s.cum)).toEqual([0.25, 1]);
    expect(Array.from(s.share)).toEqual([0.25, 0.75]);
    expect(s.rows).toBe(3);
    expect(quantileOf(s, 0.25)).toBe(1);
    expect(quantileOf(s, 0.26)).toBe(2);
  });
});
