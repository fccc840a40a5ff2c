import { covarianceCondition, type ConditionContext } from '../../../src/engine/linear/covariance-condition';
import { symmetricEigen } from '../../../src/engine/stats/symmetric-eigen';
import { isRemapError } from '../../../src/engine/errors';

const ctx: ConditionContext = { which: 'source', columns: null, rows: 50, ridge: 0, fn: 'fit (linear)' };

function message(cov: number[], d: number, c = ctx): string {
  try {
    covarianceCondition(symmetricEigen(cov, d), cov, c);
  } catch (e) {
    if (isRemapError(e) && e.kind === 'num') return e.message;
  }
  return 'no error';
}

describe('covarianceCondition(eig, cov, ctx) refuses singular covariances with advice', () => {
  test('a well-conditioned covariance returns its smallest/largest eigenvalue ratio', () => {
    // Source: hand computation (eigenvalues 1 and 4)
    expect(covarianceCondition(symmetricEigen([1, 0, 0, 4], 2), [1, 0, 0, 4], ctx)).toBe(0.25);
  });

  test('a constant column is named (by header when known) with a ridge suggestion scaled to the data', () => {
    const m = message([2, 0, 0, 0], 2, { ...ctx, columns: ['Height', 'Age'] });
    expect(m).toMatch(/the source covariance is singular or nearly so/);
    expect(m).toMatch(/"Age" is constant/);
    expect(m).toMatch(/remove that column/);
    // 1e-6 x (2 + 0) / 2
    expect(m).toMatch(/set ridge=0.000001 /);
  });

  test('collinear columns are named from the null direction', () => {
    // Column 3 = column 1 + column 2; eigenvector (1, 1, -1)/sqrt 3 for eigenvalue 0.
    const m = message([1, 0, 1, 0, 1, 1, 1, 1, 2], 3, { ...ctx, which: 'target' });
    expect(m).toMatch(/the target covariance/);
    expect(m).toMatch(/column 1, column 2, column 3 are \(nearly\) linear combinations of one another/);
  });

  test('too few rows for the columns is said so', () => {
    const m = message([1, 1, 1, 1], 2, { ...ctx, rows: 2 });
    expect(m).toMatch(/only 2 rows with positive weight for 2 columns/);
  });

  test('with a ridge already set, the advice is a larger ridge', () => {
    const m = message([1, 1, 1, 1 + 1e-14], 2, { ...ctx, ridge: 1e-20 });
    expect(m).toMatch(/the ridge 1e-20 is too small/);
  });

  test('all columns constant says the data must vary', () => {
    expect(message([0], 1)).toMatch(/every value is the same/);
  });
});
