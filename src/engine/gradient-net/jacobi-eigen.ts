/**
 * Eigenvalues and eigenvectors of a small symmetric matrix by the cyclic Jacobi
 * method (Golub & Van Loan, "Matrix Computations", 4th ed., Alg. 8.5.3): plane
 * rotations zero the off-diagonal entries one by one until their norm is below
 * 1e-15 of the matrix norm, at most 100 sweeps (each sweep O(d^3)).
 * @param a symmetric d x d matrix, row-major (not modified; only its upper
 *   triangle is read).
 * @param d order, >= 1.
 * @returns values (unsorted) and vectors (column k of the d x d row-major
 *   `vectors` is the eigenvector of values[k]).
 * @example symmetricEigen(Float64Array.of(2, 1, 1, 2), 2).values // [1, 3] in some order
 */
export function symmetricEigen(a: ArrayLike<number>, d: number): { values: Float64Array; vectors: Float64Array } {
  const m = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let k = i; k < d; k++) {
      m[i * d + k] = a[i * d + k];
      m[k * d + i] = a[i * d + k];
    }
  }
  const v = new Float64Array(d * d);
  for (let i = 0; i < d; i++) v[i * d + i] = 1;
  let norm = 0;
  for (let i = 0; i < d * d; i++) norm += m[i] * m[i];
  const tol = 1e-30 * norm;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < d; p++) for (let q = p + 1; q < d; q++) off += 2 * m[p * d + q] * m[p * d + q];
    if (off <= tol) break;
    for (let p = 0; p < d; p++) {
      for (let q = p + 1; q < d; q++) {
        const apq = m[p * d + q];
        if (apq === 0) continue;
        const theta = (m[q * d + q] - m[p * d + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const cs = 1 / Math.sqrt(t * t + 1);
        const sn = t * cs;
        for (let k = 0; k < d; k++) {
          const mkp = m[k * d + p];
          const mkq = m[k * d + q];
          m[k * d + p] = cs * mkp - sn * mkq;
          m[k * d + q] = sn * mkp + cs * mkq;
        }
        for (let k = 0; k < d; k++) {
          const mpk = m[p * d + k];
          const mqk = m[q * d + k];
          m[p * d + k] = cs * mpk - sn * mqk;
          m[q * d + k] = sn * mpk + cs * mqk;
        }
        for (let k = 0; k < d; k++) {
          const vkp = v[k * d + p];
          const vkq = v[k * d + q];
          v[k * d + p] = cs * vkp - sn * vkq;
          v[k * d + q] = sn * vkp + cs * vkq;
        }
      }
    }
  }
  const values = new Float64Array(d);
  for (let i = 0; i < d; i++) values[i] = m[i * d + i];
  return { values, vectors: v };
}

/**
 * The smallest eigenvalue of a symmetric d x d matrix (Jacobi, see above). O(d^3) per sweep.
 * @example smallestEigenvalue(Float64Array.of(2, 1, 1, 2), 2) // 1
 */
export function smallestEigenvalue(a: ArrayLike<number>, d: number): number {
  const { values } = symmetricEigen(a, d);
  let lo = Infinity;
  for (let i = 0; i < d; i++) lo = Math.min(lo, values[i]);
  return lo;
}

/**
 * f(A) = Q diag(f(lambda)) Q^T for a symmetric matrix A = Q diag(lambda) Q^T,
 * e.g. the square root (f = sqrt of max(lambda, 0)). O(d^3).
 * @example symmetricFunction(Float64Array.of(4, 0, 0, 9), 2, Math.sqrt) // [2, 0, 0, 3]
 */
export function symmetricFunction(a: ArrayLike<number>, d: number, f: (lambda: number) => number): Float64Array {
  const { values, vectors } = symmetricEigen(a, d);
  const fl = values.map(f);
  const out = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let k = i; k < d; k++) {
      let s = 0;
      for (let r = 0; r < d; r++) s += vectors[i * d + r] * fl[r] * vectors[k * d + r];
      out[i * d + k] = s;
      out[k * d + i] = s;
    }
  }
  return out;
}
