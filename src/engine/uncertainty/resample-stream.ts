import { Random } from '../stats/random';
import type { AliasTable } from './alias-table';

/** Up to this many cells a draw uses Lemire's multiply-and-reject (its 32 x 21-bit product is exact in a double). */
const LEMIRE_MAX = 2097152;
const TWO32 = 4294967296;

/**
 * The random draws of a bootstrap: multinomial counts of many draws with
 * replacement, the inner loop of every replicate. The generator is sfc32, the
 * one `Random` uses, run here in local variables inside the counting loops
 * (six times faster than a method call per draw); its starting state is four
 * numbers from `new Random(seed)`, so the same seed gives the same counts,
 * bit for bit, on every platform.
 * Each index is drawn exactly uniformly: by Lemire's multiply-and-reject
 * ("Fast random integer generation in an interval", ACM TOMACS 29, 2019) up to
 * 2^21 cells, and by masking to the next power of two and rejecting beyond it
 * above that.
 * @example new ResampleStream(1).uniformCounts(4, 1000, counts) // counts about [250, 250, 250, 250]
 */
export class ResampleStream {
  private readonly state: Int32Array;

  /** @param seed a whole number from 0 to 2^32 - 1. */
  constructor(seed: number) {
    const r = new Random(seed);
    this.state = Int32Array.of(r.uint32() | 0, r.uint32() | 0, r.uint32() | 0, r.uint32() | 0);
  }

  /**
   * Adds to counts[0..cells-1] the counts of `draws` draws of a cell, each cell
   * equally likely (counts zeroed by the caller). Cost: O(draws).
   * @param cells 1 to 2^31 - 1.
   */
  uniformCounts(cells: number, draws: number, counts: Int32Array): void {
    if (cells > LEMIRE_MAX) return this.maskedCounts(cells, draws, counts);
    const st = this.state;
    let a = st[0];
    let b = st[1];
    let c = st[2];
    let d = st[3];
    const threshold = (TWO32 - cells) % cells;
    for (let i = 0; i < draws;) {
      const t = (((a + b) | 0) + d) | 0;
      d = (d + 1) | 0;
      a = b ^ (b >>> 9);
      b = (c + (c << 3)) | 0;
      c = (c << 21) | (c >>> 11);
      c = (c + t) | 0;
      // (t >>> 0) * cells < 2^53 exactly: its high 32 bits are the cell, its low 32 bits decide rejection.
      const m = (t >>> 0) * cells;
      const k = (m / TWO32) >>> 0;
      if (m - k * TWO32 < threshold) continue;
      counts[k]++;
      i++;
    }
    st[0] = a;
    st[1] = b;
    st[2] = c;
    st[3] = d;
  }

  /** uniformCounts above 2^21 cells: the top bits of each number, rejected at or beyond `cells`. */
  private maskedCounts(cells: number, draws: number, counts: Int32Array): void {
    const st = this.state;
    let a = st[0];
    let b = st[1];
    let c = st[2];
    let d = st[3];
    const shift = 32 - Math.ceil(Math.log2(cells));
    for (let i = 0; i < draws;) {
      const t = (((a + b) | 0) + d) | 0;
      d = (d + 1) | 0;
      a = b ^ (b >>> 9);
      b = (c + (c << 3)) | 0;
      c = (c << 21) | (c >>> 11);
      c = (c + t) | 0;
      const k = t >>> shift;
      if (k >= cells) continue;
      counts[k]++;
      i++;
    }
    st[0] = a;
    st[1] = b;
    st[2] = c;
    st[3] = d;
  }

  /**
   * Adds to counts[0..K-1] the counts of `draws` draws from the alias table's
   * distribution (Walker's alias method): a uniform cell, then a 32-bit coin
   * that keeps it or takes its alias. Cost: O(draws).
   */
  aliasCounts(table: AliasTable, draws: number, counts: Int32Array): void {
    const { cut, alias, size } = table;
    const st = this.state;
    let a = st[0];
    let b = st[1];
    let c = st[2];
    let d = st[3];
    const lemire = size <= LEMIRE_MAX;
    const threshold = (TWO32 - size) % size;
    const shift = 32 - Math.ceil(Math.log2(size));
    let k = -1;
    for (let i = 0; i < draws;) {
      const t = (((a + b) | 0) + d) | 0;
      d = (d + 1) | 0;
      a = b ^ (b >>> 9);
      b = (c + (c << 3)) | 0;
      c = (c << 21) | (c >>> 11);
      c = (c + t) | 0;
      const u = t >>> 0;
      if (k < 0) {
        // First number of the pair: the cell.
        if (lemire) {
          const m = u * size;
          const q = (m / TWO32) >>> 0;
          if (m - q * TWO32 >= threshold) k = q;
        } else {
          const q = u >>> shift;
          if (q < size) k = q;
        }
        continue;
      }
      // Second number: keep the cell with probability cut[k] / 2^32, else take its alias.
      counts[u < cut[k] ? k : alias[k]]++;
      k = -1;
      i++;
    }
    st[0] = a;
    st[1] = b;
    st[2] = c;
    st[3] = d;
  }
}
