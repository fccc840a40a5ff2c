import { RemapError } from '../errors';
import { SINGULAR_RATIO } from '../stats/sqrtm';
import type { SymmetricEigen } from '../stats/symmetric-eigen';

/**
 * Covariances whose smallest/largest eigenvalue ratio is below this are
 * accepted but flagged: the map then stretches a direction the data barely
 * spans by a factor of 1e4 or more, so noise along it is magnified.
 */
export const ILL_CONDITIONED_RATIO = 1e-8;

/** What the caller knows about the sample whose covariance is judged. */
export interface ConditionContext {
  /** "source" or "target". */
  readonly which: string;
  /** Column names, or null for "column 1", "column 2", ... */
  readonly columns: readonly string[] | null;
  /** Rows with positive weight. */
  readonly rows: number;
  /** The ridge already added (0 when none). */
  readonly ridge: number;
  /** Calling function, for messages. */
  readonly fn: string;
}

/**
 * Judges a covariance by the ratio of its smallest to its largest eigenvalue:
 * below SINGULAR_RATIO (1e-12) it is singular for our purposes and a
 * RemapError says which sample, why (a constant column, columns that are
 * linear combinations of one another, too few rows), and what to do (remove
 * the column, or set ridge to a suggested value scaled to the data). Returns
 * the ratio when it is acceptable.
 * Cost: O(d^2) given the eigendecomposition.
 * @param eig eigendecomposition of the covariance (ascending eigenvalues).
 * @param cov the covariance itself (row-major d x d), for the column variances.
 * @param ctx which sample and how to name columns.
 * @throws RemapError (kind 'num') when the covariance is singular or nearly so.
 * @example covarianceCondition(symmetricEigen([1, 0, 0, 4], 2), [1, 0, 0, 4], ctx) // 0.25
 */
export function covarianceCondition(eig: SymmetricEigen, cov: ArrayLike<number>, ctx: ConditionContext): number {
  const { d, values, vectors } = eig;
  const lo = values[0];
  const hi = values[d - 1];
  const ratio = hi > 0 ? Math.max(0, lo) / hi : 0;
  if (ratio >= SINGULAR_RATIO) return ratio;

  const name = (k: number): string => (ctx.columns && ctx.columns[k] ? `"${ctx.columns[k]}"` : `column ${k + 1}`);
  let maxVar = 0;
  let trace = 0;
  for (let k = 0; k < d; k++) {
    maxVar = Math.max(maxVar, cov[k * d + k]);
    trace += Math.max(0, cov[k * d + k]);
  }
  const constant: number[] = [];
  for (let k = 0; k < d; k++) if (!(cov[k * d + k] > SINGULAR_RATIO * maxVar)) constant.push(k);

  let why: string;
  let fix: string;
  if (maxVar === 0 || !(hi > 0)) {
    why = d === 1 ? 'every value is the same' : 'every column is constant';
    fix = 'give data that varies';
  } else if (constant.length > 0) {
    const list = constant.map(name).join(', ');
    why = `${list} ${constant.length === 1 ? 'is' : 'are'} constant (or tiny next to the other columns)`;
    fix = `remove ${constant.length === 1 ? 'that column' : 'those columns'} (or rescale ${constant.length === 1 ? 'it' : 'them'})`;
  } else if (ctx.rows <= d) {
    why = `it has only ${ctx.rows} rows with positive weight for ${d} columns`;
    fix = 'give more rows than columns';
  } else {
    // The eigenvector of the smallest eigenvalue says which columns combine to (nearly) nothing.
    const involved: number[] = [];
    for (let k = 0; k < d; k++) if (Math.abs(vectors[k * d]) >= 0.1) involved.push(k);
    why = `${involved.map(name).join(', ')} are (nearly) linear combinations of one another`;
    fix = 'remove one of those columns';
  }
  const suggested = trace > 0 ? Number(((1e-6 * trace) / d).toPrecision(2)) : 1e-6;
  const ridgeAdvice =
    ctx.ridge > 0
      ? `the ridge ${ctx.ridge} is too small for this data; set a larger ridge (e.g. ridge=${Math.max(suggested, 10 * ctx.ridge)})`
      : `set ridge=${suggested} (about 1e-6 times the average variance) to add a little to every variance`;
  const lead = `${ctx.fn}: the ${ctx.which} covariance is singular or nearly so (smallest/largest eigenvalue ${ratio.toPrecision(2)}, below ${SINGULAR_RATIO}) because ${why}.`;
  const what = trace > 0 ? ` To fit a linear map, ${fix}, or ${ridgeAdvice}.` : ` To fit a linear map, ${fix}.`;
  throw new RemapError(lead + what, 'num');
}
