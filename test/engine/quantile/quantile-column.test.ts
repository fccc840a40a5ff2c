import { quantileColumn, quantileColumnFromParams } from '../../../src/engine/quantile/quantile-column';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/quantile-column', () => {
  test('apply and invert read the same knots; ranges are the data ranges', () => {
    const c = quantileColumn(weightedCdf([1, 2, 3]), weightedCdf([10, 20, 40]), 'fit');
    // Source: equal sizes map the i-th smallest source value to the i-th smallest target value (fact of the trade)
    expect(Array.from(c.forward.vals)).toEqual([10, 20, 40]);
    expect(c.inverse.keys).toBe(c.forward.vals);
    expect([c.forward.lo, c.forward.hi, c.inverse.lo, c.inverse.hi]).toEqual([1, 3, 10, 40]);
  });

  test('params rebuild the same column; damaged params are refused', () => {
    const c = quantileColumn(weightedCdf([1, 2, 3, 7]), weightedCdf([10, 20, 40]), 'fit');
    const p = JSON.parse(JSON.stringify(c.params()));
    const back = quantileColumnFromParams(p, 'load');
    expect(Array.from(back.forward.keys)).toEqual(Array.from(c.forward.keys));
    expect(() => quantileColumnFromParams({ ...p, xs: [2, 1] }, 'load')).toThrow(/out of order/);
    expect(() => quantileColumnFromParams({ ...p, source: [5, 6] }, 'load')).toThrow(/does not cover the knots/);
  });

  test('a side with one distinct value is refused', () => {
    expect(() => quantileColumn(weightedCdf([1, 1]), weightedCdf([1, 2]), 'fit')).toThrow(/same value/);
  });
});
