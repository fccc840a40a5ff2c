import { RemapError } from '../errors';
import type { Points } from '../points';

/**
 * The table of squared Euclidean distances between every source row and every
 * target row: entry (i, j), at `i * target.n + j`, is sum_k (x_ik - y_jk)^2,
 * computed from the differences (not from |x|^2 + |y|^2 - 2<x, y>, which
 * loses digits when points sit far from the origin).
 *
 * Cost: O(n_source * n_target * d) time, n_source * n_target * 8 bytes
 * (2,000 x 2,000 is 32 MB).
 *
 * @param source rows x_i (any n >= 0, d >= 1). Not mutated.
 * @param target rows y_j with the same d. Not mutated.
 * @param signal optional; checked every 256 rows, and when `aborted` is true the build stops.
 * @throws RemapError (kind 'value') if the column counts differ; (kind 'cancelled') if cancelled.
 * @example
 * squaredDistanceTable(points([[0, 0], [1, 1]]), points([[1, 0]]))
 * // Float64Array [1, 1]
 */
export function squaredDistanceTable(source: Points, target: Points, signal?: { readonly aborted: boolean }): Float64Array {
  const fn = 'squaredDistanceTable';
  if (source.d !== target.d) {
    throw new RemapError(`${fn}: the source has ${source.d} column${source.d === 1 ? '' : 's'} and the target ${target.d}; give both the same columns.`);
  }
  const { n: ns, d, data: xs } = source;
  const { n: nt, data: ys } = target;
  const out = new Float64Array(ns * nt);
  for (let i = 0; i < ns; i++) {
    if ((i & 255) === 0 && signal?.aborted) {
      throw new RemapError(`${fn}: the distance table was cancelled before it was complete.`, 'cancelled');
    }
    const xo = i * d;
    const row = i * nt;
    if (d === 1) {
      const x0 = xs[xo];
      for (let j = 0; j < nt; j++) {
        const a = x0 - ys[j];
        out[row + j] = a * a;
      }
    } else {
      for (let j = 0, yo = 0; j < nt; j++, yo += d) {
        let s = 0;
        for (let k = 0; k < d; k++) {
          const a = xs[xo + k] - ys[yo + k];
          s += a * a;
        }
        out[row + j] = s;
      }
    }
  }
  return out;
}
