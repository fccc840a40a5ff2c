import { RemapError } from '../errors';

/** Variances outside [MIN_VARIANCE, MAX_VARIANCE] cannot go through the Bures formula in doubles. */
export const MIN_VARIANCE = 1e-290;
/** sqrt(S1) S2 sqrt(S1) multiplies the two covariances: their largest variances' product must stay finite. */
export const MAX_VARIANCE_PRODUCT = 1e290;

/**
 * Refuses data whose size the linear map cannot handle in double precision,
 * before the eigen solvers meet Infinity, NaN or variances that underflowed to
 * zero (which would be reported as "constant" columns): a column that varies
 * but whose variance is below 1e-290 (values near 1e-145 or closer together),
 * covariances whose smallest variances multiply below 1e-290 (sqrt(S1) S2
 * sqrt(S1) would underflow to zero), or whose largest multiply beyond 1e290.
 * Cost: O(d).
 * @param var1,var2 the diagonals of the two covariances (before any ridge).
 * @param varies1,varies2 per column: does it hold more than one value (over rows of positive weight)?
 * @throws RemapError (kind 'num') saying which sample and column, and to rescale.
 * @example checkLinearScale([1e-300], [1], [true], [true], 'fit (linear)') // throws: rescale
 */
export function checkLinearScale(var1: ArrayLike<number>, var2: ArrayLike<number>, varies1: ArrayLike<boolean>, varies2: ArrayLike<boolean>, fn: string): void {
  let big1 = 0;
  let big2 = 0;
  for (const [v, varies, name] of [
    [var1, varies1, 'source'],
    [var2, varies2, 'target'],
  ] as const) {
    for (let k = 0; k < v.length; k++) {
      if (varies[k] && !(v[k] >= MIN_VARIANCE)) {
        throw new RemapError(
          `${fn}: column ${k + 1} of the ${name} varies, but by so little that its variance (${v[k].toPrecision(2)}) is below what double precision can square; rescale the columns (for example multiply them by 1e6) and fit again.`,
          'num',
        );
      }
    }
  }
  let small1 = Infinity;
  let small2 = Infinity;
  for (let k = 0; k < var1.length; k++) {
    big1 = Math.max(big1, var1[k]);
    if (varies1[k]) small1 = Math.min(small1, var1[k]);
  }
  for (let k = 0; k < var2.length; k++) {
    big2 = Math.max(big2, var2[k]);
    if (varies2[k]) small2 = Math.min(small2, var2[k]);
  }
  if (small1 * small2 < MIN_VARIANCE) {
    throw new RemapError(
      `${fn}: the variances are too small to combine in double precision (smallest source variance ${small1.toPrecision(2)}, target ${small2.toPrecision(2)}); rescale the columns (for example multiply them by 1e6) and fit again.`,
      'num',
    );
  }
  if (!(big1 * big2 <= MAX_VARIANCE_PRODUCT)) {
    throw new RemapError(
      `${fn}: the variances are too large to combine in double precision (largest source variance ${big1.toPrecision(2)}, target ${big2.toPrecision(2)}); rescale the columns (for example to thousands or millions) and fit again.`,
      'num',
    );
  }
}
