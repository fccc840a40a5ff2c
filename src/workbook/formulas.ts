import type { ExcelRun } from './excel-run';

/** One formula cell that calls a REMAP function: where it is, its formula, and its value (its first value, for a spill). */
export interface FoundFormula {
  readonly address: string;
  readonly formula: string;
  readonly value: unknown;
}

/** What the search found, and what it left out. */
export interface FormulaSearch {
  readonly formulas: FoundFormula[];
  /** Sheets too large to read whole (more cells in use than `maxCellsPerSheet`). */
  readonly skippedSheets: string[];
  /** True when more than `maxFormulas` formulas were found (only the first are listed). */
  readonly truncated: boolean;
}

export interface FormulaSearchOptions {
  /** Cells read per request (default 100,000: well under the 5 MB response limit). */
  readonly cellsPerRead?: number;
  /** Sheets with more cells in use are skipped and named (default 2,000,000). */
  readonly maxCellsPerSheet?: number;
  /** At most this many formulas are returned (default 500). */
  readonly maxFormulas?: number;
}

const REMAP_CALL = /\bREMAP\.[A-Z]+\s*\(/i;

/**
 * Every formula in the workbook's used ranges that calls a REMAP function, sheet
 * by sheet, row by row (ExcelApi 1.1: Worksheet.getUsedRangeOrNullObject 1.4,
 * Range.formulas and values). Large sheets are read in blocks of rows.
 * Cost: O(cells in use), one request per block.
 * @example await findRemapFormulas(run) // { formulas: [{ address: 'Sheet1!F2', formula: '=REMAP.FIT(A2:A9,B2:B9)', value: 'remap:quantile:8x1:...' }], ... }
 */
export async function findRemapFormulas(run: ExcelRun, options: FormulaSearchOptions = {}): Promise<FormulaSearch> {
  const cellsPerRead = options.cellsPerRead ?? 100_000;
  const maxCells = options.maxCellsPerSheet ?? 2_000_000;
  const maxFormulas = options.maxFormulas ?? 500;
  const sheets = await run(async (context) => {
    const all = context.workbook.worksheets;
    all.load('items/name');
    await context.sync();
    const shapes = all.items.map((s) => {
      const used = context.workbook.worksheets.getItem(s.name).getUsedRangeOrNullObject();
      used.load(['rowIndex', 'columnIndex', 'rowCount', 'columnCount']);
      return { name: s.name, used };
    });
    await context.sync();
    return shapes.map(({ name, used }) =>
      used.isNullObject
        ? { name, row: 0, col: 0, rows: 0, cols: 0 }
        : { name, row: used.rowIndex, col: used.columnIndex, rows: used.rowCount, cols: used.columnCount },
    );
  });
  const formulas: FoundFormula[] = [];
  const skippedSheets: string[] = [];
  let truncated = false;
  for (const s of sheets) {
    if (s.rows * s.cols > maxCells) {
      skippedSheets.push(s.name);
      continue;
    }
    const block = Math.max(1, Math.floor(cellsPerRead / Math.max(1, s.cols)));
    for (let at = 0; at < s.rows && !truncated; at += block) {
      const n = Math.min(block, s.rows - at);
      const found = await run(async (context) => {
        const r = context.workbook.worksheets.getItem(s.name).getRangeByIndexes(s.row + at, s.col, n, s.cols);
        r.load('formulas, values');
        await context.sync();
        const out: { r: number; c: number; formula: string; value: unknown }[] = [];
        const values = r.values;
        r.formulas.forEach((row, i) =>
          row.forEach((f, j) => {
            if (typeof f === 'string' && f.startsWith('=') && REMAP_CALL.test(f))
              out.push({ r: s.row + at + i, c: s.col + j, formula: f, value: values[i][j] });
          }),
        );
        return out;
      });
      for (const f of found) {
        if (formulas.length >= maxFormulas) {
          truncated = true;
          break;
        }
        formulas.push({ address: `${sheetRef(s.name)}!${columnLetters(f.c)}${f.r + 1}`, formula: f.formula, value: f.value });
      }
    }
  }
  return { formulas, skippedSheets, truncated };
}

/**
 * A sheet name as a formula writes it: in single quotes (inner quotes doubled) unless it is a plain name. O(length).
 * @example sheetRef('Q1 data') // "'Q1 data'"
 */
export function sheetRef(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}

/**
 * Excel's column letters for a 0-based column index. O(log index).
 * @example columnLetters(27) // 'AB'
 */
export function columnLetters(index: number): string {
  let s = '';
  for (let c = index + 1; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
  return s;
}
