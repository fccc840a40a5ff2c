/**
 * The vocabulary shared by the coercion module, the worksheet functions and the
 * command line: what a cell may hold on the way in and on the way out.
 */

/** A cell's content as Excel, HyperFormula or a CSV reader hands it over. */
export type CellIn = unknown;

/** A per-cell error on the way out (a spreadsheet error value with a message). */
export class CellError {
  readonly kind: 'value' | 'num' | 'na';
  readonly message: string;
  constructor(kind: 'value' | 'num' | 'na', message: string) {
    this.kind = kind;
    this.message = message;
  }
}

/** What a worksheet function returns in each cell: a number, text, blank ("") or an error. */
export type CellOut = number | string | boolean | CellError;
export type Grid = CellOut[][];

/** How one input cell is read. */
export type CellKind = 'number' | 'blank' | 'text' | 'logical' | 'error' | 'non-finite';

/**
 * Classifies one cell. Blank means null, undefined or empty text (Excel on the
 * web hands blanks over as null, Excel desktop as "" for untyped ranges). Error
 * values arrive as objects with a `code` (CustomFunctions.Error) or as CellError.
 * Numbers that are NaN or infinite are 'non-finite' (they never come from Excel,
 * but do from CSV files and scripts).
 */
export function cellKind(v: CellIn): CellKind {
  if (v === null || v === undefined) return 'blank';
  if (typeof v === 'number') return Number.isFinite(v) ? 'number' : 'non-finite';
  if (typeof v === 'string') return v.trim() === '' ? 'blank' : 'text';
  if (typeof v === 'boolean') return 'logical';
  if (v instanceof CellError) return 'error';
  if (typeof v === 'object' && v !== null && 'code' in (v as Record<string, unknown>)) return 'error';
  if (typeof v === 'bigint') return 'text';
  return 'error';
}
