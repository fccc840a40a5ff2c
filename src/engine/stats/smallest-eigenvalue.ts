import { symmetricEigen } from './symmetric-eigen';

/**
 * The smallest eigenvalue of the symmetric part (A + A^T) / 2 of a d x d
 * matrix: the monotonicity certificate of a map's Jacobian (a map is monotone
 * where this is >= 0). Uses the cyclic Jacobi eigendecomposition of
 * symmetric-eigen.ts. O(d^3) per sweep. Never mutates `a`.
 * @param a row-major d x d, finite entries; d >= 1.
 * @example smallestEigenvalue(Float64Array.of(2, 1, 1, 2), 2) // 1
 */
export function smallestEigenvalue(a: ArrayLike<number>, d: number): number {
  const s = new Float64Array(d * d);
  for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) s[i * d + j] = 0.5 * (a[i * d + j] + a[j * d + i]);
  return symmetricEigen(s, d).values[0];
}
