import { psdSqrt } from '../stats/sqrtm';
import { symmetricEigen } from '../stats/symmetric-eigen';

/**
 * Closed forms between two Gaussians N(mean_a, A) and N(mean_b, B) in d
 * dimensions, for the cost |x - y|^2 (W2^2 convention):
 *  - the squared 2-Wasserstein distance (Bures-Wasserstein, Gelbrich 1990):
 *      W2^2 = |mean_a - mean_b|^2 + tr A + tr B - 2 tr (A^1/2 B A^1/2)^1/2;
 *  - the entropic cost OT_s = min E|X - Y|^2 + 2 s KL(pi | a x b) (Janati,
 *    Muzellec, Peyre & Cuturi 2020, "Entropic optimal transport between
 *    unbalanced Gaussian measures has a closed form", NeurIPS, Theorem 1, with
 *    s = sigma^2):
 *      OT_s = |mean_a - mean_b|^2 + tr A + tr B - tr D_s + s log det(D_s + s I) + d s (1 - log 2s),
 *      D_s = (4 A^1/2 B A^1/2 + s^2 I)^1/2,
 *    and the Sinkhorn divergence S_s = OT_s(a, b) - (OT_s(a, a) + OT_s(b, b)) / 2.
 * The project's entropic fit uses the cost |x - y|^2 / 2 with regularisation
 * eps KL, so twice its divergence at eps is S_s with s = eps: the value this
 * returns as `divergence2`.
 * O(d^3).
 * @param meanA, meanB length d; covA, covB row-major d x d symmetric PSD; eps > 0.
 * @throws RemapError (from psdSqrt) if a covariance is not symmetric PSD.
 * @example gaussianDivergence(Float64Array.of(0), Float64Array.of(1), Float64Array.of(0), Float64Array.of(1), 1, 0.5) // { w2Squared: 0, divergence2: 0 }
 */
export function gaussianDivergence(
  meanA: Float64Array,
  covA: Float64Array,
  meanB: Float64Array,
  covB: Float64Array,
  d: number,
  eps: number,
): { w2Squared: number; divergence2: number } {
  let gap = 0;
  for (let k = 0; k < d; k++) gap += (meanA[k] - meanB[k]) ** 2;
  const cross = crossTerms(covA, covB, d, eps);
  const selfA = crossTerms(covA, covA, d, eps);
  const selfB = crossTerms(covB, covB, d, eps);
  const trA = trace(covA, d);
  const trB = trace(covB, d);
  // OT_s(a, b) - (OT_s(a, a) + OT_s(b, b)) / 2: the tr A + tr B and d s (1 - log 2s) terms cancel.
  const entropic = (x: { trD: number; logDet: number }): number => -x.trD + eps * x.logDet;
  const divergence2 = gap + entropic(cross) - (entropic(selfA) + entropic(selfB)) / 2;
  const w2Squared = Math.max(0, gap + trA + trB - 2 * cross.trRoot);
  return { w2Squared, divergence2 };
}

/** tr D_s, log det(D_s + s I) and tr (A^1/2 B A^1/2)^1/2 from the eigenvalues of A^1/2 B A^1/2. O(d^3). */
function crossTerms(A: Float64Array, B: Float64Array, d: number, s: number): { trD: number; logDet: number; trRoot: number } {
  const R = psdSqrt(A, d);
  const M = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      let t = 0;
      for (let p = 0; p < d; p++) for (let q = 0; q < d; q++) t += R[i * d + p] * B[p * d + q] * R[q * d + j];
      M[i * d + j] = t;
    }
  }
  for (let i = 0; i < d; i++) for (let j = 0; j < i; j++) M[i * d + j] = M[j * d + i] = (M[i * d + j] + M[j * d + i]) / 2;
  const { values } = symmetricEigen(M, d);
  let trD = 0;
  let logDet = 0;
  let trRoot = 0;
  for (const l of values) {
    const lam = Math.max(0, l);
    const root = Math.sqrt(4 * lam + s * s);
    trD += root;
    logDet += Math.log(root + s);
    trRoot += Math.sqrt(lam);
  }
  return { trD, logDet, trRoot };
}

function trace(A: Float64Array, d: number): number {
  let t = 0;
  for (let k = 0; k < d; k++) t += A[k * d + k];
  return t;
}
