import { gaussianTransport } from '../linear/gaussian-transport';
import { weightedMoments } from '../stats/moments';
import type { Points } from '../points';
import { symmetricEigen } from '../stats/symmetric-eigen';

/** Below this ratio of smallest to largest covariance eigenvalue a ridge is added (the linear method refuses such data at 1e-12). */
export const RIDGE_BELOW = 1e-12;

/**
 * The warm start of the gradient network's linear part: the matrix A of the
 * optimal linear map between Gaussians with the two samples' covariances
 * (A = S^-1/2 (S^1/2 T S^1/2)^1/2 S^-1/2, Dowson & Landau 1982; Olkin &
 * Pukelsheim 1982; computed by linear/gaussian-transport.ts from the weighted
 * moments of stats/moments.ts, divisor: total weight), i.e. exactly the linear
 * method's matrix on the same data. Unlike the linear method, which refuses
 * singular covariances, this adds a tiny ridge (1e-9 of the mean variance) to
 * both when either is numerically singular (eigenvalue ratio below 1e-12), since
 * the network only starts from A. O((n + m) d^2 + d^3). Never mutates its inputs.
 * @example gaussianLinearMap(points([[1, 0], [-1, 0], [0, 1], [0, -1]]), null, points([[2, 0], [-2, 0], [0, 3], [0, -3]]), null) // [2, 0, 0, 3]
 */
export function gaussianLinearMap(source: Points, sourceWeights: Float64Array | null, target: Points, targetWeights: Float64Array | null): Float64Array {
  const d = source.d;
  const s = Float64Array.from(weightedMoments(source, sourceWeights).cov);
  const t = Float64Array.from(weightedMoments(target, targetWeights).cov);
  const singular = (m: Float64Array): boolean => {
    const v = symmetricEigen(m, d).values;
    return !(v[0] > RIDGE_BELOW * v[d - 1]);
  };
  if (singular(s) || singular(t)) {
    let tr = 0;
    for (let i = 0; i < d; i++) tr += s[i * d + i] + t[i * d + i];
    const ridge = 1e-9 * (tr / (2 * d)) + 1e-300;
    for (let i = 0; i < d; i++) {
      s[i * d + i] += ridge;
      t[i * d + i] += ridge;
    }
  }
  return gaussianTransport(symmetricEigen(s, d), s, t).matrix;
}
