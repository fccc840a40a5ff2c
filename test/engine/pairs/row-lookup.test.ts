import { RowLookup, rowHash } from '../../../src/engine/pairs/row-lookup';
import { points } from '../../../src/engine/points';

describe('RowLookup', () => {
  test('RowLookup groups identical rows by first appearance and counts them', () => {
    const look = new RowLookup(
      points([
        [1, 2],
        [3, 4],
        [1, 2],
        [5, 6],
        [3, 4],
        [1, 2],
      ]),
    );
    // Source: the rows themselves (groups in order of first appearance: [1,2], [3,4], [5,6])
    expect(look.groups).toBe(3);
    expect(Array.from(look.groupOf)).toEqual([0, 1, 0, 2, 1, 0]);
    expect(Array.from(look.groupFirst)).toEqual([0, 1, 3]);
    expect(Array.from(look.groupSize)).toEqual([3, 2, 1]);
  });

  test('RowLookup.find matches exact coordinates only, at any offset', () => {
    const look = new RowLookup(
      points([
        [1, 2],
        [3, 4],
      ]),
    );
    const q = Float64Array.from([9, 3, 4, 1, 2]);
    expect(look.find(q, 1)).toBe(1);
    expect(look.find(q, 3)).toBe(0);
    expect(look.find(q, 0)).toBe(-1);
    // One unit in the last place away is a different row.
    expect(look.find(Float64Array.from([3, 4 + 4 * Number.EPSILON]), 0)).toBe(-1);
    expect(look.find(Float64Array.from([2, 1]), 0)).toBe(-1);
  });

  test('RowLookup treats 0 and -0 as the same value and never matches NaN', () => {
    const look = new RowLookup(
      points([
        [0, -0],
        [NaN, 1],
      ]),
    );
    expect(look.find(Float64Array.from([-0, 0]), 0)).toBe(0);
    expect(look.find(Float64Array.from([NaN, 1]), 0)).toBe(-1);
    expect(rowHash(Float64Array.from([0]), 0, 1)).toBe(rowHash(Float64Array.from([-0]), 0, 1));
  });

  test('rowHash is a 32-bit unsigned number that changes with the row', () => {
    const a = rowHash(Float64Array.from([1, 2]), 0, 2);
    const b = rowHash(Float64Array.from([2, 1]), 0, 2);
    expect(a).toBeGreaterThanOrEqual(0);
    expect(a).toBeLessThan(2 ** 32);
    expect(Number.isInteger(a)).toBe(true);
    expect(a).not.toBe(b);
  });

  test('RowLookup finds every one of 5,000 distinct rows and does not mutate them', () => {
    const n = 5000;
    const data = new Float64Array(n * 3);
    for (let i = 0; i < n; i++) data.set([i % 17, Math.floor(i / 17), i * 0.1], i * 3);
    const before = data.slice();
    const look = new RowLookup({ n, d: 3, data });
    expect(look.groups).toBe(n);
    for (let i = 0; i < n; i++) expect(look.find(data, i * 3)).toBe(i);
    expect(data).toEqual(before);
  });
});
