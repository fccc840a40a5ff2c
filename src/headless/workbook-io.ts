import { ValueType, type Workbook, type Worksheet } from 'exceljs';

/**
 * Between exceljs workbooks and the plain sheets HyperFormula builds from:
 * formulas become "=..." text, cells inside an array formula's block (other
 * than its first cell) are left empty so the result can spill there, and
 * values written back keep each formula in place with its computed result.
 */

/** A cell's content as HyperFormula takes it. */
export type RawCell = number | string | boolean | null;

/** One formula cell found in a workbook. */
export interface FormulaCell {
  readonly sheet: string;
  /** 0-based row and column. */
  readonly row: number;
  readonly col: number;
  /** A1 address, e.g. "F2". */
  readonly address: string;
  /** The formula without the leading "=". */
  readonly formula: string;
}

/** A workbook read for calculation: sheets in order, and every formula cell. */
export interface SheetsIn {
  readonly names: string[];
  readonly sheets: Record<string, RawCell[][]>;
  readonly formulas: FormulaCell[];
}

/** Column letters of a 0-based column index: 0 -> A, 27 -> AB. O(log col). */
export function columnLetters(col: number): string {
  let s = '';
  let n = col + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** A1 address of 0-based row and column. O(1). */
export function a1(row: number, col: number): string {
  return `${columnLetters(col)}${row + 1}`;
}

/**
 * Parses an A1 reference ("B2", "$B$2", "B2:C10") into 0-based corners.
 * @throws Error for text that is not an A1 reference.
 * @example parseA1('B2:C10') // { r0: 1, c0: 1, r1: 9, c1: 2 }
 */
export function parseA1(ref: string): { r0: number; c0: number; r1: number; c1: number } {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+)(?::\$?([A-Za-z]{1,3})\$?(\d+))?$/.exec(ref.trim());
  if (!m) throw new Error(`Not an A1 reference: "${ref}".`);
  const col = (letters: string) =>
    letters
      .toUpperCase()
      .split('')
      .reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
  const r0 = Number(m[2]) - 1;
  const c0 = col(m[1]);
  const r1 = m[4] ? Number(m[4]) - 1 : r0;
  const c1 = m[3] ? col(m[3]) : c0;
  return { r0: Math.min(r0, r1), c0: Math.min(c0, c1), r1: Math.max(r0, r1), c1: Math.max(c0, c1) };
}

/** Excel's serial day number of a date (1900 system). */
function excelSerial(d: Date): number {
  return d.getTime() / 86_400_000 + 25569;
}

/**
 * Reads every worksheet of an exceljs workbook into plain rows for
 * HyperFormula, and lists the formula cells. Text that starts with "=" is
 * kept as text (prefixed with an apostrophe, which HyperFormula strips).
 * Cost: O(cells).
 */
export function readSheets(wb: Workbook): SheetsIn {
  const names: string[] = [];
  const sheets: Record<string, RawCell[][]> = {};
  const formulas: FormulaCell[] = [];
  wb.eachSheet((ws: Worksheet) => {
    names.push(ws.name);
    const rows: RawCell[][] = [];
    const blocked = new Set<string>();
    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      row.eachCell({ includeEmpty: false }, (cell, colNumber) => {
        const r = rowNumber - 1;
        const c = colNumber - 1;
        while (rows.length <= r) rows.push([]);
        const v = cell.value as unknown;
        let raw: RawCell = null;
        if (cell.type === ValueType.Formula) {
          const f = cell.formula;
          if (f) {
            raw = `=${f}`;
            formulas.push({ sheet: ws.name, row: r, col: c, address: a1(r, c), formula: f });
            const fv = v as { shareType?: string; ref?: string };
            if (fv && fv.shareType === 'array' && fv.ref) {
              const b = parseA1(fv.ref);
              for (let i = b.r0; i <= b.r1; i++) for (let j = b.c0; j <= b.c1; j++) if (i !== r || j !== c) blocked.add(`${i}:${j}`);
            }
          }
        } else if (typeof v === 'number' || typeof v === 'boolean') {
          raw = v;
        } else if (typeof v === 'string') {
          raw = v.startsWith('=') ? `'${v}` : v;
        } else if (v instanceof Date) {
          raw = excelSerial(v);
        } else if (v && typeof v === 'object') {
          const o = v as { richText?: { text: string }[]; text?: string; error?: string };
          if (o.richText) raw = o.richText.map((t) => t.text).join('');
          else if (typeof o.text === 'string') raw = o.text;
          else if (typeof o.error === 'string') raw = `=${errorFormula(o.error)}`;
        }
        rows[r][c] = raw;
      });
    });
    for (const key of blocked) {
      const [i, j] = key.split(':').map(Number);
      if (rows[i] && rows[i][j] !== undefined && !String(rows[i][j] ?? '').startsWith('=')) rows[i][j] = null;
    }
    // HyperFormula wants rectangular-ish arrays of rows; holes are blanks
    for (const row of rows) for (let j = 0; j < row.length; j++) if (row[j] === undefined) row[j] = null;
    sheets[ws.name] = rows;
  });
  return { names, sheets, formulas };
}

/** A formula that evaluates to the given spreadsheet error, so an error typed into a cell stays an error. */
function errorFormula(code: string): string {
  switch (code) {
    case '#N/A':
      return 'NA()';
    case '#DIV/0!':
      return '1/0';
    default:
      return 'NA()';
  }
}

/** A value computed for a cell: a number, text, logical, blank, or an error with its message. */
export type CellResult = number | string | boolean | null | { readonly error: string; readonly message: string };

/**
 * Writes computed results into `wb`: each formula cell keeps its formula and
 * gets its result; a spilled result becomes an array formula over its block
 * (the way spreadsheet files store spilled results), with the block's other
 * cells holding their values. Errors are written as error values with their
 * message as a cell note. Cost: O(cells written).
 */
export function writeResults(wb: Workbook, results: readonly { cell: FormulaCell; block: CellResult[][] }[]): void {
  for (const { cell, block } of results) {
    const ws = wb.getWorksheet(cell.sheet);
    if (!ws) continue;
    const rows = block.length;
    const cols = rows > 0 ? block[0].length : 0;
    for (let i = 0; i < rows; i++) {
      for (let j = 0; j < cols; j++) {
        const target = ws.getCell(cell.row + 1 + i, cell.col + 1 + j);
        const v = block[i][j];
        const asValue = v === null ? null : typeof v === 'object' ? { error: v.error as '#N/A' } : v;
        if (i === 0 && j === 0) {
          const value: Record<string, unknown> = { formula: cell.formula };
          if (asValue !== null) value.result = asValue;
          if (rows * cols > 1) {
            value.shareType = 'array';
            value.ref = `${a1(cell.row, cell.col)}:${a1(cell.row + rows - 1, cell.col + cols - 1)}`;
          }
          target.value = value as never;
        } else {
          target.value = asValue as never;
        }
        if (v !== null && typeof v === 'object' && v.message) target.note = `${v.error} ${v.message}`;
      }
    }
  }
}
