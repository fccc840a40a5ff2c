/**
 * Logits of the Gibbs kernel, two rows at a time. Building a kernel spends
 * about as long on the squared distances as on Math.exp; computing the rows
 * i and i + 1 together reads each target row y_j once for both (half the
 * loads), and writing the logit straight away spares a separate pass over the
 * row. The arithmetic is that of squaredDistancesRow (src/engine/stats/sq-distances.ts)
 * followed by the logit, in the same order, so the values are bit-identical
 * to computing the distances first.
 */

/**
 * Writes z_ij = (g_j - |x_i - y_j|^2 / 2) / eps (as (g_j - 0.5 s) * inv) for
 * rows i0 and i1 of x and j = from..m-1 into out[o0 + j - from] and
 * out[o1 + j - from], and returns the largest z of each row in max[0], max[1].
 * With i1 = i0 only row i0 is meant, but both are written (o1 may equal o0).
 * O((m - from) d).
 * @param xd, yd row-major coordinates (d columns); g offsets (length m); inv = 1 / eps.
 * @param max receives the two row maxima (length >= 2).
 * @example logitRows2(x.data, 0, 1, y.data, 2, 0, 3, g, 10, K, 0, 3, max) // rows 0, 1 of a 2 x 3 kernel's logits
 */
export function logitRows2(
  xd: Float64Array,
  i0: number,
  i1: number,
  yd: Float64Array,
  d: number,
  from: number,
  m: number,
  g: Float64Array,
  inv: number,
  out: Float64Array,
  o0: number,
  o1: number,
  max: Float64Array,
): void {
  const x0 = i0 * d;
  const x1 = i1 * d;
  let max0 = -Infinity;
  let max1 = -Infinity;
  for (let j = from, yo = from * d, p = 0; j < m; j++, yo += d, p++) {
    let s0 = 0;
    let s1 = 0;
    for (let k = 0; k < d; k++) {
      const yk = yd[yo + k];
      const t0 = xd[x0 + k] - yk;
      const t1 = xd[x1 + k] - yk;
      s0 += t0 * t0;
      s1 += t1 * t1;
    }
    const gj = g[j];
    const z0 = (gj - 0.5 * s0) * inv;
    const z1 = (gj - 0.5 * s1) * inv;
    out[o0 + p] = z0;
    out[o1 + p] = z1;
    if (z0 > max0) max0 = z0;
    if (z1 > max1) max1 = z1;
  }
  max[0] = max0;
  max[1] = max1;
}
