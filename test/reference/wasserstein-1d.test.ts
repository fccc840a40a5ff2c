import { wasserstein1d } from '../../src/engine/stats/wasserstein-1d';

describe('reference: exact 1-D Wasserstein distances', () => {
  test('W1([0,1,3],[5,6,8]) = 5', () => {
    // Source: scipy.stats.wasserstein_distance documentation, example 1
    expect(wasserstein1d([0, 1, 3], [5, 6, 8], null, null, 1)).toBeCloseTo(5, 14);
  });

  test('W1([0,1],[0,1]) with weights [3,1] and [2,2] = 0.25', () => {
    // Source: scipy.stats.wasserstein_distance documentation, example 2
    expect(wasserstein1d([0, 1], [0, 1], [3, 1], [2, 2], 1)).toBeCloseTo(0.25, 14);
  });

  test('W1 of the weighted four-against-two example = 4.0781331438047861', () => {
    // Source: scipy.stats.wasserstein_distance documentation, example 3
    const d = wasserstein1d([3.4, 3.9, 7.5, 7.8], [4.5, 1.4], [1.4, 0.9, 3.1, 7.2], [3.2, 3.5], 1);
    expect(d).toBeCloseTo(4.0781331438047861, 13);
  });

  test('W2 of the weighted [0,1] example = 0.5 (W2^2 = 0.25)', () => {
    // Source: by hand, the quantile functions differ by 1 on u in (0.5, 0.75) only: W2^2 = 0.25
    expect(wasserstein1d([0, 1], [0, 1], [3, 1], [2, 2], 2)).toBeCloseTo(0.5, 14);
  });
});
