import { subsampleRows } from '../../../src/engine/entropic/subsample';

describe('subsample', () => {
  test('subsampleRows gives k distinct sorted indices in range, the same for the same seed', () => {
    const a = subsampleRows(1000, 50, 7);
    const b = subsampleRows(1000, 50, 7);
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(new Set(a).size).toBe(50);
    for (let i = 1; i < a.length; i++) expect(a[i]).toBeGreaterThan(a[i - 1]);
    expect(a[0]).toBeGreaterThanOrEqual(0);
    expect(a[49]).toBeLessThan(1000);
    expect(Array.from(subsampleRows(1000, 50, 8))).not.toEqual(Array.from(a));
  });

  test('subsampleRows returns every row when k >= n', () => {
    // Source: common practice.
    expect(Array.from(subsampleRows(4, 10, 1))).toEqual([0, 1, 2, 3]);
  });
});
