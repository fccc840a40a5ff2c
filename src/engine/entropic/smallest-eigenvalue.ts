/**
 * The smallest eigenvalue of a symmetric d x d matrix by the cyclic Jacobi
 * method: plane rotations zero the off-diagonal entries one at a time until
 * they are negligible; the diagonal then holds the eigenvalues (Golub & Van
 * Loan, "Matrix Computations", 4th ed., section 8.5). Accurate to a few units
 * of rounding relative to the matrix norm, and robust for the small matrices
 * (d <= 20 or so) a Jacobian has here. At most 50 sweeps of O(d^3) each.
 * The matrix is read from `a` (row-major; only its symmetric part is used) and
 * not changed; `work` (length >= d^2) is overwritten if given.
 * @param a row-major d x d, finite entries; d >= 1.
 * @example smallestEigenvalue(Float64Array.of(2, 1, 1, 2), 2) // 1
 */
export function smallestEigenvalue(a: Float64Array, d: number, work?: Float64Array): number {
  const A = work && work.length >= d * d ? work : new Float64Array(d * d);
  for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) A[i * d + j] = 0.5 * (a[i * d + j] + a[j * d + i]);
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0;
    let diag = 0;
    for (let i = 0; i < d; i++) {
      diag += A[i * d + i] * A[i * d + i];
      for (let j = i + 1; j < d; j++) off += A[i * d + j] * A[i * d + j];
    }
    if (off <= 1e-30 * diag || off === 0) break;
    for (let p = 0; p < d - 1; p++) {
      for (let q = p + 1; q < d; q++) {
        const apq = A[p * d + q];
        if (apq === 0) continue;
        const app = A[p * d + p];
        const aqq = A[q * d + q];
        // Rotation angle that zeroes A[p][q] (the smaller root, for stability).
        const theta = (aqq - app) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < d; k++) {
          const akp = A[k * d + p];
          const akq = A[k * d + q];
          A[k * d + p] = c * akp - s * akq;
          A[k * d + q] = s * akp + c * akq;
        }
        for (let k = 0; k < d; k++) {
          const apk = A[p * d + k];
          const aqk = A[q * d + k];
          A[p * d + k] = c * apk - s * aqk;
          A[q * d + k] = s * apk + c * aqk;
        }
      }
    }
  }
  let min = Infinity;
  for (let i = 0; i < d; i++) if (A[i * d + i] < min) min = A[i * d + i];
  return min;
}
