import { hazenGrid } from '../../../src/engine/quantile/hazen-grid';
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
});
