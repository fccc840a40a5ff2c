import { covarianceCondition, type ConditionContext } from '../../../src/engine/linear/covariance-condition';
import { isRemapError } from '../../../src/engine/errors';

const ctx: ConditionContext = { which: 'source', columns: null, rows: 50, ridge: 0, fn: 'fit (linear)' };

function message(cov: number[], d: number, c = ctx): string {
  try {
    covarianceCondition(cov, d, c);
  } catch (e) {
    if (isRemapError(e) && e.kind === 'num') return e.message;
  }
  return 'no error';
}

describe('covarianceCondition(cov, d, ctx) judges on the correlation scale and refuses singular covariances with advice', () => {
  test('a well-conditioned covariance returns the smallest/largest eigenvalue ratio of its correlation matrix', () => {
    // Source: hand computation: correlation [[1, 0.5], [0.5, 1]] has eigenvalues 0.5 and 1.5
    expect(covarianceCondition([4, 1, 1, 1], 2, ctx)).toBeCloseTo(1 / 3, 14);
    // Source: hand computation: uncorrelated columns have correlation I, ratio 1, whatever their variances
    expect(covarianceCondition([1e9, 0, 0, 1e-4], 2, ctx)).toBe(1);
  });

  test('columns in very different units are not called singular (variances 4e8 and 1e-4, correlation 0.3)', () => {
    const c = 0.3 * Math.sqrt(4e8 * 1e-4);
    // Source: hand computation: correlation eigenvalues 0.7 and 1.3, ratio 7/13
    expect(covarianceCondition([4e8, c, c, 1e-4], 2, ctx)).toBeCloseTo(0.7 / 1.3, 12);
  });

  test('a constant column is named (by header when known) with a ridge suggestion that swamps no column', () => {
    const m = message([2, 0, 0, 0], 2, { ...ctx, columns: ['Height', 'Age'] });
    expect(m).toMatch(/the source covariance is singular or nearly so/);
    expect(m).toMatch(/"Age" is constant/);
    expect(m).toMatch(/remove that column/);
    // Source: design choice: 1e-6 x the smallest positive column variance (2)
    expect(m).toMatch(/set ridge=0.000002 \(a millionth of the smallest column variance\)/);
    // Source: design choice: in standardised units, 1e-6 of each column's pooled variance
    expect(message([2, 0, 0, 0], 2, { ...ctx, units: 'standardised' })).toMatch(/set ridge=0.000001 \(a millionth of each column's pooled variance/);
  });

  test('the suggested raw ridge stays far below the smallest variance of a table with an income and a rate', () => {
    const m = message([4e8, 0, 0, 0, 1e-4, 0, 0, 0, 0], 3);
    const ridge = Number(/set ridge=([0-9.e-]+)/.exec(m)?.[1]);
    // Source: design choice (never swamp a column): at most a millionth of the rate's variance 1e-4
    expect(ridge).toBeLessThanOrEqual(1e-10);
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
