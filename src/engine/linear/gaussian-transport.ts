import { psdEigen } from '../stats/sqrtm';
import { spectralFunction, symmetricEigen, type SymmetricEigen } from '../stats/symmetric-eigen';

/** The optimal linear map between two Gaussians, and its cost. */
export interface GaussianTransport {
  /** A, symmetric positive definite, row-major d x d. */
  readonly matrix: Float64Array;
  /** A^-1, symmetric positive definite, row-major d x d. */
  readonly inverse: Float64Array;
  /** Smallest eigenvalue of A (> 0). */
  readonly minEigenvalue: number;
  /** tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2), clamped at 0. */
  readonly covarianceTerm: number;
}

/**
 * The matrix of the optimal (squared-Euclidean-cost) transport map between
 * N(m1, S1) and N(m2, S2) with S1 positive definite, T(x) = m2 + A (x - m1) with
 *   A = S1^-1/2 (S1^1/2 S2 S1^1/2)^1/2 S1^-1/2
 * (Knott & Smith, "On the optimal mapping of distributions", J. Optim. Theory
 * Appl. 43, 1984; Olkin & Pukelsheim, "The distance between two random
 * vectors with given dispersion matrices", Linear Algebra Appl. 48, 1982),
 * and the covariance part of the squared 2-Wasserstein (Bures) distance,
 * tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2) (Dowson & Landau, "The Frechet
 * distance between multivariate normal distributions", J. Multivariate Anal.
 * 12, 1982). A is symmetric positive definite and A S1 A = S2; it is inverted
 * by its own eigendecomposition.
 * Cost: O(d^3) (three symmetric eigendecompositions). Never mutates its inputs.
 * @param eig1 eigendecomposition of S1 (already judged non-singular by the caller).
 * @param s1 S1, s2 S2: row-major d x d, symmetric; S2 positive definite for an invertible A.
 * @throws RemapError if S2 is clearly not PSD, or A is not invertible (S2 singular).
 * @example gaussianTransport(symmetricEigen([1, 0, 0, 1], 2), [1, 0, 0, 1], [4, 0, 0, 9]).matrix // [2, 0, 0, 3]
 */
export function gaussianTransport(eig1: SymmetricEigen, s1: ArrayLike<number>, s2: ArrayLike<number>): GaussianTransport {
  const d = eig1.d;
  const root1 = spectralFunction(eig1, Math.sqrt);
  const invRoot1 = spectralFunction(eig1, (x) => 1 / Math.sqrt(x));
  const inner = symmetrise(product3(root1, s2, root1, d), d);
  const innerEig = psdEigen(inner, d, 'S1^1/2 S2 S1^1/2', 'gaussianTransport');
  const innerRoot = spectralFunction(innerEig, Math.sqrt);
  let traceRoot = 0;
  for (let j = 0; j < d; j++) traceRoot += Math.sqrt(innerEig.values[j]);
  let trace = 0;
  for (let k = 0; k < d; k++) trace += s1[k * d + k] + s2[k * d + k];
  const matrix = symmetrise(product3(invRoot1, innerRoot, invRoot1, d), d);
  const eigA = symmetricEigen(matrix, d);
  const inverse = spectralFunction(eigA, (x) => 1 / x);
  return { matrix, inverse, minEigenvalue: eigA.values[0], covarianceTerm: Math.max(0, trace - 2 * traceRoot) };
}

/** X Y Z for row-major d x d matrices. O(d^3). */
export function product3(x: ArrayLike<number>, y: ArrayLike<number>, z: ArrayLike<number>, d: number): Float64Array {
  const xy = new Float64Array(d * d);
  for (let i = 0; i < d; i++)
    for (let k = 0; k < d; k++) {
      const a = x[i * d + k];
      if (a === 0) continue;
      for (let j = 0; j < d; j++) xy[i * d + j] += a * y[k * d + j];
    }
  const out = new Float64Array(d * d);
  for (let i = 0; i < d; i++)
    for (let k = 0; k < d; k++) {
      const a = xy[i * d + k];
      if (a === 0) continue;
      for (let j = 0; j < d; j++) out[i * d + j] += a * z[k * d + j];
    }
  return out;
}

/** (M + M^T) / 2, in place; returns M. Removes rounding asymmetry of products of symmetric matrices. */
function symmetrise(m: Float64Array, d: number): Float64Array {
  for (let k = 0; k < d; k++)
    for (let l = k + 1; l < d; l++) {
      const s = 0.5 * (m[k * d + l] + m[l * d + k]);
      m[k * d + l] = s;
      m[l * d + k] = s;
    }
  return m;
}
