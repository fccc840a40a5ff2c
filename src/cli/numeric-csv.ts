import { csvCell } from './csv';
import { POW10 as SHARED_POW10, toDecimal as sharedToDecimal } from './exact-decimal';

/**
 * Reads CSV text straight into one typed array per column, in one pass, with
 * no array per row and no string per numeric field. It reads exactly what
 * `parseCSV` followed by `csvCell` reads (same quotes, line ends, byte-order
 * mark, trailing empty lines, trimming and number syntax); a test runs both on
 * the same files and compares every value bit for bit. Whatever it does not
 * read the same way quickly (an unterminated quote, ragged lines, an empty
 * file, a header naming a column twice) gives null, and the caller reads the
 * file the general way, which also words the error.
 */

/** What a field holds: a blank, a finite number, a NaN/Infinity spelling, or text. */
export const BLANK = 0;
export const NUMBER = 1;
export const NON_FINITE = 2;
export const TEXT = 3;

/** A CSV file read as columns. */
export interface NumericTable {
  readonly name: string;
  /** Column names from the first line, trimmed. */
  readonly header: string[];
  /** Data rows (the header not counted, trailing empty lines dropped). */
  readonly rows: number;
  /** Lines read after the header, trailing empty lines included (a piece of a file cut at line ends needs lines = rows). */
  readonly lines?: number;
  /** Per column: the number (NUMBER, NON_FINITE), or the index into `texts` (TEXT); 0 for BLANK. Length >= rows. */
  readonly values: Float64Array[];
  /** Per column: BLANK, NUMBER, NON_FINITE or TEXT for each row. Length >= rows. */
  readonly kinds: Uint8Array[];
  /** The text fields, as written (unquoted, not trimmed). */
  readonly texts: string[];
}

const COMMA = 44;
const POINT = 46;
const LF = 10;
const CR = 13;
const QUOTE = 34;
/** The pattern dialect.ts rewrites with a decimal point (an unquoted number written with a decimal comma). */
const COMMA_NUMBER = /^\s*[+-]?(\d+,?\d*|,\d+)([eE][+-]?\d+)?\s*$/;
// Bound once: the compiled module would otherwise read them off the other module's exports at every field.
const POW10 = SHARED_POW10;
const toDecimal = sharedToDecimal;
/** A lone UTF-16 surrogate: such text has no UTF-8 bytes that read back the same. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

// The file being read and its dialect.
let buf: Buffer = Buffer.alloc(0);
let SEP = COMMA;
let commaDecimal = false;
// The field just read: a range of the bytes, or (for quoted fields that need unescaping) a string.
let fieldStr: string | null = null;
let fieldA = 0;
let fieldB = 0;
let fieldQuoted = false;
// The field just classified.
let kind = BLANK;
/** The number just read (a typed-array slot: a module-level `let` holding a double is boxed, and each write would allocate). */
const valueSlot = new Float64Array(1);

/**
 * Reads one field starting at i; returns where it stops (a separator, a line end or the end), or -1 for a quote that never ends.
 * Every byte that ends or splits a field is ASCII, and no byte of a multi-byte UTF-8 character is, so decoding a field's
 * bytes alone gives the characters that decoding the whole file gives there.
 */
function readField(i: number, n: number): number {
  const bytes = buf;
  if (i < n && bytes[i] === QUOTE) {
    fieldQuoted = true;
    // The usual quoted field: "...", no quote inside, then a separator, a line end or the end.
    const j = bytes.indexOf(QUOTE, i + 1);
    if (j < 0) return -1;
    const after = j + 1 < n ? bytes[j + 1] : SEP;
    if (after === SEP || after === LF || after === CR) {
      fieldStr = null;
      fieldA = i + 1;
      fieldB = j;
      return j + 1;
    }
    // Anything else (doubled quotes, text after the closing quote): the rules of parseCSV, piece by piece.
    let field = '';
    let quoted = true;
    i++;
    let a = i;
    while (i < n) {
      const c = bytes[i];
      if (quoted) {
        if (c === QUOTE) {
          field += bytes.toString('utf8', a, i);
          if (bytes[i + 1] === QUOTE) {
            field += '"';
            i += 2;
            a = i;
            continue;
          }
          quoted = false;
          i++;
          a = i;
          continue;
        }
        i++;
        continue;
      }
      if (c === QUOTE && field === '' && a === i) {
        quoted = true;
        i++;
        a = i;
      } else if (c === SEP || c === LF || c === CR) break;
      else i++;
    }
    if (quoted) return -1;
    field += bytes.toString('utf8', a, i);
    fieldStr = field;
    return i;
  }
  fieldQuoted = false;
  const a = i;
  while (i < n) {
    const c = bytes[i];
    if (c === SEP || c === LF || c === CR) break;
    i++;
  }
  fieldStr = null;
  fieldA = a;
  fieldB = i;
  return i;
}

function isSpace(c: number): boolean {
  return c === 32 || (c >= 9 && c <= 13);
}

/** A field as the comma-separated, decimal-point text dialect.ts makes of it (an unquoted decimal comma becomes a point). */
function asStandard(field: string, quoted: boolean): string {
  return commaDecimal && !quoted && COMMA_NUMBER.test(field) ? field.replace(',', '.') : field;
}

/** The field just read as a string, as written (unquoted, not trimmed, not rewritten). */
function fieldText(): string {
  return fieldStr ?? buf.toString('utf8', fieldA, fieldB);
}

/**
 * What csvCell would make of the bytes a..b (after dialect.ts, for another dialect), and the generic reading for anything
 * but plain ASCII numbers. An unquoted field may use the decimal comma of its dialect or a point (dialect.ts leaves a
 * number with a point as it is, and csvCell reads it); a quoted field only a point.
 */
function classify(a: number, b: number, quoted: boolean): void {
  const bytes = buf;
  const a0 = a;
  const b0 = b;
  while (a < b && isSpace(bytes[a])) a++;
  while (b > a && isSpace(bytes[b - 1])) b--;
  if (a === b) {
    kind = BLANK;
    valueSlot[0] = 0;
    return;
  }
  const mark = commaDecimal && !quoted ? COMMA : POINT;
  // /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/, the syntax csvCell accepts
  let p = a;
  let c = bytes[p];
  let neg = false;
  if (c === 43 || c === 45) {
    neg = c === 45;
    p++;
  }
  // The digits as m * 10^nl + ml: m takes them while it stays below 9e14 (so below 2^53 with one more digit), ml the rest.
  let m = 0;
  let ml = 0;
  let nl = 0;
  const intStart = p;
  while (p < b && (c = bytes[p]) >= 48 && c <= 57) {
    if (m < 9e14) m = m * 10 + (c - 48);
    else {
      ml = ml * 10 + (c - 48);
      nl++;
    }
    p++;
  }
  const intDigits = p - intStart;
  let fracDigits = 0;
  let markAt = -1;
  if (p < b && ((c = bytes[p]) === POINT || c === mark)) {
    markAt = p;
    p++;
    const fracStart = p;
    while (p < b && (c = bytes[p]) >= 48 && c <= 57) {
      if (m < 9e14) m = m * 10 + (c - 48);
      else {
        ml = ml * 10 + (c - 48);
        nl++;
      }
      p++;
    }
    fracDigits = p - fracStart;
  }
  let ok = intDigits + fracDigits > 0;
  let e10 = -fracDigits;
  if (ok && p < b && ((c = bytes[p]) === 101 || c === 69)) {
    p++;
    let eneg = false;
    if (p < b && ((c = bytes[p]) === 43 || c === 45)) {
      eneg = c === 45;
      p++;
    }
    const expStart = p;
    let e = 0;
    while (p < b && (c = bytes[p]) >= 48 && c <= 57) {
      if (e < 1e6) e = e * 10 + (c - 48);
      p++;
    }
    if (p === expStart) ok = false;
    e10 += eneg ? -e : e;
  }
  if (!ok || p !== b) {
    generic(asStandard(bytes.toString('utf8', a0, b0), quoted));
    return;
  }
  // Exact when the digits make an integer below 2^53 and the power of ten is exact (at most 1e22):
  // one correctly rounded product or quotient of two exact doubles is the correctly rounded decimal,
  // which is what Number() gives. (Clinger, "How to read floating point numbers accurately", PLDI 1990.)
  // Up to 20 digits (the 17 of a double's shortest form, say), toDecimal below, or else Number() itself.
  let v = NaN;
  if (e10 >= -22 && e10 <= 22) {
    if (nl === 0) {
      v = e10 < 0 ? m / POW10[-e10] : m * POW10[e10];
      if (neg) v = -v;
    } else if (nl <= 4) {
      v = toDecimal(m, ml, POW10[nl], e10);
      if (neg) v = -v;
    }
  }
  if (v !== v) {
    if (markAt >= 0 && bytes[markAt] === COMMA) v = Number(bytes.toString('latin1', a, markAt) + '.' + bytes.toString('latin1', markAt + 1, b));
    else v = Number(bytes.toString('latin1', a, b));
  }
  valueSlot[0] = v;
  kind = v - v === 0 ? NUMBER : NON_FINITE;
}

function generic(field: string): void {
  const v = csvCell(field);
  if (v === null) {
    kind = BLANK;
    valueSlot[0] = 0;
  } else if (typeof v === 'number') {
    kind = Number.isFinite(v) ? NUMBER : NON_FINITE;
    valueSlot[0] = v;
  } else {
    kind = TEXT;
    valueSlot[0] = -1; // set by the caller
  }
}

/** Bytes from..to of a file (to exclusive). */
export interface ByteRange {
  readonly from: number;
  readonly to: number;
}

/** How the file separates fields and writes decimals (the shape of dialect.ts's Dialect). */
export interface ScanDialect {
  readonly delimiter: string;
  readonly decimal: string;
}

const STANDARD: ScanDialect = { delimiter: ',', decimal: '.' };

/**
 * Reads comma-separated text (a header line, then rows) into columns: the text's UTF-8 bytes through `scanNumericBytes`.
 * @returns the table, or null when the general reader must read it (see the top of this file).
 * @example scanNumericCSV('x,y\n1,a\n,2\n', 'f.csv') // header ['x', 'y'], rows 2, x: 1 then blank, y: text 'a' then 2
 */
export function scanNumericCSV(text: string, name: string, dialect: ScanDialect = STANDARD): NumericTable | null {
  if (LONE_SURROGATE.test(text)) return null;
  return scanNumericBytes(Buffer.from(text, 'utf8'), name, dialect);
}

/**
 * Reads a delimited file's bytes (UTF-8; a header line, then rows) into columns, in one pass, without decoding the file:
 * numbers are read from their ASCII digits, and only header names and text fields are decoded. For a dialect other than
 * comma and decimal point it reads what dialect.ts's `toStandardCSV` followed by `scanNumericCSV` reads, without
 * rewriting the text first. Cost: O(length), one pass; memory: 9 bytes per cell (a double and a kind) plus the text fields.
 * @param dialect the separator (',', ';' or a tab) and decimal mark ('.' or ',', a comma only with another separator).
 * @param rows where the rows to read are, when only some of the file's lines are wanted (a piece cut at line ends, after
 * the header, which is always read from the start): the table then holds those rows only.
 * @returns the table, or null when the general reader must read it (see the top of this file).
 * @example scanNumericBytes(Buffer.from('x;y\n1,5;a\n'), 'f.csv', { delimiter: ';', decimal: ',' }) // header ['x', 'y'], x: 1.5, y: text 'a'
 */
export function scanNumericBytes(bytes: Uint8Array, name: string, dialect: ScanDialect = STANDARD, rows?: ByteRange): NumericTable | null {
  buf = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  SEP = dialect.delimiter.charCodeAt(0);
  commaDecimal = dialect.decimal === ',' && SEP !== COMMA;
  try {
    return scan(name, rows);
  } finally {
    buf = Buffer.alloc(0);
  }
}

function scan(name: string, range: ByteRange | undefined): NumericTable | null {
  let n = buf.length;
  let pos = n >= 3 && buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf ? 3 : 0;
  const header: string[] = [];
  let headerEmpty = true;
  for (;;) {
    const end = readField(pos, n);
    if (end < 0) return null;
    const raw = asStandard(fieldText(), fieldQuoted);
    if (raw !== '') headerEmpty = false;
    header.push(raw.trim());
    pos = end;
    if (pos >= n) break;
    const c = buf[pos];
    if (c === SEP) {
      pos++;
      continue;
    }
    pos += c === CR && buf[pos + 1] === LF ? 2 : 1;
    break;
  }
  if (new Set(header).size !== header.length) return null;
  if (range) {
    if (range.from < pos || range.to > n || range.from > range.to) return null;
    pos = range.from;
    n = range.to;
  }
  const width = header.length;
  let cap = 1024;
  const first = pos;
  let values = header.map(() => new Float64Array(cap));
  let kinds = header.map(() => new Uint8Array(cap));
  const texts: string[] = [];
  let row = 0;
  let lastUsed = -1;
  let shortEmpty = false;
  while (pos < n) {
    if (row === cap) {
      // After the first rows, room for as many more as the rest of the file holds at their length, so the columns
      // are copied about once (then doubling).
      cap = row === 1024 ? Math.max(2 * cap, Math.ceil(((n - first) / (pos - first)) * 1.05 * row) + 1024) : 2 * cap;
      values = values.map((v) => {
        const g = new Float64Array(cap);
        g.set(v);
        return g;
      });
      kinds = kinds.map((k) => {
        const g = new Uint8Array(cap);
        g.set(k);
        return g;
      });
    }
    let f = 0;
    let empty = true;
    for (;;) {
      const end = readField(pos, n);
      if (end < 0) return null;
      if (f >= width) {
        // Too many fields: ragged, unless the line is empty and at the end (the general reader drops those first).
        if (fieldStr === null ? fieldB > fieldA : fieldStr !== '') return null;
        f++;
        pos = end;
        if (pos >= n) break;
        const c = buf[pos];
        if (c === SEP) {
          pos++;
          continue;
        }
        pos += c === CR && buf[pos + 1] === LF ? 2 : 1;
        break;
      }
      if (fieldStr === null) {
        if (fieldB > fieldA) empty = false;
        classify(fieldA, fieldB, fieldQuoted);
      } else {
        if (fieldStr !== '') empty = false;
        generic(fieldStr);
      }
      if (kind === TEXT) {
        valueSlot[0] = texts.length;
        texts.push(fieldText());
      }
      values[f][row] = valueSlot[0];
      kinds[f][row] = kind;
      f++;
      pos = end;
      if (pos >= n) break;
      const c = buf[pos];
      if (c === SEP) {
        pos++;
        continue;
      }
      pos += c === CR && buf[pos + 1] === LF ? 2 : 1;
      break;
    }
    if (empty) {
      // An empty line is dropped at the end of the file; elsewhere it is a row of blanks, or too short.
      if (f !== width) shortEmpty = true;
      for (let k = f; k < width; k++) kinds[k][row] = BLANK;
    } else {
      if (f !== width || shortEmpty) return null;
      lastUsed = row;
    }
    row++;
  }
  if (lastUsed < 0 && headerEmpty) return null;
  return { name, header, rows: lastUsed + 1, lines: row, values, kinds, texts };
}
