/**
 * The two passes over a stored kernel that make up a Sinkhorn iteration. They
 * live in their own small functions, away from closures, so the JavaScript
 * engine keeps every array in a register-friendly local (a loop that reads
 * closure variables runs several times slower).
 */

/**
 * One fused Sinkhorn pass over the n x m kernel K (row-major): for each row i,
 *   s_i = sum_j K_ij bv_j,   uOut_i = u_i^(1 - omega) (1 / s_i)^omega,   then t_j += a_i uOut_i K_ij,
 * reading each row once from memory (the second use hits the cache). omega = 1
 * is the plain Sinkhorn step (uOut = 1 / s); 1 < omega < 2 over-relaxes it.
 * Also writes stats[0] = sum_i |a_i uOut_i s_i - a_i| (the source-marginal L1
 * error of the new scalings) and stats[1] = sum_i a_i uOut_i s_i (the plan's mass).
 * O(n m). Returns false if some s_i was 0 or not finite (that row is skipped in t).
 * @param t is overwritten (length m); stats (length >= 2) too.
 * @example fusedScalingPass(K, n, m, a, bv, u, 1, uNew, t, stats) // uNew = 1 / K(b v), t = K^T(a uNew)
 */
export function fusedScalingPass(
  K: Float64Array, n: number, m: number, a: Float64Array, bv: Float64Array,
  u: Float64Array, omega: number, uOut: Float64Array, t: Float64Array, stats: Float64Array,
): boolean {
  t.fill(0);
  let ok = true;
  let err = 0;
  let mass = 0;
  for (let i = 0; i < n; i++) {
    const r = i * m;
    let acc = 0;
    for (let j = 0; j < m; j++) acc += K[r + j] * bv[j];
    const plain = 1 / acc;
    const ui = omega === 1 ? plain : u[i] * Math.pow(plain / u[i], omega);
    uOut[i] = ui;
    if (!(ui < Infinity && ui > 0)) {
      ok = false;
      continue;
    }
    const au = a[i] * ui;
    const row = au * acc;
    mass += row;
    err += Math.abs(row - a[i]);
    for (let j = 0; j < m; j++) t[j] += au * K[r + j];
  }
  stats[0] = err;
  stats[1] = mass;
  return ok;
}

/**
 * The matrix-vector product s = K w for a row-major n x m kernel. O(n m).
 * @param s is overwritten (length n).
 * @example kernelTimes(Float64Array.of(1, 2, 3, 4), 2, 2, Float64Array.of(1, 1), s) // s = [3, 7]
 */
export function kernelTimes(K: Float64Array, n: number, m: number, w: Float64Array, s: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const r = i * m;
    let acc = 0;
    for (let j = 0; j < m; j++) acc += K[r + j] * w[j];
    s[i] = acc;
  }
}

/**
 * The transposed product t = K^T w for a row-major n x m kernel, row by row
 * (sequential memory access). O(n m).
 * @param t is overwritten (length m).
 * @example kernelTransposeTimes(Float64Array.of(1, 2, 3, 4), 2, 2, Float64Array.of(1, 1), t) // t = [4, 6]
 */
export function kernelTransposeTimes(K: Float64Array, n: number, m: number, w: Float64Array, t: Float64Array): void {
  t.fill(0);
  for (let i = 0; i < n; i++) {
    const r = i * m;
    const wi = w[i];
    if (wi === 0) continue;
    for (let j = 0; j < m; j++) t[j] += wi * K[r + j];
  }
}
