/**
 * Solves A x = r for a symmetric positive definite d x d matrix A (row-major)
 * by the Cholesky factorisation A = L L^T and two triangular solves. O(d^3).
 * Returns false (leaving `x` unspecified) if A is not numerically positive
 * definite (a pivot <= 0 or not finite), so the caller can report it.
 * @param a the matrix (not modified).
 * @param r right-hand side, length d (not modified).
 * @param x output, length d (may not alias r).
 * @param scratch d x d work space.
 * @example choleskySolve(Float64Array.of(4, 0, 0, 9), Float64Array.of(8, 9), x, s, 2) // true, x = [2, 1]
 */
export function choleskySolve(a: Float64Array, r: Float64Array, x: Float64Array, scratch: Float64Array, d: number): boolean {
  const l = scratch;
  for (let i = 0; i < d; i++) {
    for (let k = 0; k <= i; k++) {
      let s = a[i * d + k];
      for (let j = 0; j < k; j++) s -= l[i * d + j] * l[k * d + j];
      if (i === k) {
        if (!(s > 0) || !Number.isFinite(s)) return false;
        l[i * d + i] = Math.sqrt(s);
      } else {
        l[i * d + k] = s / l[k * d + k];
      }
    }
  }
  for (let i = 0; i < d; i++) {
    let s = r[i];
    for (let j = 0; j < i; j++) s -= l[i * d + j] * x[j];
    x[i] = s / l[i * d + i];
  }
  for (let i = d - 1; i >= 0; i--) {
    let s = x[i];
    for (let j = i + 1; j < d; j++) s -= l[j * d + i] * x[j];
    x[i] = s / l[i * d + i];
  }
  return true;
}
