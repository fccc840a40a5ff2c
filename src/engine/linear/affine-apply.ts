import { RemapError } from '../errors';
import type { Mapped } from '../map';
import type { Points } from '../points';

/**
 * y = to + M (x - from) for every row x of `x`, and the count of rows with a
 * coordinate outside [lo_k, hi_k]. The linear map's apply (from = m1, M = A,
 * to = m2, range of the source) and its inverse (from = m2, M = A^-1, to = m1,
 * range of the target) are both this one loop.
 * Cost: O(n d^2) time, O(n d) for the result. Never mutates its inputs.
 * @param x the rows to map (finite values).
 * @param from, to length-d vectors; matrix row-major d x d; lo, hi length-d range of the fitted sample.
 * @param verb "apply" or "invert", for messages.
 * @throws RemapError at the first non-finite value in x.
 * @example affineApply(column([1, 5]), f64([0]), f64([2]), f64([10]), f64([0]), f64([4]), 'apply') // { n: 2, d: 1, data: [12, 20], outside: 1 }
 */
export function affineApply(x: Points, from: Float64Array, matrix: Float64Array, to: Float64Array, lo: Float64Array, hi: Float64Array, verb: string): Mapped {
  const { n, d, data } = x;
  if (data.length !== n * d) throw new RemapError(`${verb}: the values hold ${data.length} numbers but n x d = ${n * d}; build them with points().`);
  const out = new Float64Array(n * d);
  const diff = new Float64Array(d);
  let outside = 0;
  for (let i = 0, o = 0; i < n; i++, o += d) {
    let off = false;
    for (let k = 0; k < d; k++) {
      const v = data[o + k];
      if (!(v >= lo[k] && v <= hi[k])) {
        // Rare path: outside the range, or not a number at all.
        if (v - v !== 0)
          throw new RemapError(`${verb}: row ${i + 1}, column ${k + 1} is ${v}; give finite numbers (blank or text cells are dropped before this step).`);
        off = true;
      }
      diff[k] = v - from[k];
    }
    if (off) outside++;
    // Four (then two) output coordinates per pass over diff: fewer loads and less loop overhead.
    let l = 0;
    for (; l + 3 < d; l += 4) {
      const b0 = l * d;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let k = 0; k < d; k++) {
        const t = diff[k];
        s0 += matrix[b0 + k] * t;
        s1 += matrix[b0 + d + k] * t;
        s2 += matrix[b0 + 2 * d + k] * t;
        s3 += matrix[b0 + 3 * d + k] * t;
      }
      out[o + l] = to[l] + s0;
      out[o + l + 1] = to[l + 1] + s1;
      out[o + l + 2] = to[l + 2] + s2;
      out[o + l + 3] = to[l + 3] + s3;
    }
    for (; l + 1 < d; l += 2) {
      const b0 = l * d;
      const b1 = b0 + d;
      let s0 = 0;
      let s1 = 0;
      for (let k = 0; k < d; k++) {
        const t = diff[k];
        s0 += matrix[b0 + k] * t;
        s1 += matrix[b1 + k] * t;
      }
      out[o + l] = to[l] + s0;
      out[o + l + 1] = to[l + 1] + s1;
    }
    if (l < d) {
      const b0 = l * d;
      let s0 = 0;
      for (let k = 0; k < d; k++) s0 += matrix[b0 + k] * diff[k];
      out[o + l] = to[l] + s0;
    }
  }
  return { n, d, data: out, outside };
}
