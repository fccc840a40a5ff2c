import type { Random } from '../stats/random';

/**
 * Draws indices 0..K-1 with probability proportional to given weights in O(1)
 * each, by the alias method (Walker, "An efficient method for generating
 * discrete random variables with general distributions", ACM TOMS 3, 1977),
 * built in O(K) as Vose describes ("A linear algorithm for generating random
 * numbers with a given distribution", IEEE TSE 17, 1991).
 * @example new AliasSampler(Float64Array.of(1, 3)).counts(new Random(1), 4000, out) // out about [1000, 3000]
 */
export class AliasSampler {
  private readonly prob: Float64Array;
  private readonly alias: Int32Array;
  readonly size: number;
  /** Set by `forRows`: draws pick a row uniformly and count its unit. */
  private rows: Int32Array | null = null;

  /**
   * A sampler of rows drawn uniformly, counted by unit: row i adds to unit
   * unitOf[i] (rows sharing a value share a unit). The same distribution as
   * weights equal to each unit's row count, drawn with one 32-bit number per
   * draw by Lemire's multiply-and-reject method ("Fast random integer
   * generation in an interval", ACM TOMACS 29, 2019), exactly uniform.
   */
  static forRows(unitOf: Int32Array, units: number): AliasSampler {
    const s = new AliasSampler(new Float64Array(units).fill(1));
    s.rows = unitOf;
    return s;
  }

  private rowCounts(random: Random, draws: number, out: Float64Array): void {
    const rows = this.rows!;
    const n = rows.length;
    const TWO32 = 4294967296;
    const threshold = (TWO32 - n) % n;
    const floor = Math.floor;
    for (let i = 0; i < draws; i++) {
      // u * n < 2^52 is exact in a double: its high 32 bits are the row, its low 32 bits decide rejection.
      let m = random.uint32() * n;
      let hi = floor(m / TWO32);
      while (m - hi * TWO32 < threshold) {
        m = random.uint32() * n;
        hi = floor(m / TWO32);
      }
      out[rows[hi]]++;
    }
  }

  /** @param weights K >= 1 non-negative finite weights with a positive total. */
  constructor(weights: Float64Array) {
    const K = weights.length;
    this.size = K;
    this.prob = new Float64Array(K);
    this.alias = new Int32Array(K);
    let total = 0;
    for (let k = 0; k < K; k++) total += weights[k];
    const scaled = new Float64Array(K);
    const small = new Int32Array(K);
    const large = new Int32Array(K);
    let ns = 0;
    let nl = 0;
    for (let k = 0; k < K; k++) {
      scaled[k] = (weights[k] * K) / total;
      if (scaled[k] < 1) small[ns++] = k;
      else large[nl++] = k;
    }
    while (ns > 0 && nl > 0) {
      const s = small[--ns];
      const l = large[--nl];
      this.prob[s] = scaled[s];
      this.alias[s] = l;
      scaled[l] = scaled[l] + scaled[s] - 1;
      if (scaled[l] < 1) small[ns++] = l;
      else large[nl++] = l;
    }
    while (nl > 0) this.prob[large[--nl]] = 1;
    while (ns > 0) this.prob[small[--ns]] = 1; // rounding leftovers
  }

  /**
   * Adds to `out` (length K, zeroed by the caller) the counts of `draws`
   * independent draws: a multinomial sample. Cost: O(draws).
   */
  counts(random: Random, draws: number, out: Float64Array): void {
    if (this.rows !== null) return this.rowCounts(random, draws, out);
    const { prob, alias, size } = this;
    const floor = Math.floor;
    for (let i = 0; i < draws; i++) {
      const u = random.uniform() * size;
      const k = floor(u);
      out[u - k < prob[k] ? k : alias[k]]++;
    }
  }
}
