import { RemapError } from '../engine/errors';

/**
 * CSV as RFC 4180 describes it: comma-separated fields, fields in double quotes
 * may hold commas, quotes (doubled) and line breaks; lines end in LF or CRLF.
 * A leading byte-order mark is dropped. O(length).
 * @throws RemapError for an unterminated quoted field or ragged rows (naming the line).
 * @example parseCSV('a,b\n1,"x,y"\n') // [['a', 'b'], ['1', 'x,y']]
 */
export function parseCSV(text: string, name = 'CSV'): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let quoted = false;
  let line = 1;
  let fieldStartLine = 1;
  const n = text.length;
  while (i < n) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i += 2;
          continue;
        }
        quoted = false;
        i++;
        continue;
      }
      if (c === '\n') line++;
      field += c;
      i++;
      continue;
    }
    if (c === '"' && field === '') {
      quoted = true;
      fieldStartLine = line;
      i++;
    } else if (c === ',') {
      row.push(field);
      field = '';
      i++;
    } else if (c === '\n' || c === '\r') {
      row.push(field);
      field = '';
      rows.push(row);
      row = [];
      i += c === '\r' && text[i + 1] === '\n' ? 2 : 1;
      line++;
    } else {
      field += c;
      i++;
    }
  }
  if (quoted) throw new RemapError(`${name}: a quoted field starting on line ${fieldStartLine} never ends; close its double quote.`);
  if (field !== '' || row.length > 0) {
    row.push(field);
    rows.push(row);
  }
  // drop wholly empty trailing lines
  while (rows.length > 0 && rows[rows.length - 1].every((f) => f === '')) rows.pop();
  if (rows.length > 0) {
    const width = rows[0].length;
    for (let r = 1; r < rows.length; r++) {
      if (rows[r].length !== width) {
        throw new RemapError(`${name}: line ${r + 1} has ${rows[r].length} fields but the header has ${width}; every line needs the same number of fields.`);
      }
    }
  }
  return rows;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NON_FINITE: Record<string, number> = {
  nan: NaN,
  inf: Infinity,
  '+inf': Infinity,
  '-inf': -Infinity,
  infinity: Infinity,
  '+infinity': Infinity,
  '-infinity': -Infinity,
};

/**
 * What a CSV field holds, in the terms of the coercion module: '' is blank
 * (null), a decimal number is a number, NaN/Infinity spellings are non-finite
 * numbers (rejected later with a message), anything else is text.
 * @example csvCell(' 2.5e3 ') // 2500
 */
export function csvCell(field: string): number | string | null {
  const t = field.trim();
  if (t === '') return null;
  if (NUMBER.test(t)) return Number(t);
  const nf = NON_FINITE[t.toLowerCase()];
  if (nf !== undefined) return nf;
  return field;
}

/** Quotes a field when it holds a comma, quote or line break. @example quoteField('a,b') // '"a,b"' */
export function quoteField(field: string): string {
  return /[",\r\n]/.test(field) ? `"${field.replace(/"/g, '""')}"` : field;
}

/**
 * Writes rows as CSV with LF line ends. Numbers are written in JavaScript's
 * shortest round-trip form, so reading them back gives the same doubles.
 */
export function formatCSV(rows: ReadonlyArray<ReadonlyArray<string | number | boolean | null>>): string {
  let out = '';
  for (const r of rows) {
    out += r.map((v) => (v === null ? '' : typeof v === 'number' ? String(v) : quoteField(String(v)))).join(',') + '\n';
  }
  return out;
}
