import { hazenGrid, sameHazenGrids } from '../../../src/engine/quantile/hazen-grid';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/hazen-grid', () => {
  test('equal weights give Hazen positions (i - 0.5) / n', () => {
    const g = hazenGrid(weightedCdf([40, 10, 30, 20]));
    // Source: Hazen plotting position (i - 0.5)/n, type 5 in Hyndman & Fan (1996)
    expect(Array.from(g.p)).toEqual([0.125, 0.375, 0.625, 0.875]);
    expect(Array.from(g.v)).toEqual([10, 20, 30, 40]);
  });

  test('a tie block sits at the middle of its cumulative weight', () => {
    const g = hazenGrid(weightedCdf([1, 2, 2, 2, 3]));
    // Source: by hand, the block of three 2s covers shares (0.2, 0.8): midpoint 0.5
    expect(Array.from(g.p)).toEqual([0.1, 0.5, 0.9]);
  });

  test('weights: p = (C_prev + C) / (2W)', () => {
    const g = hazenGrid(weightedCdf([1, 2], [3, 1]));
    expect(Array.from(g.p)).toEqual([0.375, 0.875]); // Source: by hand, (0 + 3)/8 and (3 + 4)/8
  });

  test('sameHazenGrids is true only when both grids are bit-identical and strictly increasing, and is for equal sizes and weights', () => {
    const grids = (a: ReturnType<typeof weightedCdf>, b: ReturnType<typeof weightedCdf>) => {
      const p = hazenGrid(a).p;
      const q = hazenGrid(b).p;
      return p.length === q.length && p.every((x, i) => x === q[i] && (i === 0 || x > p[i - 1]));
    };
    const cases: [number[], number[] | null, number[], number[] | null][] = [
      [[1, 2, 3], null, [10, 40, 20], null],
      [[1, 2, 3], null, [10, 20], null],
      [[1, 2, 2], null, [10, 20, 30], null],
      [
        [1, 2, 3],
        [1, 2, 3],
        [4, 5, 6],
        [1, 2, 3],
      ],
      [
        [1, 2, 3],
        [1, 2, 3],
        [4, 5, 6],
        [3, 2, 1],
      ],
      [
        [1, 2, 3],
        [2, 4, 6],
        [4, 5, 6],
        [1, 2, 3],
      ],
      [
        [1, 2, 3, 4],
        [1, 1e-300, 1e-300, 1],
        [4, 5, 6, 7],
        [1, 1e-300, 1e-300, 1],
      ],
    ];
    for (const [x, wx, y, wy] of cases) {
      const a = weightedCdf(x, wx);
      const b = weightedCdf(y, wy);
      if (sameHazenGrids(a, b)) expect([x, wx, y, wy, grids(a, b)]).toEqual([x, wx, y, wy, true]);
      // equal sizes, no ties, the same weights (or none): always recognised
      if (x.length === y.length && JSON.stringify(wx) === JSON.stringify(wy) && a.values.length === x.length && b.values.length === y.length && grids(a, b)) {
        expect([x, wx, y, wy, sameHazenGrids(a, b)]).toEqual([x, wx, y, wy, true]);
      }
    }
    expect(sameHazenGrids(weightedCdf([1, 2]), weightedCdf([5, 9]))).toBe(true);
    expect(sameHazenGrids(weightedCdf([1, 2, 3]), weightedCdf([10, 20]))).toBe(false);
    // Scaled weights give the same positions but different totals: not recognised here (buildKnots still finds them).
    expect(sameHazenGrids(weightedCdf([1, 2, 3], [2, 4, 6]), weightedCdf([4, 5, 6], [1, 2, 3]))).toBe(false);
    const tiny = [1, 1e-300, 1e-300, 1];
    // Source: by hand, 1 + 1e-300 rounds to 1, so cumulative weights 1, 1, 1, 2 put two positions at 0.5
    expect(sameHazenGrids(weightedCdf([1, 2, 3, 4], tiny), weightedCdf([4, 5, 6, 7], tiny))).toBe(false);
  });
});
