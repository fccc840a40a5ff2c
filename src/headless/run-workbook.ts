import { Workbook } from 'exceljs';
import { DetailedCellError, HyperFormula } from 'hyperformula';
import { SerialQueue } from '../common/serial-queue';
import { registerRemapPlugin } from './remap-plugin';
import { cellKey, newRunContext, setCurrentRun, type RunContext } from './run-context';
import { readSheets, writeResults, type CellResult, type FormulaCell } from './workbook-io';

/**
 * Calculates a workbook without Excel: its sheets are loaded into
 * HyperFormula (GPL-3.0, used only here and in the demo and tests, never in the
 * add-in), the REMAP functions run through the same code the add-in runs, and
 * the results are written back into the workbook with the formulas kept.
 *
 * HyperFormula evaluates synchronously, and trained fits (gradient-net) are
 * asynchronous. So the run evaluates, awaits every fit that was started in the
 * background, and evaluates again; by then those maps are in the store under
 * the handles their formulas derive, and the synchronous evaluation of a fresh
 * engine built from the same sheets finds them.
 * A formula's fit that failed gives its error on later passes without fitting
 * again. At most MAX_PASSES evaluations.
 */

/** Evaluations per run at most (each awaits the fits the previous one started). */
export const MAX_PASSES = 4;

/** One formula cell and what it computed (a block of cells when it spilled). */
export interface ComputedFormula {
  readonly cell: FormulaCell;
  readonly block: CellResult[][];
}

export interface RunResult {
  /** The workbook with results written in (formulas kept). */
  readonly workbook: Workbook;
  /** Every formula cell and its result. */
  readonly formulas: readonly ComputedFormula[];
  /** Every sheet's computed values (rows of cells), by sheet name. */
  readonly values: Readonly<Record<string, CellResult[][]>>;
  /** Evaluations done (1 when no fit ran in the background). */
  readonly passes: number;
  readonly elapsedMs: number;
}

const runs = new SerialQueue();

/**
 * Calculates `workbook` (an exceljs Workbook, or the path of an .xlsx file) and
 * returns the results; runs never overlap (each waits for the previous one).
 * Cost: that of the formulas, plus O(cells) to load and write back.
 * @throws Error when the file cannot be read.
 * @example const r = await runWorkbook('demo-workbooks/what-if.xlsx'); r.formulas[0].block[0][0] // 'remap:quantile:...'
 */
export function runWorkbook(workbook: Workbook | string): Promise<RunResult> {
  return runs.run(() => runNow(workbook));
}

async function runNow(input: Workbook | string): Promise<RunResult> {
  const t0 = Date.now();
  let wb: Workbook;
  if (typeof input === 'string') {
    wb = new Workbook();
    await wb.xlsx.readFile(input);
  } else {
    wb = input;
  }
  registerRemapPlugin();
  const sheetsIn = readSheets(wb);
  const ctx = newRunContext();
  setCurrentRun(ctx);
  let hf: HyperFormula | null = null;
  try {
    const build = () => HyperFormula.buildFromSheets(sheetsIn.sheets, { licenseKey: 'gpl-v3', smartRounding: false });
    hf = build();
    let passes = 1;
    while (ctx.pending.size > 0 && passes < MAX_PASSES) {
      const waiting = [...ctx.pending.values()];
      ctx.pending.clear();
      await Promise.all(waiting);
      // A fresh engine from the original sheets: HyperFormula's own rebuild re-reads
      // spilled values as typed cells, which then block the spill (#SPILL!).
      hf.destroy();
      hf = null;
      ctx.spills.clear();
      hf = build();
      passes++;
    }
    await Promise.all([...ctx.pending.values()]); // never leave a fit running unobserved
    const formulas = sheetsIn.formulas.map((cell) => ({ cell, block: blockOf(hf as HyperFormula, ctx, cell) }));
    const values: Record<string, CellResult[][]> = {};
    for (const name of sheetsIn.names) {
      const id = hf.getSheetId(name) as number;
      values[name] = hf.getSheetValues(id).map((row) => row.map(resultOf));
    }
    writeResults(wb, formulas);
    return { workbook: wb, formulas, values, passes, elapsedMs: Date.now() - t0 };
  } finally {
    setCurrentRun(null);
    hf?.destroy();
  }
}

/** The block of results a formula cell produced (1 x 1 unless it spilled). */
function blockOf(hf: HyperFormula, ctx: RunContext, cell: FormulaCell): CellResult[][] {
  const sheet = hf.getSheetId(cell.sheet) as number;
  const spill = ctx.spills.get(cellKey({ sheet, row: cell.row, col: cell.col }));
  const first = hf.getCellValue({ sheet, row: cell.row, col: cell.col });
  // a spill that did not happen (an error in the first cell, or no room) is one cell
  const rows = spill && !(first instanceof DetailedCellError) ? spill.rows : 1;
  const cols = spill && !(first instanceof DetailedCellError) ? spill.cols : 1;
  const out: CellResult[][] = [];
  for (let i = 0; i < rows; i++) {
    const row: CellResult[] = [];
    for (let j = 0; j < cols; j++) row.push(resultOf(i === 0 && j === 0 ? first : hf.getCellValue({ sheet, row: cell.row + i, col: cell.col + j })));
    out.push(row);
  }
  return out;
}

/** A HyperFormula cell value as a plain result. */
function resultOf(v: unknown): CellResult {
  if (v === null || v === undefined) return null;
  if (v instanceof DetailedCellError) return { error: v.value, message: v.message ?? '' };
  if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  return String(v);
}
