import { CellError as HfCellError, EmptyValue, ErrorType, SimpleRangeValue } from 'hyperformula';
import { CellError, type CellIn, type CellOut } from '../input/cells';
import type { ErrorFactory } from '../functions/excel-errors';

/**
 * Translation between HyperFormula's values and the cells the worksheet
 * functions (src/functions/calls.ts) read and write. Used only by the headless
 * spreadsheet run; the add-in never loads HyperFormula.
 */

/** Our error kinds as HyperFormula error types. */
const KIND_TO_TYPE: Record<'value' | 'num' | 'na', ErrorType> = {
  value: ErrorType.VALUE,
  num: ErrorType.NUM,
  na: ErrorType.NA,
};

/**
 * The error factory the headless run installs (setErrorFactory): our errors
 * become HyperFormula CellErrors of the matching type, keeping the message.
 * @example hfErrorFactory('num', 'too few rows') // CellError { type: '#NUM!', message: 'too few rows' }
 */
export const hfErrorFactory: ErrorFactory = (kind, message) => new HfCellError(KIND_TO_TYPE[kind] ?? ErrorType.VALUE, message);

/**
 * One HyperFormula scalar as a cell our coercion module reads: EmptyValue is
 * null (blank), a HyperFormula error is our CellError (skipped like any error
 * cell), numbers carrying a format (dates, percentages) are their number.
 * O(1).
 * @example cellFromHf(EmptyValue) // null
 */
export function cellFromHf(v: unknown): CellIn {
  if (v === EmptyValue || v === undefined || v === null) return null;
  if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  if (v instanceof HfCellError) return new CellError(v.type === ErrorType.NUM ? 'num' : v.type === ErrorType.NA ? 'na' : 'value', v.message ?? String(v.type));
  if (typeof v === 'object' && v !== null && typeof (v as { val?: unknown }).val === 'number') return (v as { val: number }).val;
  return new CellError('value', `Unreadable cell value (${String(v)}).`);
}

/**
 * A function argument as our functions take it: a range becomes a list of rows
 * (copied, one pass over its cells), a scalar stays a scalar, a missing
 * argument is undefined. O(cells).
 */
export function argFromHf(v: unknown): CellIn {
  if (v === undefined) return undefined;
  if (v instanceof SimpleRangeValue) return v.data.map((row) => row.map(cellFromHf));
  return cellFromHf(v);
}

/**
 * One result cell as a HyperFormula value: "" (blank) becomes EmptyValue,
 * errors made by hfErrorFactory pass through, a stray CellError is converted.
 * O(1).
 */
export function cellToHf(v: unknown): unknown {
  if (v === '' || v === null || v === undefined) return EmptyValue;
  if (typeof v === 'number') return Number.isFinite(v) ? v : new HfCellError(ErrorType.NUM, `Not a finite number: ${v}.`);
  if (typeof v === 'string' || typeof v === 'boolean' || v instanceof HfCellError) return v;
  if (v instanceof CellError) return hfErrorFactory(v.kind, v.message);
  return new HfCellError(ErrorType.VALUE, `Unexpected result (${String(v)}).`);
}

/**
 * A result grid fitted into exactly `rows` x `cols` cells (the size announced
 * to HyperFormula before evaluation): padded with blanks, and, when longer,
 * cut with a last row saying how many rows were left out (so a REPORT table
 * never overflows its reserved block). O(rows x cols).
 * @example gridToHf([[1], [2]], 3, 1).data // [[1], [2], [EmptyValue]]
 */
export function gridToHf(grid: readonly (readonly unknown[])[], rows: number, cols: number): SimpleRangeValue {
  const out: unknown[][] = [];
  const overflow = grid.length > rows;
  const keep = overflow ? rows - 1 : grid.length;
  for (let i = 0; i < rows; i++) {
    const row: unknown[] = new Array(cols).fill(EmptyValue);
    if (i < keep) for (let j = 0; j < cols && j < grid[i].length; j++) row[j] = cellToHf(grid[i][j]);
    out.push(row);
  }
  if (overflow) {
    out[rows - 1][0] = `(${grid.length - keep} more rows not shown)`;
  }
  return SimpleRangeValue.onlyValues(out as never);
}

/** Plain cells (CellOut) for a result that is a scalar or a grid. */
export type Result = CellOut | CellOut[][];
