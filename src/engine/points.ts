import { RemapError } from './errors';

/**
 * A block of n points in d dimensions, row-major: point i, coordinate k is
 * `data[i * d + k]`. Every engine function takes and returns this shape; nothing
 * in the engine mutates a Points it was given.
 */
export interface Points {
  readonly n: number;
  readonly d: number;
  readonly data: Float64Array;
}

/**
 * A sample to fit from: points plus optional non-negative row weights (survey
 * weights, frequencies). `weights === null` means every row weighs the same.
 * Weights need not sum to one; they are normalised where used.
 */
export interface Sample extends Points {
  readonly weights: Float64Array | null;
}

/**
 * Builds Points from row arrays (`rows[i][k]`), copying into one Float64Array.
 * @example points([[1, 2], [3, 4]]) // { n: 2, d: 2, data: [1, 2, 3, 4] }
 */
export function points(rows: ReadonlyArray<ReadonlyArray<number>>): Points {
  const n = rows.length;
  const d = n > 0 ? rows[0].length : 0;
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const r = rows[i];
    if (r.length !== d) throw new RemapError(`points: row ${i + 1} has ${r.length} values but row 1 has ${d}; give every row the same number of columns.`);
    for (let k = 0; k < d; k++) data[i * d + k] = r[k];
  }
  return { n, d, data };
}

/** Points of one column from a list of numbers (copied). */
export function column(values: ArrayLike<number>): Points {
  return { n: values.length, d: 1, data: Float64Array.from(values) };
}

/** A Sample from rows (or a single column of numbers) and optional weights, copied. */
export function sample(rows: ReadonlyArray<ReadonlyArray<number>> | ArrayLike<number>, weights?: ArrayLike<number> | null): Sample {
  const p = isRowList(rows) ? points(rows) : column(rows);
  let w: Float64Array | null = null;
  if (weights != null) {
    if (weights.length !== p.n) throw new RemapError(`sample: ${weights.length} weights were given for ${p.n} rows; give one weight per row.`);
    w = Float64Array.from(weights);
  }
  return { n: p.n, d: p.d, data: p.data, weights: w };
}

function isRowList(x: unknown): x is ReadonlyArray<ReadonlyArray<number>> {
  return Array.isArray(x) && x.length > 0 && Array.isArray(x[0]);
}

/** Copies column k of `p` into a new Float64Array. O(n). */
export function columnOf(p: Points, k: number): Float64Array {
  const out = new Float64Array(p.n);
  for (let i = 0, j = k; i < p.n; i++, j += p.d) out[i] = p.data[j];
  return out;
}

/** Points back to plain row arrays (for cells, CSV and tests). */
export function toRows(p: Points): number[][] {
  const rows: number[][] = new Array(p.n);
  for (let i = 0; i < p.n; i++) rows[i] = Array.from(p.data.subarray(i * p.d, (i + 1) * p.d));
  return rows;
}
