import { transportCost1d, transportCosts1d, wasserstein1d } from '../../../src/engine/stats/wasserstein-1d';
import { weightedCdf } from '../../../src/engine/stats/weighted-cdf';

describe('stats/wasserstein-1d', () => {
  test('W2^2 of a shift is the squared shift', () => {
    // Source: by hand, every quantile moves by 5, so W2^2 = 25 and W1 = 5
    expect(transportCost1d(weightedCdf([0, 1, 3]), weightedCdf([5, 6, 8]), 2)).toBe(25);
    expect(wasserstein1d([0, 1, 3], [5, 6, 8], null, null, 2)).toBe(5);
  });

  test('unequal sizes are integrated over merged cumulative shares', () => {
    // Source: by hand, quantiles of {1,2,3} and {2,4} on (0,1/3),(1/3,1/2),(1/2,2/3),(2/3,1) differ by 1,0,2,1:
    // W1 = 1/3 + 0 + 2/6 + 1/3 = 1 and W2^2 = 1/3 + 0 + 4/6 + 1/3 = 4/3
    const c = transportCosts1d(weightedCdf([3, 1, 2]), weightedCdf([4, 2]));
    expect(c.w1).toBeCloseTo(1, 14);
    expect(c.w2Squared).toBeCloseTo(4 / 3, 14);
    // Source: by hand, a point mass at 0 against {1, 3}: W2^2 = (1 + 9) / 2 = 5, W1 = 2
    expect(wasserstein1d([0], [1, 3], null, null, 2)).toBeCloseTo(Math.sqrt(5), 14);
    expect(wasserstein1d([0], [1, 3], null, null, 1)).toBe(2);
  });

  test('weights scale freely and zero weights drop rows', () => {
    const a = wasserstein1d([0, 1, 50], [2, 3], [1, 3, 0], [2, 2], 2);
    const b = wasserstein1d([0, 1], [2, 3], [10, 30], null, 2);
    expect(a).toBeCloseTo(b, 14);
  });

  test('the distance is symmetric and zero between a sample and itself', () => {
    const x = [3.2, -1, 7, 7, 0.5];
    const y = [1, 2, 2.5];
    expect(wasserstein1d(x, y, null, null, 1)).toBeCloseTo(wasserstein1d(y, x, null, null, 1), 14);
    expect(wasserstein1d(x, x, null, null, 2)).toBe(0);
  });

  test('bad arguments throw errors naming the argument', () => {
    expect(() => wasserstein1d([], [1], null, null, 1)).toThrow(/x is empty/);
    expect(() => wasserstein1d([1], [NaN], null, null, 1)).toThrow(/y\[0\] is NaN/);
    expect(() => wasserstein1d([1], [2], [-1], null, 1)).toThrow(/wx\[0\] is -1/);
    expect(() => wasserstein1d([1], [2], [0], null, 1)).toThrow(/at least one positive weight/);
    expect(() => wasserstein1d([1, 2], [2], [1], null, 1)).toThrow(/one weight per value/);
    expect(() => wasserstein1d([1], [2], null, null, 3 as 1)).toThrow(/give 1 or 2/);
  });
});
