import { stepColumn, stepColumnFromParams } from '../../../src/engine/quantile/step-column';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/step-column', () => {
  test('forward and inverse tables hold sample values of the other side', () => {
    const c = stepColumn(weightedCdf([1, 2, 3, 4]), weightedCdf([10, 20]), 'fit');
    expect(Array.from(c.forward.vals)).toEqual([10, 10, 20, 20]);
    expect(Array.from(c.inverse.vals)).toEqual([2, 4]); // Source: by hand, F^-1(1/2) = 2, F^-1(1) = 4
  });

  test('params rebuild the same column; damaged params are refused', () => {
    const c = stepColumn(weightedCdf([1, 2, 3]), weightedCdf([10, 20, 40]), 'fit');
    const p = JSON.parse(JSON.stringify(c.params()));
    expect(Array.from(stepColumnFromParams(p, 'load').forward.vals)).toEqual([10, 20, 40]);
    expect(() => stepColumnFromParams({ ...p, toTarget: [1, 2] }, 'load')).toThrow(/must match/);
    expect(() => stepColumnFromParams({ ...p, source: [1, null, 3] }, 'load')).toThrow(/not a finite number/);
  });
});
