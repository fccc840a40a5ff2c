import { RemapError } from '../errors';
import { spectralFunction, symmetricEigen, type SymmetricEigen } from './symmetric-eigen';

/**
 * Eigenvalues down to -PSD_TOLERANCE x (largest |eigenvalue|) count as rounding
 * noise of a positive semidefinite matrix and are set to zero; more negative
 * ones mean the matrix is not positive semidefinite.
 */
export const PSD_TOLERANCE = 1e-10;

/**
 * A positive semidefinite matrix whose smallest/largest eigenvalue ratio is
 * below SINGULAR_RATIO is treated as singular: at 1e-12 its inverse square root
 * would carry only about 4 correct digits (double precision has about 16).
 */
export const SINGULAR_RATIO = 1e-12;

/**
 * Eigendecomposition of a symmetric positive semidefinite matrix, with
 * eigenvalues at rounding level below zero set to zero (see PSD_TOLERANCE).
 * Cost: O(d^3). Never mutates `matrix`.
 * @param matrix row-major d x d, symmetric, finite.
 * @param d size, integer >= 1.
 * @param name how messages call the matrix (e.g. "cov1").
 * @param fn the calling function, for messages.
 * @throws RemapError (kind 'num') if an eigenvalue is clearly negative, or as `symmetricEigen` does.
 * @example psdEigen(Float64Array.from([1, 1, 1, 1]), 2, 'S', 'f').values // [0, 2] (the -1e-17 of rounding becomes 0)
 */
export function psdEigen(matrix: ArrayLike<number>, d: number, name: string, fn: string): SymmetricEigen {
  let eig: SymmetricEigen;
  try {
    eig = symmetricEigen(matrix, d);
  } catch (e) {
    if (e instanceof RemapError) throw new RemapError(`${fn}: ${name}: ${e.message}`, e.kind);
    throw e;
  }
  const { values } = eig;
  const scale = Math.max(Math.abs(values[0]), Math.abs(values[d - 1]));
  if (values[0] < -PSD_TOLERANCE * scale) {
    throw new RemapError(
      `${fn}: ${name} is not positive semidefinite (its smallest eigenvalue is ${values[0].toPrecision(4)}, its largest ${values[d - 1].toPrecision(4)}); give a covariance matrix.`,
      'num',
    );
  }
  const clipped = Float64Array.from(values, (x) => (x < 0 ? 0 : x));
  return { d, values: clipped, vectors: eig.vectors, sweeps: eig.sweeps };
}

/**
 * The symmetric positive semidefinite square root R of a symmetric PSD matrix
 * S (R R = S, R = V diag(sqrt(lambda)) V^T from the eigendecomposition).
 * Cost: O(d^3). Never mutates `matrix`.
 * @param matrix row-major d x d, symmetric (within SYMMETRY_TOLERANCE), PSD (within PSD_TOLERANCE), finite.
 * @param d size, integer >= 1.
 * @throws RemapError for a wrong shape, non-finite entries, asymmetry, or a negative eigenvalue.
 * @example psdSqrt(Float64Array.from([4, 0, 0, 9]), 2) // [2, 0, 0, 3]
 */
export function psdSqrt(matrix: ArrayLike<number>, d: number): Float64Array {
  return spectralFunction(psdEigen(matrix, d, 'the matrix', 'psdSqrt'), Math.sqrt);
}

/**
 * The inverse of the symmetric square root, S^(-1/2) = V diag(1/sqrt(lambda)) V^T,
 * of a symmetric positive definite matrix S.
 * Cost: O(d^3). Never mutates `matrix`.
 * @param matrix row-major d x d, symmetric, positive definite with smallest/largest eigenvalue >= SINGULAR_RATIO.
 * @param d size, integer >= 1.
 * @throws RemapError (kind 'num') if S is singular or nearly so, or as `psdSqrt` does.
 * @example psdInverseSqrt(Float64Array.from([4, 0, 0, 9]), 2) // [0.5, 0, 0, 1/3]
 */
export function psdInverseSqrt(matrix: ArrayLike<number>, d: number): Float64Array {
  const eig = psdEigen(matrix, d, 'the matrix', 'psdInverseSqrt');
  const lo = eig.values[0];
  const hi = eig.values[d - 1];
  if (!(hi > 0) || lo < SINGULAR_RATIO * hi) {
    throw new RemapError(
      `psdInverseSqrt: the matrix is singular or nearly so (smallest eigenvalue ${lo.toPrecision(3)}, largest ${hi.toPrecision(3)}, ratio below ${SINGULAR_RATIO}); it has no usable inverse square root.`,
      'num',
    );
  }
  return spectralFunction(eig, (x) => 1 / Math.sqrt(x));
}
