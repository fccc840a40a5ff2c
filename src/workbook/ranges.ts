import type { ExcelRun } from './excel-run';

/**
 * Reading and writing cells for the pane: the selection's address, a range's
 * values (error cells kept as errors, so the coercion rules skip them exactly
 * as they do for the worksheet functions), formulas, and selecting a cell.
 */

/** Cells per request when reading a large range: well under the 5 MB Office.js response limit. */
export const CELLS_PER_READ = 100_000;

/** An error cell as the pane hands it to the coercion rules (what cellKind() reads as an error). */
export interface ErrorCell {
  readonly code: string;
}

/**
 * Splits "Sheet1!A1:B5" or "'My sheet'!A1" into the sheet name (quotes
 * removed, '' read as ') and the cell reference; no sheet gives null. O(length).
 * @example splitAddress("'Q1 data'!B2:C9") // { sheet: 'Q1 data', cells: 'B2:C9' }
 */
export function splitAddress(address: string): { sheet: string | null; cells: string } {
  const a = address.trim();
  const bang = a.lastIndexOf('!');
  if (bang < 0) return { sheet: null, cells: a };
  let sheet = a.slice(0, bang);
  if (sheet.startsWith("'") && sheet.endsWith("'")) sheet = sheet.slice(1, -1).replace(/''/g, "'");
  return { sheet, cells: a.slice(bang + 1) };
}

function rangeOf(context: Excel.RequestContext, address: string): Excel.Range {
  const { sheet, cells } = splitAddress(address);
  const ws = sheet === null ? context.workbook.worksheets.getActiveWorksheet() : context.workbook.worksheets.getItem(sheet);
  return ws.getRange(cells);
}

/**
 * The address of the current selection, with its sheet ("Sheet1!A1:B20").
 * @example await selectedAddress(run) // 'Sheet1!A1:A200'
 */
export async function selectedAddress(run: ExcelRun): Promise<string> {
  return run(async (context) => {
    const r = context.workbook.getSelectedRange();
    r.load('address');
    await context.sync();
    return r.address;
  });
}

/**
 * A range's values, row by row, as a worksheet function would receive them:
 * numbers, text, logical values, "" for blanks, and `{ code }` objects for
 * error cells. Rows below the sheet's last used row are left out (the coercion
 * rules ignore trailing blank rows anyway), and large ranges are read in blocks
 * of about `cellsPerRead` cells (default CELLS_PER_READ: about 2 MB of values). Cost: O(cells) plus one request per block.
 * @example await readValues(run, 'Sheet1!A1:A3') // [['income'], [1200], [{ code: '#N/A' }]]
 */
export async function readValues(run: ExcelRun, address: string, cellsPerRead = CELLS_PER_READ): Promise<unknown[][]> {
  const shape = await run(async (context) => {
    const r = rangeOf(context, address);
    r.load(['rowIndex', 'columnIndex', 'rowCount', 'columnCount']);
    const used = r.worksheet.getUsedRangeOrNullObject(true);
    used.load(['rowIndex', 'rowCount']);
    r.worksheet.load('name');
    await context.sync();
    const lastUsed = used.isNullObject ? -1 : used.rowIndex + used.rowCount - 1;
    return {
      sheet: r.worksheet.name,
      row: r.rowIndex,
      col: r.columnIndex,
      rows: Math.max(0, Math.min(r.rowCount, lastUsed - r.rowIndex + 1)),
      cols: r.columnCount,
    };
  });
  const out: unknown[][] = [];
  const block = Math.max(1, Math.floor(cellsPerRead / Math.max(1, shape.cols)));
  for (let at = 0; at < shape.rows; at += block) {
    const n = Math.min(block, shape.rows - at);
    const part = await run(async (context) => {
      const r = context.workbook.worksheets.getItem(shape.sheet).getRangeByIndexes(shape.row + at, shape.col, n, shape.cols);
      r.load('values, valueTypes');
      await context.sync();
      const types = r.valueTypes;
      return r.values.map((row, i) => row.map((v, j) => (types[i][j] === 'Error' ? ({ code: String(v) } as ErrorCell) : v)));
    });
    for (const row of part) out.push(row);
  }
  if (out.length === 0 && shape.rows === 0) out.push(new Array(Math.max(1, shape.cols)).fill(''));
  return out;
}

/**
 * Writes a formula into the top-left cell of `address`, and returns that cell's address.
 * @example await writeFormula(run, 'Sheet1!F2', '=REMAP.FIT(A2:A100,B2:B100)') // 'Sheet1!F2'
 */
export async function writeFormula(run: ExcelRun, address: string, formula: string): Promise<string> {
  return run(async (context) => {
    const cell = rangeOf(context, address).getCell(0, 0);
    cell.formulas = [[formula]];
    cell.load('address');
    await context.sync();
    return cell.address;
  });
}

/**
 * The formula in the top-left cell of `address` ("" for none).
 * @example await readFormula(run, 'Sheet1!F2') // '=REMAP.FIT(A2:A100,B2:B100)'
 */
export async function readFormula(run: ExcelRun, address: string): Promise<string> {
  return run(async (context) => {
    const cell = rangeOf(context, address).getCell(0, 0);
    cell.load('formulas');
    await context.sync();
    const f = cell.formulas[0][0];
    return typeof f === 'string' ? f : String(f ?? '');
  });
}

/**
 * Enters a cell's formula again, so Excel calculates it afresh (the pane's "Fit again").
 * @returns the formula, or "" when the cell holds none.
 */
export async function reenterFormula(run: ExcelRun, address: string): Promise<string> {
  const f = await readFormula(run, address);
  if (f.startsWith('=')) await writeFormula(run, address, f);
  return f.startsWith('=') ? f : '';
}

/** Selects a range (so the user sees the cell the pane talks about). */
export async function selectRange(run: ExcelRun, address: string): Promise<void> {
  await run(async (context) => {
    const r = rangeOf(context, address);
    r.worksheet.activate();
    r.select();
    await context.sync();
  });
}
