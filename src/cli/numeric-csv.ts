import { csvCell } from './csv';

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
  /** Per column: the number (NUMBER, NON_FINITE), or the index into `texts` (TEXT); 0 for BLANK. Length >= rows. */
  readonly values: Float64Array[];
  /** Per column: BLANK, NUMBER, NON_FINITE or TEXT for each row. Length >= rows. */
  readonly kinds: Uint8Array[];
  /** The text fields, as written (unquoted, not trimmed). */
  readonly texts: string[];
}

const POW10 = [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];
const TWO53 = 9007199254740992;
const COMMA = 44;
const LF = 10;
const CR = 13;
const QUOTE = 34;

// The field just read: a range of the text, or (for quoted fields that need unescaping) a string.
let fieldStr: string | null = null;
let fieldA = 0;
let fieldB = 0;
// The field just classified.
let kind = BLANK;
let value = 0;

/** Reads one field starting at i; returns where it stops (a comma, a line end or the end), or -1 for a quote that never ends. */
function readField(text: string, i: number, n: number): number {
  if (i < n && text.charCodeAt(i) === QUOTE) {
    // The usual quoted field: "...", no quote inside, then a separator, a line end or the end.
    const j = text.indexOf('"', i + 1);
    if (j < 0) return -1;
    const after = j + 1 < n ? text.charCodeAt(j + 1) : COMMA;
    if (after === COMMA || after === LF || after === CR) {
      fieldStr = null;
      fieldA = i + 1;
      fieldB = j;
      return j + 1;
    }
    // Anything else (doubled quotes, text after the closing quote): the rules of parseCSV, character by character.
    let field = '';
    let quoted = true;
    i++;
    while (i < n) {
      const c = text.charCodeAt(i);
      if (quoted) {
        if (c === QUOTE) {
          if (text.charCodeAt(i + 1) === QUOTE) {
            field += '"';
            i += 2;
            continue;
          }
          quoted = false;
          i++;
          continue;
        }
        field += text[i];
        i++;
        continue;
      }
      if (c === QUOTE && field === '') {
        quoted = true;
        i++;
      } else if (c === COMMA || c === LF || c === CR) break;
      else {
        field += text[i];
        i++;
      }
    }
    if (quoted) return -1;
    fieldStr = field;
    return i;
  }
  const a = i;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === COMMA || c === LF || c === CR) break;
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

/** What csvCell would make of s.slice(a, b), and the generic reading for anything but plain ASCII numbers. */
function classify(s: string, a: number, b: number): void {
  const a0 = a;
  const b0 = b;
  while (a < b && isSpace(s.charCodeAt(a))) a++;
  while (b > a && isSpace(s.charCodeAt(b - 1))) b--;
  if (a === b) {
    kind = BLANK;
    value = 0;
    return;
  }
  // /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/, the syntax csvCell accepts
  let p = a;
  let c = s.charCodeAt(p);
  let neg = false;
  if (c === 43 || c === 45) {
    neg = c === 45;
    p++;
  }
  let m = 0;
  const intStart = p;
  while (p < b && (c = s.charCodeAt(p)) >= 48 && c <= 57) {
    m = m * 10 + (c - 48);
    p++;
  }
  const intDigits = p - intStart;
  let fracDigits = 0;
  if (p < b && s.charCodeAt(p) === 46) {
    p++;
    const fracStart = p;
    while (p < b && (c = s.charCodeAt(p)) >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      p++;
    }
    fracDigits = p - fracStart;
  }
  let ok = intDigits + fracDigits > 0;
  let e10 = -fracDigits;
  if (ok && p < b && ((c = s.charCodeAt(p)) === 101 || c === 69)) {
    p++;
    let eneg = false;
    if (p < b && ((c = s.charCodeAt(p)) === 43 || c === 45)) {
      eneg = c === 45;
      p++;
    }
    const expStart = p;
    let e = 0;
    while (p < b && (c = s.charCodeAt(p)) >= 48 && c <= 57) {
      if (e < 1e6) e = e * 10 + (c - 48);
      p++;
    }
    if (p === expStart) ok = false;
    e10 += eneg ? -e : e;
  }
  if (!ok || p !== b) {
    generic(s.slice(a0, b0));
    return;
  }
  // Exact when the digits make an integer below 2^53 and the power of ten is exact (at most 1e22):
  // one correctly rounded product or quotient of two exact doubles is the correctly rounded decimal,
  // which is what Number() gives. (Clinger, "How to read floating point numbers accurately", PLDI 1990.)
  // The digits are summed in doubles; once a partial sum passes 2^53 the final one does too.
  let v: number;
  if (m < TWO53 && e10 >= -22 && e10 <= 22) {
    v = e10 < 0 ? m / POW10[-e10] : m * POW10[e10];
    if (neg) v = -v;
  } else v = Number(s.slice(a, b));
  value = v;
  kind = v - v === 0 ? NUMBER : NON_FINITE;
}

function generic(field: string): void {
  const v = csvCell(field);
  if (v === null) {
    kind = BLANK;
    value = 0;
  } else if (typeof v === 'number') {
    kind = Number.isFinite(v) ? NUMBER : NON_FINITE;
    value = v;
  } else {
    kind = TEXT;
    value = -1; // set by the caller
  }
}

/**
 * Reads comma-separated text (a header line, then rows) into columns.
 * Cost: O(length), one pass; memory: 9 bytes per cell (a double and a kind) plus the text fields.
 * @returns the table, or null when the general reader must read it (see the top of this file).
 * @example scanNumericCSV('x,y\n1,a\n,2\n', 'f.csv') // header ['x', 'y'], rows 2, x: 1 then blank, y: text 'a' then 2
 */
export function scanNumericCSV(text: string, name: string): NumericTable | null {
  const n = text.length;
  let pos = n > 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const header: string[] = [];
  let headerEmpty = true;
  for (;;) {
    const end = readField(text, pos, n);
    if (end < 0) return null;
    const raw = fieldStr ?? text.slice(fieldA, fieldB);
    if (raw !== '') headerEmpty = false;
    header.push(raw.trim());
    pos = end;
    if (pos >= n) break;
    const c = text.charCodeAt(pos);
    if (c === COMMA) {
      pos++;
      continue;
    }
    pos += c === CR && text.charCodeAt(pos + 1) === LF ? 2 : 1;
    break;
  }
  if (new Set(header).size !== header.length) return null;
  const width = header.length;
  let cap = 1024;
  let values = header.map(() => new Float64Array(cap));
  let kinds = header.map(() => new Uint8Array(cap));
  const texts: string[] = [];
  let row = 0;
  let lastUsed = -1;
  let shortEmpty = false;
  while (pos < n) {
    if (row === cap) {
      cap *= 2;
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
      const end = readField(text, pos, n);
      if (end < 0) return null;
      if (f >= width) {
        // Too many fields: ragged, unless the line is empty and at the end (the general reader drops those first).
        if (fieldStr === null ? fieldB > fieldA : fieldStr !== '') return null;
        f++;
        pos = end;
        if (pos >= n) break;
        const c = text.charCodeAt(pos);
        if (c === COMMA) {
          pos++;
          continue;
        }
        pos += c === CR && text.charCodeAt(pos + 1) === LF ? 2 : 1;
        break;
      }
      let s: string;
      if (fieldStr === null) {
        s = text;
        if (fieldB > fieldA) empty = false;
        classify(text, fieldA, fieldB);
      } else {
        s = fieldStr;
        if (s !== '') empty = false;
        classify(s, 0, s.length);
      }
      if (kind === TEXT) {
        value = texts.length;
        texts.push(fieldStr === null ? s.slice(fieldA, fieldB) : s);
      }
      values[f][row] = value;
      kinds[f][row] = kind;
      f++;
      pos = end;
      if (pos >= n) break;
      const c = text.charCodeAt(pos);
      if (c === COMMA) {
        pos++;
        continue;
      }
      pos += c === CR && text.charCodeAt(pos + 1) === LF ? 2 : 1;
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
  return { name, header, rows: lastUsed + 1, values, kinds, texts };
}
