import type { Points } from '../points';

/**
 * Softmax weights below e^-(TRUNCATION_DIGITS + log m) of the largest are left out: at most m of them, so their
 * total is below e^-TRUNCATION_DIGITS = 1e-10 of the largest weight (see `TruncatedSoftmax`).
 */
export const TRUNCATION_DIGITS = 23.03;

/**
 * The entropic map T(x) = sum_j y_j w_j(x), w_j = softmax_j(h_j - |x - y_j|^2 / (2 eps)), with the
 * negligible weights left out and no Math.exp spent on them. With H = max_j h_j and
 * r_j^2 = 2 eps (H - h_j) >= 0 the logit is H - (|x - y_j|^2 + r_j^2) / (2 eps), so one pass of
 * squared distances D_j = |x - y_j|^2 + r_j^2 finds the smallest, D_min, and the second pass
 * exponentiates only the rows with D_j <= D_min + 2 eps T, T = 23.03 + log m. Every row left out
 * has weight below e^-T times the largest, their total is below 1e-10 of the kept total, and so
 *   |T_truncated(x) - T(x)| <= 1e-10 * (diameter of the support rows)
 * (two averages of the same rows whose weights differ by that share). At the default smoothing
 * only a fifth to a quarter of the rows pass at d = 8, and fewer at lower d; Math.exp was most of
 * the time of the untruncated map. The distance pass takes four rows of x at a time, reading each
 * support row once for the four (each row's sums keep their own order, so a row's result does not
 * depend on which rows share its block: results are bit-identical whatever the batch).
 * Cost: O(r m d) for r rows, plus O(kept d) per row; O(4 m) scratch.
 */
export class TruncatedSoftmax {
  private readonly d: number;
  private readonly m: number;
  private readonly y: Float64Array;
  private readonly r2: Float64Array;
  private readonly band: number;
  private readonly inv2Eps: number;
  private readonly dist: Float64Array;
  private readonly best = new Float64Array(4);

  /**
   * @param support the rows y_j (m >= 1); h the logit offsets log b_j + g_j / eps (length m, finite); eps > 0.
   * @example new TruncatedSoftmax(target, h, 0.05).map(x) // barycentricMap(x, target, logMass, g, 0.05) to 1e-10 x diameter
   */
  constructor(support: Points, h: Float64Array, eps: number) {
    const { n: m, d, data } = support;
    this.d = d;
    this.m = m;
    this.y = data;
    this.inv2Eps = 1 / (2 * eps);
    this.band = 2 * eps * (TRUNCATION_DIGITS + Math.log(m));
    let H = -Infinity;
    for (let j = 0; j < m; j++) if (h[j] > H) H = h[j];
    this.r2 = new Float64Array(m);
    for (let j = 0; j < m; j++) this.r2[j] = 2 * eps * (H - h[j]);
    this.dist = new Float64Array(4 * m);
  }

  /**
   * T(x) for every row of x, into out (row-major x.n x d). O(x.n m d).
   * @param x rows in the support's units (x.d = d).
   * @example softmax.map(points([[0, 0]])) // one mapped row
   */
  map(x: Points, out: Float64Array = new Float64Array(x.n * this.d)): Float64Array {
    const { d, m, y, r2, dist, best } = this;
    const xd = x.data;
    for (let i = 0; i < x.n; i += 4) {
      const rows = Math.min(4, x.n - i);
      // The last block repeats its last row in the unused lanes (their results are not written).
      const o0 = i * d;
      const o1 = (i + Math.min(1, rows - 1)) * d;
      const o2 = (i + Math.min(2, rows - 1)) * d;
      const o3 = (i + Math.min(3, rows - 1)) * d;
      let b0 = Infinity;
      let b1 = Infinity;
      let b2 = Infinity;
      let b3 = Infinity;
      for (let j = 0, yo = 0; j < m; j++, yo += d) {
        const r = r2[j];
        let s0 = 0;
        let s1 = 0;
        let s2 = 0;
        let s3 = 0;
        for (let k = 0; k < d; k++) {
          const v = y[yo + k];
          const t0 = xd[o0 + k] - v;
          const t1 = xd[o1 + k] - v;
          const t2 = xd[o2 + k] - v;
          const t3 = xd[o3 + k] - v;
          s0 += t0 * t0;
          s1 += t1 * t1;
          s2 += t2 * t2;
          s3 += t3 * t3;
        }
        s0 += r;
        s1 += r;
        s2 += r;
        s3 += r;
        dist[j] = s0;
        dist[m + j] = s1;
        dist[2 * m + j] = s2;
        dist[3 * m + j] = s3;
        if (s0 < b0) b0 = s0;
        if (s1 < b1) b1 = s1;
        if (s2 < b2) b2 = s2;
        if (s3 < b3) b3 = s3;
      }
      best[0] = b0;
      best[1] = b1;
      best[2] = b2;
      best[3] = b3;
      for (let q = 0; q < rows; q++) this.average(q, best[q], out, (i + q) * d);
    }
    return out;
  }

  /** The weighted average of the support rows kept for lane q of the block, into out[o..o+d). O(m + kept d). */
  private average(q: number, best: number, out: Float64Array, o: number): void {
    const { d, m, y, dist, inv2Eps } = this;
    const limit = best + this.band;
    const base = q * m;
    for (let k = 0; k < d; k++) out[o + k] = 0;
    let total = 0;
    for (let j = 0; j < m; j++) {
      const s = dist[base + j];
      if (s > limit) continue;
      const w = Math.exp((best - s) * inv2Eps);
      total += w;
      const yo = j * d;
      for (let k = 0; k < d; k++) out[o + k] += w * y[yo + k];
    }
    for (let k = 0; k < d; k++) out[o + k] /= total;
  }
}
