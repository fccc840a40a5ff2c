import { ordinalGrid } from '../../../src/engine/quantile/ordinal-grid';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/ordinal-grid', () => {
  test('each score spreads over [k - 0.5, k + 0.5]; an empty score inside the range is a flat stretch', () => {
    const g = ordinalGrid(weightedCdf([0, 0, 2, 3]));
    // Source: Kolen & Brennan, Test Equating, Scaling, and Linking, ch. 2 (continuised CDF), by hand
    expect(Array.from(g.v)).toEqual([-0.5, 0.5, 1.5, 2.5, 3.5]);
    expect(Array.from(g.p)).toEqual([0, 0.5, 0.5, 0.75, 1]);
  });

  test('a wide gap costs two points, not one per missing score', () => {
    const g = ordinalGrid(weightedCdf([0, 1000000]));
    expect(g.v.length).toBe(4);
    expect(Array.from(g.v)).toEqual([-0.5, 0.5, 999999.5, 1000000.5]);
  });
});
