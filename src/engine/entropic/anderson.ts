/**
 * Anderson acceleration of a fixed-point iteration x <- G(x) (Anderson 1965,
 * "Iterative procedures for nonlinear integral equations", J. ACM 12; in the
 * form of Walker & Ni 2011, "Anderson acceleration for fixed-point
 * iterations", SIAM J. Numer. Anal. 49, section 3, with the residual
 * differences): keeps the last `memory` iterates x_k and values G(x_k), and
 * proposes
 *   x_next = G(x_k) - sum_i gamma_i (G(x_{i+1}) - G(x_i)),
 * gamma minimising |r_k - sum_i gamma_i (r_{i+1} - r_i)|^2 with r = G(x) - x
 * (a small least-squares problem, solved by its normal equations with a
 * relative ridge of 1e-10 so that nearly dependent differences stay harmless).
 * With an empty history it is the plain step x_next = G(x_k).
 * Used on the log of Sinkhorn's column scalings, where the plain iteration is
 * linear-convergent with a rate close to 1 on heavy-tailed data.
 * Cost per step: O(memory * len) for the new differences and Gram row, plus
 * O(memory^3); memory O(memory * len).
 */
export class AndersonMixer {
  private readonly len: number;
  private readonly memory: number;
  /** Ring buffers of differences dG_i = G(x_{i+1}) - G(x_i) and dR_i = r_{i+1} - r_i. */
  private readonly dG: Float64Array[];
  private readonly dR: Float64Array[];
  /** Gram matrix of the stored dR, memory x memory (row-major), kept current as differences arrive. */
  private readonly gram: Float64Array;
  private readonly prevG: Float64Array;
  private readonly prevR: Float64Array;
  private hasPrev = false;
  private count = 0;
  private head = 0;

  /**
   * @param len the length of the iterate (>= 1).
   * @param memory how many past differences to keep (>= 1; 5-10 is usual).
   * @example new AndersonMixer(4000, 6)
   */
  constructor(len: number, memory: number) {
    this.len = len;
    this.memory = memory;
    this.dG = Array.from({ length: memory }, () => new Float64Array(len));
    this.dR = Array.from({ length: memory }, () => new Float64Array(len));
    this.gram = new Float64Array(memory * memory);
    this.prevG = new Float64Array(len);
    this.prevR = new Float64Array(len);
  }

  /** Forgets the history (after the iteration was disturbed: a restart, a rebuilt kernel). O(1). */
  reset(): void {
    this.hasPrev = false;
    this.count = 0;
    this.head = 0;
  }

  /**
   * Records the pair (x, G(x)) and writes the next iterate into `out` (which may alias x but not gx).
   * O(memory * len + memory^3).
   * @example mixer.step(x, gx, x) // x now holds the accelerated iterate
   */
  step(x: Float64Array, gx: Float64Array, out: Float64Array): void {
    const { len, memory } = this;
    if (this.hasPrev) {
      const slot = this.head;
      const dg = this.dG[slot];
      const dr = this.dR[slot];
      for (let j = 0; j < len; j++) {
        const r = gx[j] - x[j];
        dg[j] = gx[j] - this.prevG[j];
        dr[j] = r - this.prevR[j];
      }
      this.head = (slot + 1) % memory;
      if (this.count < memory) this.count++;
      for (let q = 0; q < this.count; q++) {
        const other = this.dR[(this.head - 1 - q + 2 * memory) % memory];
        let s = 0;
        for (let j = 0; j < len; j++) s += dr[j] * other[j];
        const o = (this.head - 1 - q + 2 * memory) % memory;
        this.gram[slot * memory + o] = s;
        this.gram[o * memory + slot] = s;
      }
    }
    for (let j = 0; j < len; j++) {
      this.prevR[j] = gx[j] - x[j];
      this.prevG[j] = gx[j];
    }
    this.hasPrev = true;
    out.set(gx);
    const p = this.count;
    if (p === 0) return;
    // Slots in use, oldest first.
    const slots: number[] = [];
    for (let q = p; q >= 1; q--) slots.push((this.head - q + 2 * memory) % memory);
    const A = new Float64Array(p * p);
    const rhs = new Float64Array(p);
    let trace = 0;
    for (let a = 0; a < p; a++) {
      for (let c = 0; c < p; c++) A[a * p + c] = this.gram[slots[a] * memory + slots[c]];
      trace += A[a * p + a];
      const dr = this.dR[slots[a]];
      let s = 0;
      for (let j = 0; j < len; j++) s += dr[j] * this.prevR[j];
      rhs[a] = s;
    }
    if (!(trace > 0) || !Number.isFinite(trace)) return;
    for (let a = 0; a < p; a++) A[a * p + a] += 1e-10 * trace;
    const gamma = solveSmall(A, rhs, p);
    if (!gamma) return;
    for (let a = 0; a < p; a++) {
      const g = gamma[a];
      if (g === 0) continue;
      const dg = this.dG[slots[a]];
      for (let j = 0; j < len; j++) out[j] -= g * dg[j];
    }
  }
}

/** Solves the small symmetric system A z = b by Gaussian elimination with partial pivoting; null if singular. O(p^3). */
function solveSmall(A: Float64Array, b: Float64Array, p: number): Float64Array | null {
  const M = Float64Array.from(A);
  const z = Float64Array.from(b);
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(M[r * p + c]) > Math.abs(M[piv * p + c])) piv = r;
    if (!(Math.abs(M[piv * p + c]) > 0)) return null;
    if (piv !== c) {
      for (let l = 0; l < p; l++) {
        const t = M[c * p + l];
        M[c * p + l] = M[piv * p + l];
        M[piv * p + l] = t;
      }
      const t = z[c];
      z[c] = z[piv];
      z[piv] = t;
    }
    for (let r = c + 1; r < p; r++) {
      const f = M[r * p + c] / M[c * p + c];
      if (f === 0) continue;
      for (let l = c; l < p; l++) M[r * p + l] -= f * M[c * p + l];
      z[r] -= f * z[c];
    }
  }
  const out = new Float64Array(p);
  for (let c = p - 1; c >= 0; c--) {
    let s = z[c];
    for (let l = c + 1; l < p; l++) s -= M[c * p + l] * out[l];
    out[c] = s / M[c * p + c];
    if (!Number.isFinite(out[c])) return null;
  }
  return out;
}
