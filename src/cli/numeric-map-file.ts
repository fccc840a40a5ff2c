import type { Mapped, TransportMap } from '../engine/map';
import { quoteField } from './csv';
import { NUMBER_TEXT_MAX, writeNumber } from './number-text';
import { BLANK, NUMBER, TEXT, type NumericTable } from './numeric-csv';

/** Bytes written at a time: large enough to be cheap, small enough that the output is never held whole. */
const PIECE = 1 << 20;

/**
 * `remap apply` / `invert` on a table read by `scanNumericCSV`: maps the
 * columns the map knows and writes the whole file as CSV, as the general path
 * writes it (numbers in shortest round-trip form, String(x); other columns as
 * read; a blank to map stays blank). Cost: O(rows x columns) plus the map's;
 * the output is written piece by piece, never held whole.
 * @param header whether the output starts with the header line (false for a piece of a file after its first).
 * @returns the mapped points and a function that writes the CSV (UTF-8) in pieces of about a megabyte to a sink, or null for what the general
 * path must handle or word as an error: columns that do not match the map,
 * no rows, text or non-finite numbers to map, a row with only some of its
 * cells blank, a result that is not finite.
 */
export function mapTable(
  t: NumericTable,
  map: TransportMap,
  direction: 'apply' | 'invert',
  header = true,
): { mapped: Mapped; write: (sink: (chunk: Uint8Array) => void) => void } | null {
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
  return { mapped, write: (sink) => formatMapped(t, cols, slots, out, d, new Pieces(sink), header) };
}

/** Output bytes gathered into pieces; each piece is a new buffer, so a sink may keep it. */
class Pieces {
  private buf = Buffer.allocUnsafe(PIECE);
  private at = 0;
  constructor(private readonly sink: (chunk: Uint8Array) => void) {}

  /** A number as String(x) spells it (writeNumber, or String(x) itself where writeNumber leaves it). */
  number(x: number): void {
    if (this.at + NUMBER_TEXT_MAX > PIECE) this.flush();
    const end = writeNumber(x, this.buf, this.at);
    if (end >= 0) this.at = end;
    else this.ascii(String(x));
  }

  /** Text that is ASCII (separators, numbers as String(x) writes them). */
  ascii(s: string): void {
    const n = s.length;
    if (this.at + n > PIECE) this.flush();
    const buf = this.buf;
    let at = this.at;
    for (let i = 0; i < n; i++) buf[at++] = s.charCodeAt(i);
    this.at = at;
  }

  byte(c: number): void {
    if (this.at === PIECE) this.flush();
    this.buf[this.at++] = c;
  }

  /** Any text, as UTF-8. */
  text(s: string): void {
    const n = Buffer.byteLength(s, 'utf8');
    if (this.at + n > PIECE) this.flush();
    if (n > PIECE) this.sink(Buffer.from(s, 'utf8'));
    else this.at += this.buf.write(s, this.at, 'utf8');
  }

  flush(): void {
    if (this.at === 0) return;
    this.sink(this.buf.subarray(0, this.at));
    this.buf = Buffer.allocUnsafe(PIECE);
    this.at = 0;
  }
}

const LF = 10;
const COMMA = 44;

function formatMapped(t: NumericTable, cols: number[], slots: Int32Array, out: Float64Array, d: number, w: Pieces, header: boolean): void {
  const width = t.header.length;
  if (header) w.text(t.header.map(quoteField).join(',') + '\n');
  const mappedAt = new Int32Array(width).fill(-1);
  cols.forEach((k, j) => (mappedAt[k] = j));
  if (width === 1 && d === 1) {
    for (let i = 0; i < t.rows; i++) {
      const s = slots[i];
      if (s >= 0) w.number(out[s]);
      w.byte(LF);
    }
  } else {
    for (let i = 0; i < t.rows; i++) {
      const s = slots[i];
      for (let k = 0; k < width; k++) {
        if (k > 0) w.byte(COMMA);
        const j = mappedAt[k];
        if (j >= 0) {
          if (s >= 0) w.number(out[s * d + j]);
        } else {
          const kind = t.kinds[k][i];
          if (kind === TEXT) w.text(quoteField(t.texts[t.values[k][i]]));
          else if (kind !== BLANK) w.number(t.values[k][i]);
        }
      }
      w.byte(LF);
    }
  }
  w.flush();
}
