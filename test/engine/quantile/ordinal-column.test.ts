import { ordinalColumn, ordinalColumnFromParams } from '../../../src/engine/quantile/ordinal-column';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/ordinal-column', () => {
  test('forward and inverse have their own knots (a flat stretch one way is a jump the other)', () => {
    const c = ordinalColumn(weightedCdf([0, 1]), weightedCdf([0, 2]));
    expect(Array.from(c.forward.keys)).toEqual([-0.5, 0.5, 0.5, 1.5]);
    // Source: by hand, inverse: y in [0.5, 1.5] has G* = 0.5, and F*^-1(0.5) = 0.5 (no flat in the source)
    expect(Array.from(c.inverse.keys)).toEqual([-0.5, 0.5, 1.5, 2.5]);
    expect(Array.from(c.inverse.vals)).toEqual([-0.5, 0.5, 0.5, 1.5]);
  });

  test('params rebuild the same column; damaged params are refused', () => {
    const c = ordinalColumn(weightedCdf([0, 1, 1, 3]), weightedCdf([0, 2, 2]));
    const p = JSON.parse(JSON.stringify(c.params()));
    const back = ordinalColumnFromParams(p, 'load');
    expect(Array.from(back.inverse.vals)).toEqual(Array.from(c.inverse.vals));
    expect(() => ordinalColumnFromParams({ ...p, ys: [1] }, 'load')).toThrow(/at least 2/);
  });
});
