import type { Mapped, TransportMap } from '../engine/map';
import { quoteField } from './csv';
import { BLANK, NUMBER, TEXT, type NumericTable } from './numeric-csv';

/** Rows joined into one string at a time: large enough to be cheap, small enough not to hold a second copy of the output in pieces. */
const CHUNK = 16384;

/**
 * `remap apply` / `invert` on a table read by `scanNumericCSV`: maps the
 * columns the map knows and writes the whole file as CSV, as the general path
 * writes it (numbers in shortest round-trip form, String(x); other columns as
 * read; a blank to map stays blank). Cost: O(rows x columns) plus the map's.
 * @returns the CSV text and the mapped points, or null for what the general
 * path must handle or word as an error: columns that do not match the map,
 * no rows, text or non-finite numbers to map, a row with only some of its
 * cells blank, a result that is not finite.
 */
export function mapTable(t: NumericTable, map: TransportMap, direction: 'apply' | 'invert'): { csv: string; mapped: Mapped } | null {
  const names = map.diagnostics().columns;
  let cols: number[];
  if (names && names.every((c) => t.header.includes(c))) cols = names.map((c) => t.header.indexOf(c));
  else if (t.header.length === map.d) cols = t.header.map((_, k) => k);
  else return null;
  const d = map.d;
  const rows = t.rows;
  if (rows === 0 || cols.length !== d) return null;
  const kinds = cols.map((k) => t.kinds[k]);
  const values = cols.map((k) => t.values[k]);
  const slots = new Int32Array(rows);
  const data = new Float64Array(rows * d);
  let n = 0;
  for (let i = 0; i < rows; i++) {
    let blanks = 0;
    for (let j = 0; j < d; j++) {
      const kind = kinds[j][i];
      if (kind === BLANK) blanks++;
      else if (kind !== NUMBER) return null;
    }
    if (blanks === d) slots[i] = -1;
    else if (blanks > 0) return null;
    else {
      for (let j = 0; j < d; j++) data[n * d + j] = values[j][i];
      slots[i] = n++;
    }
  }
  const points = { n, d, data: data.slice(0, n * d) };
  const mapped = direction === 'apply' ? map.apply(points) : map.invert(points);
  const out = mapped.data;
  for (let i = 0; i < n * d; i++) if (!Number.isFinite(out[i])) return null;
  return { csv: formatMapped(t, cols, slots, out, d), mapped };
}

function formatMapped(t: NumericTable, cols: number[], slots: Int32Array, out: Float64Array, d: number): string {
  const width = t.header.length;
  const chunks: string[] = [t.header.map(quoteField).join(',') + '\n'];
  const lines: string[] = new Array(Math.min(CHUNK, t.rows));
  let m = 0;
  const flush = () => {
    lines.length = m;
    chunks.push(lines.join('\n') + '\n');
    m = 0;
  };
  const mappedAt = new Int32Array(width).fill(-1);
  cols.forEach((k, j) => (mappedAt[k] = j));
  if (width === 1 && d === 1) {
    for (let i = 0; i < t.rows; i++) {
      const s = slots[i];
      lines[m++] = s >= 0 ? String(out[s]) : '';
      if (m === CHUNK) flush();
    }
  } else {
    for (let i = 0; i < t.rows; i++) {
      const s = slots[i];
      let line = '';
      for (let k = 0; k < width; k++) {
        if (k > 0) line += ',';
        const j = mappedAt[k];
        if (j >= 0) {
          if (s >= 0) line += String(out[s * d + j]);
        } else {
          const kind = t.kinds[k][i];
          if (kind === TEXT) line += quoteField(t.texts[t.values[k][i]]);
          else if (kind !== BLANK) line += String(t.values[k][i]);
        }
      }
      lines[m++] = line;
      if (m === CHUNK) flush();
    }
  }
  if (m > 0) flush();
  return chunks.join('');
}
