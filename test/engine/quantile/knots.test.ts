import { buildKnots } from '../../../src/engine/quantile/knots';
import { hazenGrid } from '../../../src/engine/quantile/hazen-grid';
import { ordinalGrid } from '../../../src/engine/quantile/ordinal-grid';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/knots', () => {
  test('equal sizes: the knots pair the i-th smallest values', () => {
    const k = buildKnots(hazenGrid(weightedCdf([3, 1, 2])), hazenGrid(weightedCdf([30, 10, 20])), true);
    expect(Array.from(k.xs)).toEqual([1, 2, 3]);
    expect(Array.from(k.ys)).toEqual([10, 20, 30]);
  });

  test('unequal sizes: knots at the union of positions within the shared range', () => {
    const k = buildKnots(hazenGrid(weightedCdf([1, 2])), hazenGrid(weightedCdf([0, 1, 2, 3])), true);
    // Source: by hand. Source positions 0.25, 0.75; target 0.125..0.875; shared range [0.25, 0.75]:
    // at 0.25 x = 1, y = 0.5; at 0.375 x = 1.25, y = 1; at 0.625 x = 1.75, y = 2; at 0.75 x = 2, y = 2.5
    expect(Array.from(k.xs)).toEqual([1, 1.25, 1.75, 2]);
    expect(Array.from(k.ys)).toEqual([0.5, 1, 2, 2.5]);
  });

  test('strict knots increase strictly on both sides', () => {
    const a = weightedCdf([0.1, 0.5, 0.9, 1.7, 2.2, 3], [1, 2, 3, 1, 1, 5]);
    const b = weightedCdf([5, 6, 9, 11], [1, 1, 1, 7]);
    const k = buildKnots(hazenGrid(a), hazenGrid(b), true);
    for (let i = 1; i < k.xs.length; i++) {
      expect(k.xs[i]).toBeGreaterThan(k.xs[i - 1]);
      expect(k.ys[i]).toBeGreaterThan(k.ys[i - 1]);
    }
  });

  test('a flat stretch on the target side becomes a jump to its upper end', () => {
    // Target {0, 2}: score 1 is empty, so share 0.5 spans y in [0.5, 1.5]
    const k = buildKnots(ordinalGrid(weightedCdf([0, 1])), ordinalGrid(weightedCdf([0, 2])), false);
    // Source: Kolen & Brennan ch. 2 rule "smallest score with cumulative share above P", by hand
    expect(Array.from(k.xs)).toEqual([-0.5, 0.5, 0.5, 1.5]);
    expect(Array.from(k.ys)).toEqual([-0.5, 0.5, 1.5, 2.5]);
  });
});
