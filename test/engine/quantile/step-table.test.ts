import { stepTable } from '../../../src/engine/quantile/step-table';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('quantile/step-table', () => {
  test('G^-1(F(x)) at each source value: results are target values', () => {
    // Source: by hand, F = 1/4, 2/4, 3/4, 1 and G^-1 of {10, 20} takes 10 up to share 1/2
    expect(Array.from(stepTable(weightedCdf([1, 2, 3, 4]), weightedCdf([10, 20])))).toEqual([10, 10, 20, 20]);
  });

  test('fractional weights that should add up to whole shares still pick the right value', () => {
    const tenths = weightedCdf([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], new Array(10).fill(0.1));
    const plain = weightedCdf([11, 12, 13, 14, 15, 16, 17, 18, 19, 20]);
    expect(Array.from(stepTable(tenths, plain))).toEqual([11, 12, 13, 14, 15, 16, 17, 18, 19, 20]);
  });
});
