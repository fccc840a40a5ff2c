import { twoCycleCheck } from '../../../src/engine/pairs/two-cycle-check';
import { column, points } from '../../../src/engine/points';

describe('twoCycleCheck', () => {
  test('twoCycleCheck gives <x_i - x_j, y_s(i) - y_s(j)> of a crossed 1-D pair: (0 - 1)(7 - 5) = -2', () => {
    // Source: computed by hand.
    const r = twoCycleCheck(column([0, 1]), column([5, 7]), Int32Array.from([1, 0]));
    expect(r.smallest).toBe(-2);
    expect(r.worst).toEqual([0, 1]);
    expect(r.passed).toBe(false);
    expect(r.exhaustive).toBe(true);
    expect(r.pairs).toBe(1);
  });

  test('twoCycleCheck passes the sorted 1-D matching with smallest >= 0', () => {
    const x = column([3, 1, 2, 5]);
    const y = column([10, 40, 20, 30]);
    // Sorted matching: 1->10, 2->20, 3->30, 5->40.
    const r = twoCycleCheck(x, y, Int32Array.from([3, 0, 2, 1]));
    expect(r.passed).toBe(true);
    expect(r.smallest).toBeGreaterThan(0);
    expect(r.pairs).toBe(6);
  });

  test('twoCycleCheck tolerance is 1e-9 times the squared diameter of both samples', () => {
    const r = twoCycleCheck(
      points([
        [0, 0],
        [3, 0],
      ]),
      points([
        [0, 4],
        [1, 1],
      ]),
      Int32Array.from([0, 1]),
    );
    // Source: computed by hand: column ranges 0..3 and 0..4, so diameter^2 = 9 + 16 = 25.
    expect(r.tolerance).toBeCloseTo(25e-9, 20);
  });

  test('twoCycleCheck samples pairs with a seed when n(n-1)/2 exceeds maxPairs, the same pairs every run', () => {
    const n = 100;
    const x = column(Array.from({ length: n }, (_, i) => i));
    const y = column(Array.from({ length: n }, (_, i) => (i * 37) % n)); // a scrambled matching
    const ident = Int32Array.from({ length: n }, (_, i) => i);
    const a = twoCycleCheck(x, y, ident, { maxPairs: 500, seed: 4 });
    const b = twoCycleCheck(x, y, ident, { maxPairs: 500, seed: 4 });
    expect(a.exhaustive).toBe(false);
    expect(a.pairs).toBe(500);
    expect(a).toEqual(b);
    expect(a.smallest).toBeLessThan(0);
    const all = twoCycleCheck(x, y, ident);
    expect(all.exhaustive).toBe(true);
    expect(all.pairs).toBe((n * (n - 1)) / 2);
    expect(all.smallest).toBeLessThanOrEqual(a.smallest);
  });

  test('twoCycleCheck of one row checks no pair and passes', () => {
    const r = twoCycleCheck(column([1]), column([2]), Int32Array.from([0]));
    expect(r).toMatchObject({ smallest: 0, worst: null, pairs: 0, passed: true });
  });

  test('twoCycleCheck rejects a wrong-length or out-of-range matching and bad maxPairs', () => {
    expect(() => twoCycleCheck(column([1, 2]), column([1, 2]), Int32Array.from([0]))).toThrow(/1 entries for 2 source rows/);
    expect(() => twoCycleCheck(column([1, 2]), column([1, 2]), Int32Array.from([0, 2]))).toThrow(/entry 2 of the matching is 2/);
    expect(() => twoCycleCheck(column([1]), column([1]), Int32Array.from([0]), { maxPairs: 0 })).toThrow(/maxPairs/);
    expect(() => twoCycleCheck(points([[1, 2]]), column([1]), Int32Array.from([0]))).toThrow(/columns/);
  });
});
