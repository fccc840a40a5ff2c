import { columnRanges } from '../../../src/engine/linear/column-ranges';

describe('columnRanges(p, weights) is the per-column range over rows of positive weight', () => {
  test('unweighted: the per-column min and max', () => {
    // Source: hand computation
    const r = columnRanges({ n: 2, d: 2, data: Float64Array.from([1, 5, 3, 4]) }, null);
    expect(Array.from(r.min)).toEqual([1, 4]);
    expect(Array.from(r.max)).toEqual([3, 5]);
  });

  test('rows of weight zero do not widen the range; the input is not mutated', () => {
    const data = Float64Array.from([1, 5, 3, 4, 100, -100]);
    const r = columnRanges({ n: 3, d: 2, data }, Float64Array.from([1, 1, 0]));
    expect(Array.from(r.min)).toEqual([1, 4]);
    expect(Array.from(r.max)).toEqual([3, 5]);
    expect(Array.from(data)).toEqual([1, 5, 3, 4, 100, -100]);
  });
});
