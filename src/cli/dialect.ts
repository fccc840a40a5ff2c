import { RemapError } from '../engine/errors';
import { formatCSV } from './csv';

/** How a delimited text file is written: the field separator and the decimal mark. */
export interface Dialect {
  readonly delimiter: ',' | ';' | '\t';
  readonly decimal: '.' | ',';
}

const NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/** The dialect in words, for the line the command prints. @example describeDialect({ delimiter: ';', decimal: ',' }) // 'semicolon-separated, decimal comma' */
export function describeDialect(d: Dialect): string {
  return `${NAMES[d.delimiter]}-separated, decimal ${d.decimal === ',' ? 'comma' : 'point'}`;
}

/**
 * Reads the dialect from the text: the separator is the one of comma, semicolon
 * and tab found most often in the header line (outside quotes; a tie goes to
 * comma, then semicolon); the decimal mark is a comma when the separator is not
 * a comma and, in the first 1,000 lines, fields like 1,5 outnumber fields like
 * 1.5 (as European locales write numbers). Cost: O(first 1,000 lines).
 * @example detectDialect('a;b\n1,5;2\n') // { delimiter: ';', decimal: ',' }
 */
export function detectDialect(text: string): Dialect {
  return detectIn(text).dialect;
}

/** detectDialect, and the length of text it looked at. */
function detectIn(text: string): { dialect: Dialect; used: number } {
  const counts: Record<string, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  for (; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === '\n' || c === '\r')) break;
    else if (!quoted && c in counts) counts[c]++;
  }
  const delimiter = (counts['\t'] > counts[';'] && counts['\t'] > counts[','] ? '\t' : counts[';'] > counts[','] ? ';' : ',') as Dialect['delimiter'];
  if (delimiter === ',') return { dialect: { delimiter, decimal: '.' }, used: i + 1 };
  let commas = 0;
  let points = 0;
  const lines = text.slice(i, i + 200_000).split(/\r?\n/, 1000);
  for (const line of lines) {
    for (const f of line.split(delimiter)) {
      const t = f.trim().replace(/^"|"$/g, '');
      if (/^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(t)) commas++;
      else if (/^[+-]?\d*\.\d+([eE][+-]?\d+)?$/.test(t)) points++;
    }
  }
  return { dialect: { delimiter, decimal: commas > points ? ',' : '.' }, used: i + 200_001 };
}

/**
 * detectDialect on a file's UTF-8 bytes, decoding only the first megabyte when the header line and the text it looks at
 * after it lie there (else the whole file). Cost: O(1 MB) for the usual file.
 * @example detectDialectBytes(Buffer.from('a;b\n1,5;2\n')) // { delimiter: ';', decimal: ',' }
 */
export function detectDialectBytes(bytes: Uint8Array): Dialect {
  const buf = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const K = 1 << 20;
  if (buf.length > K) {
    // Decoding a prefix may cut a character at its end (read as one U+FFFD); everything before is the file's own text.
    const head = buf.toString('utf8', 0, K);
    const found = detectIn(head);
    if (found.used + 2 < head.length) return found.dialect;
  }
  return detectDialect(buf.toString('utf8'));
}

/**
 * A dialect from the --delimiter and --decimal options, each 'auto' (or
 * absent) to detect it from the text (or to take the one detected, when a dialect is given).
 * @throws RemapError for a value that is not one of the choices.
 * @example dialectFrom('semicolon', 'comma', text) // { delimiter: ';', decimal: ',' }
 */
export function dialectFrom(delimiter: string | undefined, decimal: string | undefined, text: string | Dialect): Dialect {
  const found = typeof text === 'string' ? detectDialect(text) : text;
  const dl: Record<string, Dialect['delimiter']> = { comma: ',', ',': ',', semicolon: ';', ';': ';', tab: '\t', '\\t': '\t' };
  const dc: Record<string, Dialect['decimal']> = { point: '.', '.': '.', comma: ',', ',': ',' };
  const pick = <T>(v: string | undefined, table: Record<string, T>, auto: T, flag: string, choices: string): T => {
    if (v === undefined || v.trim().toLowerCase() === 'auto') return auto;
    const got = table[v.trim().toLowerCase()];
    if (got === undefined) throw new RemapError(`--${flag} must be ${choices}, not "${v}".`);
    return got;
  };
  const delim = pick(delimiter, dl, found.delimiter, 'delimiter', 'comma, semicolon, tab or auto');
  const dec = pick(decimal, dc, delim === ',' ? '.' : found.decimal, 'decimal', 'point, comma or auto');
  if (delim === ',' && dec === ',') throw new RemapError('--decimal comma needs a separator other than the comma; give --delimiter semicolon or tab.');
  return { delimiter: delim, decimal: dec };
}

/**
 * Rewrites a file of another dialect as the comma-separated, decimal-point CSV
 * the command reads: fields split on the separator (double quotes as in RFC
 * 4180), and in a field that is a number written with a decimal comma, the
 * comma becomes a point. Other fields are kept as they are. O(length).
 * @throws RemapError for a quoted field that never ends (naming the line).
 * @example toStandardCSV('a;b\n1,5;x\n', { delimiter: ';', decimal: ',' }) // 'a,b\n1.5,x\n'
 */
export function toStandardCSV(text: string, d: Dialect, name: string): string {
  if (d.delimiter === ',' && d.decimal === '.') return text;
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  let wasQuoted = false;
  let line = 1;
  const number = /^\s*[+-]?(\d+,?\d*|,\d+)([eE][+-]?\d+)?\s*$/;
  const push = () => {
    row.push(!wasQuoted && d.decimal === ',' && number.test(field) ? field.replace(',', '.') : field);
    field = '';
    wasQuoted = false;
  };
  for (let i = text.charCodeAt(0) === 0xfeff ? 1 : 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i++;
        } else quoted = false;
      } else {
        if (c === '\n') line++;
        field += c;
      }
    } else if (c === '"' && field === '') {
      quoted = true;
      wasQuoted = true;
    } else if (c === d.delimiter) push();
    else if (c === '\n' || c === '\r') {
      push();
      rows.push(row);
      row = [];
      if (c === '\r' && text[i + 1] === '\n') i++;
      line++;
    } else field += c;
  }
  if (quoted) throw new RemapError(`${name}: a quoted field never ends (line ${line}); close its double quote.`);
  if (field !== '' || row.length > 0) {
    push();
    rows.push(row);
  }
  return formatCSV(rows);
}
