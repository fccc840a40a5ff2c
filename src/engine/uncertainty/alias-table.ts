/**
 * The table of Walker's alias method ("An efficient method for generating
 * discrete random variables with general distributions", ACM TOMS 3, 1977),
 * built in O(K) as Vose describes ("A linear algorithm for generating random
 * numbers with a given distribution", IEEE TSE 17, 1991): a draw picks a cell
 * k uniformly and keeps it with probability prob[k], else takes alias[k].
 * `cut[k]` = prob[k] 2^32 is that probability on the scale of a 32-bit random
 * number, so a draw keeps k when the number is below cut[k] (an error of at
 * most 2^-32 per cell). Draws are made by `ResampleStream.aliasCounts`.
 * @example new AliasTable(Float64Array.of(1, 3)) // cells 0 and 1 drawn one and three times in four
 */
export class AliasTable {
  readonly cut: Float64Array;
  readonly alias: Int32Array;
  readonly size: number;

  /** @param weights K >= 1 non-negative finite weights with a positive total. O(K). */
  constructor(weights: Float64Array) {
    const K = weights.length;
    this.size = K;
    const prob = new Float64Array(K);
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
      prob[s] = scaled[s];
      this.alias[s] = l;
      scaled[l] = scaled[l] + scaled[s] - 1;
      if (scaled[l] < 1) small[ns++] = l;
      else large[nl++] = l;
    }
    while (nl > 0) prob[large[--nl]] = 1;
    while (ns > 0) prob[small[--ns]] = 1; // rounding leftovers
    this.cut = new Float64Array(K);
    for (let k = 0; k < K; k++) this.cut[k] = prob[k] * 4294967296;
  }
}
