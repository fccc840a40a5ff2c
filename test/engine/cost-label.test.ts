import { labelCost } from '../../src/engine/cost-label';
import { fitMapSync } from '../../src/engine/methods';
import { sample } from '../../src/engine/points';

describe("cost labels: exact only where the figure is the samples' squared W2", () => {
  const x = [
    [0, 0],
    [1, 2],
    [2, 1],
    [3, 3],
    [4, 0],
    [1, 1],
  ];
  const y = [
    [0, 1],
    [2, 0],
    [5, 1],
    [1, 4],
    [3, 2],
    [2, 2],
  ];

  test('one column with quantile, step or ordinal is exact; several columns are a lower bound', () => {
    for (const m of ['quantile', 'step', 'ordinal']) {
      // Source: the 1-D optimal coupling is the quantile coupling (Villani 2003, Topics in Optimal Transportation, thm 2.18)
      expect(fitMapSync(m, sample([0, 1, 3, 4]), sample([2, 2, 5, 9])).cost()).toMatchObject({ bound: 'exact', label: 'squared W2, exact' });
      // Source: the joint coupling's column marginals couple the columns, so the joint cost is at least the sum of the column costs
      expect(fitMapSync(m, sample(x), sample(y)).cost().bound).toBe('lower');
    }
  });

  test('the per-column sum is below the exact joint cost of the same equal-size samples (optimal assignment)', () => {
    const joint = fitMapSync('pairs', sample(x), sample(y)).cost();
    const perColumn = fitMapSync('quantile', sample(x), sample(y)).cost();
    expect(joint.bound).toBe('exact');
    // Source: the lower-bound argument above; the joint value is the assignment optimum found by hand-checkable
    // enumeration in test/reference/assignment.test.ts
    expect(perColumn.w2Squared).toBeLessThanOrEqual(joint.w2Squared + 1e-12);
  });

  test('the linear (Bures) figure is a lower bound on the exact cost (Gelbrich 1990)', () => {
    const bures = fitMapSync('linear', sample(x), sample(y), { units: 'raw' }).cost();
    const joint = fitMapSync('pairs', sample(x), sample(y)).cost();
    expect(bures.bound).toBe('lower');
    expect(bures.label).toMatch(/Gelbrich/);
    // Source: Gelbrich 1990, Math. Nachr. 147: W2 between the Gaussians with the same moments is at most W2 of the samples
    expect(bures.w2Squared).toBeLessThanOrEqual(joint.w2Squared + 1e-12);
  });

  test("kinds a method leaves unlabelled get their label; a method's own label is kept", () => {
    // Source: design choice (the defaults in cost-label.ts)
    expect(labelCost({ kind: 'sinkhorn-divergence', w2Squared: 1, w2: 1, note: '' }).bound).toBe('estimate');
    expect(labelCost({ kind: 'mapped', w2Squared: 1, w2: 1, note: '' }).label).toMatch(/not a distance to the target/);
    expect(labelCost({ kind: 'bures', w2Squared: 1, w2: 1, note: '', bound: 'estimate', label: 'x' })).toMatchObject({ bound: 'estimate', label: 'x' });
  });
});
