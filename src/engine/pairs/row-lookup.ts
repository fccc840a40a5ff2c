import type { Points } from '../points';

const scratch = new Float64Array(1);
const words = new Uint32Array(scratch.buffer);

/**
 * A 32-bit hash of the bits of d numbers starting at `data[offset]`
 * (FNV-1a over the two 32-bit words of each double, then a final avalanche).
 * -0 is hashed as 0, so rows equal under `===` hash alike.
 */
export function rowHash(data: Float64Array, offset: number, d: number): number {
  let h = (0x811c9dc5 ^ d) >>> 0;
  for (let k = 0; k < d; k++) {
    scratch[0] = data[offset + k] + 0; // -0 + 0 is +0
    h = Math.imul(h ^ words[0], 0x01000193);
    h = Math.imul(h ^ words[1], 0x01000193);
  }
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/**
 * Finds rows by their exact coordinates. The rows of `p` are grouped into
 * distinct values (rows equal coordinate by coordinate under `===`, so 0 and
 * -0 are the same and NaN matches nothing); `find` returns the group of a
 * given row of numbers, or -1. Lookups hash the row's bits, then compare
 * coordinates exactly, so a hash collision never gives a wrong match.
 *
 * Cost: O(n d) to build, O(d) expected per lookup; O(n) memory.
 * Keeps a reference to `p.data` and never mutates it.
 *
 * @example
 * const look = new RowLookup(points([[1, 2], [3, 4], [1, 2]]));
 * look.groups            // 2
 * look.groupOf           // Int32Array [0, 1, 0]
 * look.find(Float64Array.from([3, 4]), 0) // 1
 * look.find(Float64Array.from([3, 5]), 0) // -1
 */
export class RowLookup {
  readonly n: number;
  readonly d: number;
  /** Number of distinct rows. */
  readonly groups: number;
  /** groupOf[i]: the group of row i (groups are numbered by first appearance). */
  readonly groupOf: Int32Array;
  /** groupFirst[g]: the first row of group g. */
  readonly groupFirst: Int32Array;
  /** groupSize[g]: how many rows share group g's value. */
  readonly groupSize: Int32Array;
  private readonly data: Float64Array;
  private readonly buckets = new Map<number, number[]>();

  constructor(p: Points) {
    this.n = p.n;
    this.d = p.d;
    this.data = p.data;
    this.groupOf = new Int32Array(p.n);
    const first: number[] = [];
    const size: number[] = [];
    for (let i = 0; i < p.n; i++) {
      const off = i * p.d;
      const h = rowHash(p.data, off, p.d);
      let bucket = this.buckets.get(h);
      if (bucket === undefined) {
        bucket = [];
        this.buckets.set(h, bucket);
      }
      let g = -1;
      for (const cand of bucket) {
        if (this.sameRow(first[cand] * p.d, p.data, off)) {
          g = cand;
          break;
        }
      }
      if (g < 0) {
        g = first.length;
        first.push(i);
        size.push(0);
        bucket.push(g);
      }
      size[g]++;
      this.groupOf[i] = g;
    }
    this.groups = first.length;
    this.groupFirst = Int32Array.from(first);
    this.groupSize = Int32Array.from(size);
  }

  /**
   * The group whose value equals the d numbers at `values[offset..offset+d)`, or -1 if none does.
   * @param values any Float64Array; not mutated.
   * @param offset index of the first of the d numbers (0 <= offset <= values.length - d).
   */
  find(values: Float64Array, offset: number): number {
    const bucket = this.buckets.get(rowHash(values, offset, this.d));
    if (bucket === undefined) return -1;
    for (const g of bucket) {
      if (this.sameRow(this.groupFirst[g] * this.d, values, offset)) return g;
    }
    return -1;
  }

  private sameRow(own: number, values: Float64Array, offset: number): boolean {
    for (let k = 0; k < this.d; k++) {
      if (this.data[own + k] !== values[offset + k]) return false;
    }
    return true;
  }
}
