import { isRemapError } from '../engine/errors';
import { CellError, type Grid } from '../input';

/**
 * Turns engine errors and per-cell errors into spreadsheet errors, keeping the
 * message. In Excel that is CustomFunctions.Error; elsewhere (tests, the
 * headless demo) a host may install its own factory.
 */
export type ErrorFactory = (kind: 'value' | 'num' | 'na', message: string) => unknown;

let factory: ErrorFactory = (kind, message) => {
  const cf = (globalThis as { CustomFunctions?: typeof CustomFunctions }).CustomFunctions;
  if (cf && cf.Error) {
    const code = kind === 'num' ? cf.ErrorCode.invalidNumber : kind === 'na' ? cf.ErrorCode.notAvailable : cf.ErrorCode.invalidValue;
    return new cf.Error(code, message);
  }
  return new CellError(kind, message);
};

/** Replaces how spreadsheet errors are made (the headless demo's engine has its own). */
export function setErrorFactory(f: ErrorFactory): void {
  factory = f;
}

/** The spreadsheet error for anything thrown while computing a cell. */
export function toSheetError(e: unknown): unknown {
  if (isRemapError(e)) return factory(e.kind === 'num' ? 'num' : e.kind === 'value' ? 'value' : 'na', e.message);
  if (e instanceof CellError) return factory(e.kind, e.message);
  const msg = e instanceof Error ? e.message : String(e);
  return factory('value', `Remap met an unexpected problem (${msg}). Check the inputs; if they look right, please report this.`);
}

/** Converts CellError cells in a result grid to spreadsheet errors. */
export function toSheetGrid(grid: Grid): unknown[][] {
  return grid.map((row) => row.map((v) => (v instanceof CellError ? factory(v.kind, v.message) : v)));
}

/**
 * Runs a worksheet function body: results pass through (grids converted), and
 * anything thrown, now or later, becomes a spreadsheet error that is thrown
 * back to the host with its message. Never lets a raw exception reach Excel.
 */
export function guard<T>(body: () => T | Promise<T>): T | Promise<T> {
  let r: T | Promise<T>;
  try {
    r = body();
  } catch (e) {
    throw toSheetError(e);
  }
  if (r instanceof Promise) {
    return r.then(
      (v) => convert(v),
      (e) => {
        throw toSheetError(e);
      },
    );
  }
  return convert(r);
}

function convert<T>(v: T): T {
  if (Array.isArray(v) && v.every((row) => Array.isArray(row))) return toSheetGrid(v as unknown as Grid) as unknown as T;
  return v;
}
