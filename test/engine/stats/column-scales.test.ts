import { sample } from '../../../src/engine/points';
import { columnVariances, divideColumns, pooledColumnScales } from '../../../src/engine/stats/column-scales';
import { variance } from 'simple-statistics';

describe('pooledColumnScales(source, target): one spread per column shared by both samples', () => {
  test('is the square root of the mean of the two population variances', () => {
    const a = [3, 1, 4, 1, 5, 9, 2, 6];
    const b = [27, 18, 28, 18, 28, 45, 90, 45];
    const s = sample(a.map((x, i) => [x, 1000 * b[i]]));
    const t = sample(b.map((x, i) => [x, 0.01 * a[i]]));
    const got = pooledColumnScales(s, t);
    // Source: simple-statistics variance() is the population variance (divides by n).
    expect(got[0]).toBeCloseTo(Math.sqrt((variance(a) + variance(b)) / 2), 12);
    expect(got[1]).toBeCloseTo(Math.sqrt((variance(b.map((x) => 1000 * x)) + variance(a.map((x) => 0.01 * x))) / 2), 6);
  });
  test('weights count as frequencies, and a constant column gets 1', () => {
    // Source: a weight of 2 is the same as writing the row twice (frequency weights, common practice).
    const w = columnVariances(
      sample(
        [
          [1, 7],
          [2, 7],
          [4, 7],
        ],
        [1, 2, 1],
      ),
    );
    expect(w[0]).toBeCloseTo(variance([1, 2, 2, 4]), 14);
    expect(
      pooledColumnScales(
        sample([
          [1, 7],
          [2, 7],
        ]),
        sample([
          [3, 7],
          [5, 7],
        ]),
      )[1],
    ).toBe(1);
  });
  test('divideColumns returns new points and leaves its input alone', () => {
    const p = Object.freeze(
      sample([
        [2, 300],
        [4, 600],
      ]),
    );
    const q = divideColumns(p, Float64Array.from([2, 300]));
    expect(Array.from(q.data)).toEqual([1, 1, 2, 2]);
    expect(Array.from(p.data)).toEqual([2, 300, 4, 600]);
  });
});
