import { RemapError } from '../errors';
import type { Points } from '../points';

/**
 * Squared Euclidean distances between rows of point blocks, computed as the
 * sum of squared coordinate differences. The shortcut |x|^2 + |y|^2 - 2 x.y is
 * avoided on purpose: it loses every digit when the data sit far from the
 * origin relative to their spread (values near 1e6 with spread 1), while the
 * direct form costs the same d multiply-adds per pair.
 */

/**
 * The squared length |x_i|^2 of every row of `p`. O(n d).
 * @param p points (any n >= 0, d >= 0).
 * @returns a new Float64Array of length p.n.
 * @example rowSquaredNorms(points([[3, 4], [1, 0]])) // Float64Array [25, 1]
 */
export function rowSquaredNorms(p: Points): Float64Array {
  const { n, d, data } = p;
  const out = new Float64Array(n);
  for (let i = 0, o = 0; i < n; i++, o += d) {
    let s = 0;
    for (let k = 0; k < d; k++) {
      const v = data[o + k];
      s += v * v;
    }
    out[i] = s;
  }
  return out;
}

/**
 * Writes `scale * |x_i - y_j|^2` for every row j of `y` into `out[offset + j]`:
 * one row of a distance matrix, for algorithms that build large matrices row
 * by row (or never store them). O(m d).
 * @param x points; `i` must be a row index of x (0 <= i < x.n).
 * @param y points with the same number of columns as x.
 * @param out receives y.n values starting at `offset`.
 * @param scale multiplies every distance (1 for plain squared distances, 0.5 for the cost |x - y|^2 / 2).
 * @throws RemapError if the column counts differ or `out` is too short.
 * @example const r = new Float64Array(2); squaredDistancesRow(points([[0, 0]]), 0, points([[3, 4], [1, 0]]), r); // r = [25, 1]
 */
export function squaredDistancesRow(x: Points, i: number, y: Points, out: Float64Array, offset = 0, scale = 1): void {
  const d = x.d;
  if (y.d !== d) throw new RemapError(`squaredDistancesRow: x has ${d} columns but y has ${y.d}; give both the same columns.`);
  if (!(i >= 0 && i < x.n)) throw new RemapError(`squaredDistancesRow: row index ${i} is outside 0..${x.n - 1}; give a row of x.`);
  if (out.length < offset + y.n)
    throw new RemapError(`squaredDistancesRow: out holds ${out.length} values but ${offset + y.n} are needed; give a longer array.`);
  const xd = x.data;
  const yd = y.data;
  const xo = i * d;
  const m = y.n;
  if (d === 1) {
    const xi = xd[xo];
    for (let j = 0; j < m; j++) {
      const t = xi - yd[j];
      out[offset + j] = scale * (t * t);
    }
    return;
  }
  for (let j = 0, yo = 0; j < m; j++, yo += d) {
    let s = 0;
    for (let k = 0; k < d; k++) {
      const t = xd[xo + k] - yd[yo + k];
      s += t * t;
    }
    out[offset + j] = scale * s;
  }
}

/**
 * The full n x m matrix of squared distances |x_i - y_j|^2, row-major
 * (entry (i, j) at `i * m + j`). O(n m d) time and 8 n m bytes: a 5,000 x 5,000
 * matrix takes 200 MB, so large problems should work row by row with
 * `squaredDistancesRow` instead.
 * @param x points (n rows), y points (m rows) with the same number of columns.
 * @param scale multiplies every entry (default 1).
 * @throws RemapError if the column counts differ or n m exceeds 2^27 entries (1 GB).
 * @example squaredDistances(points([[0], [1]]), points([[0], [2], [3]])) // Float64Array [0, 4, 9, 1, 1, 4]
 */
export function squaredDistances(x: Points, y: Points, scale = 1): Float64Array {
  if (y.d !== x.d) throw new RemapError(`squaredDistances: x has ${x.d} columns but y has ${y.d}; give both the same columns.`);
  const size = x.n * y.n;
  if (size > 2 ** 27) {
    throw new RemapError(
      `squaredDistances: ${x.n} x ${y.n} distances need ${((size * 8) / 2 ** 30).toFixed(1)} GB; work row by row with squaredDistancesRow or give fewer rows.`,
    );
  }
  const out = new Float64Array(size);
  for (let i = 0; i < x.n; i++) squaredDistancesRow(x, i, y, out, i * y.n, scale);
  return out;
}
