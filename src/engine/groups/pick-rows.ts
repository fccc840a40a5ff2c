import type { Points, Sample } from '../points';

/**
 * The rows `rows` (ascending indices) of `s`, copied into a new sample with
 * their weights. Cost: O(k d) for k rows. Never mutates `s`.
 * @example pickSampleRows(sample([1, 2, 3], [1, 2, 3]), Int32Array.of(0, 2)) // values [1, 3], weights [1, 3]
 */
export function pickSampleRows(s: Sample, rows: Int32Array): Sample {
  const p = pickPointRows(s, rows);
  let w: Float64Array | null = null;
  if (s.weights) {
    w = new Float64Array(rows.length);
    for (let i = 0; i < rows.length; i++) w[i] = s.weights[rows[i]];
  }
  return { ...p, weights: w };
}

/** The rows `rows` of `p` as new points. O(k d). */
export function pickPointRows(p: Points, rows: Int32Array): Points {
  const d = p.d;
  const data = new Float64Array(rows.length * d);
  for (let i = 0; i < rows.length; i++) {
    const o = rows[i] * d;
    for (let k = 0; k < d; k++) data[i * d + k] = p.data[o + k];
  }
  return { n: rows.length, d, data };
}
