import { RemapError } from '../errors';
import { SINGULAR_RATIO } from '../stats/sqrtm';
import { symmetricEigen, type SymmetricEigen } from '../stats/symmetric-eigen';

/**
 * Covariances whose correlation matrix has a smallest/largest eigenvalue ratio below this are
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
  /** The ridge already added (0 when none), in the units of `units`. */
  readonly ridge: number;
  /** Calling function, for messages. */
  readonly fn: string;
  /** The units the covariance is in, which are the ridge's units (default 'raw'). */
  readonly units?: 'raw' | 'standardised';
  /** Per column: does it hold more than one value? A column that does not is constant, whatever rounding left in its variance. */
  readonly varies?: readonly boolean[];
}

/**
 * Judges a covariance on the correlation scale: the ratio of the smallest to
 * the largest eigenvalue of its correlation matrix (each column divided by its
 * own standard deviation), so that columns in different units (an income in
 * tens of thousands beside a rate in hundredths) do not look singular merely
 * because their variances differ by twelve orders of magnitude. A column with
 * zero variance, or a correlation ratio below SINGULAR_RATIO (1e-12), is
 * singular for our purposes: a RemapError says which sample, why (a constant
 * column, columns that are linear combinations of one another, too few rows),
 * and what to do (remove the column, or set a ridge that swamps no column: in
 * standardised units 1e-6, a millionth of each column's pooled variance; in
 * raw units 1e-6 times the smallest column variance). Returns the ratio when
 * it is acceptable.
 * Cost: O(d^3) (one symmetric eigendecomposition of the correlation matrix).
 * @param cov the covariance (row-major d x d, symmetric, ridge included).
 * @param d the number of columns.
 * @param ctx which sample, how to name columns, the units and the ridge.
 * @throws RemapError (kind 'num') when the covariance is singular or nearly so.
 * @example covarianceCondition([1, 0.5, 0.5, 1], 2, ctx) // 1/3: correlation eigenvalues 0.5 and 1.5
 */
export function covarianceCondition(cov: ArrayLike<number>, d: number, ctx: ConditionContext): number {
  const name = (k: number): string => (ctx.columns && ctx.columns[k] ? `"${ctx.columns[k]}"` : `column ${k + 1}`);
  const sd = new Float64Array(d);
  const constant: number[] = [];
  let minVar = Infinity;
  for (let k = 0; k < d; k++) {
    const v = cov[k * d + k];
    const flat = ctx.varies !== undefined && !ctx.varies[k] && !(ctx.ridge > 0);
    if (v > 0 && !flat) {
      sd[k] = Math.sqrt(v);
      minVar = Math.min(minVar, v);
    } else constant.push(k);
  }
  let ratio = 0;
  let eig: SymmetricEigen | null = null;
  if (constant.length === 0) {
    const corr = new Float64Array(d * d);
    for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) corr[k * d + l] = k === l ? 1 : cov[k * d + l] / (sd[k] * sd[l]);
    eig = symmetricEigen(corr, d);
    const hi = eig.values[d - 1];
    ratio = hi > 0 ? Math.max(0, eig.values[0]) / hi : 0;
    if (ratio >= SINGULAR_RATIO) return ratio;
  }

  let why: string;
  let fix: string;
  if (constant.length === d) {
    why = d === 1 ? 'every value is the same' : 'every column is constant';
    fix = 'give data that varies';
  } else if (constant.length > 0) {
    const list = constant.map(name).join(', ');
    why = `${list} ${constant.length === 1 ? 'is' : 'are'} constant`;
    fix = `remove ${constant.length === 1 ? 'that column' : 'those columns'}`;
  } else if (ctx.rows <= d) {
    why = `it has only ${ctx.rows} rows with positive weight for ${d} columns`;
    fix = 'give more rows than columns';
  } else {
    // The eigenvector of the smallest eigenvalue says which columns combine to (nearly) nothing.
    const vectors = (eig as SymmetricEigen).vectors;
    const involved: number[] = [];
    for (let k = 0; k < d; k++) if (Math.abs(vectors[k * d]) >= 0.1) involved.push(k);
    why = `${involved.map(name).join(', ')} are (nearly) linear combinations of one another`;
    fix = 'remove one of those columns';
  }
  const standardised = ctx.units === 'standardised';
  // A ridge relative to the smallest column variance (raw) or to each column's own variance (standardised) swamps no column.
  const suggested = standardised ? 1e-6 : Number.isFinite(minVar) ? Number((1e-6 * minVar).toPrecision(2)) : 1e-6;
  const where = standardised
    ? "a millionth of each column's pooled variance, since the fit is in standardised units"
    : Number.isFinite(minVar)
      ? 'a millionth of the smallest column variance'
      : 'the data has no varying column to scale it to';
  const ridgeAdvice =
    ctx.ridge > 0
      ? `the ridge ${ctx.ridge} is too small for this data; set a larger ridge (e.g. ridge=${Math.max(suggested, 10 * ctx.ridge)})`
      : `set ridge=${suggested} (${where}) to add a little to every variance`;
  const lead = `${ctx.fn}: the ${ctx.which} covariance is singular or nearly so (smallest/largest eigenvalue of the correlation matrix ${ratio.toPrecision(2)}, below ${SINGULAR_RATIO}) because ${why}.`;
  const what = constant.length === d ? ` To fit a linear map, ${fix}.` : ` To fit a linear map, ${fix}, or ${ridgeAdvice}.`;
  throw new RemapError(lead + what, 'num');
}
