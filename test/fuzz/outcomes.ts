/* How the fuzz properties judge what a worksheet function did: a spreadsheet error
 * (the stub's) with a message that says what to do, or a result whose cells are
 * finite numbers, blanks or per-cell errors. Anything else (a raw exception, the
 * guard's "unexpected problem" text, NaN or Infinity in a result) fails. */
import { StubSheetError } from '../helpers/custom-functions-stub';
import { saysWhatToDo, shape } from './arbitraries';

export type Outcome = { readonly kind: 'error'; readonly code: string; readonly message: string } | { readonly kind: 'value'; readonly value: unknown };

/** Messages that only state a requirement (or say nothing to do): kept for the report. */
export const vagueMessages = new Map<string, string>();

/** Runs a worksheet function (awaiting a Promise result). Throws on anything but a sheet error or a result. */
export async function outcome(f: () => unknown): Promise<Outcome> {
  let r: unknown;
  try {
    r = f();
    if (r instanceof Promise) r = await r;
  } catch (e) {
    if (e instanceof StubSheetError) return { kind: 'error', code: e.code, message: e.message };
    throw new Error(`a raw exception escaped the worksheet function: ${(e as Error)?.stack ?? String(e)}`);
  }
  return { kind: 'value', value: r };
}

/** A sheet error or a per-cell error: known code, non-empty message that says what to do, no internal failure. */
export function checkSheetError(code: string, message: string, where: string): void {
  if (!['#VALUE!', '#NUM!', '#N/A'].includes(code)) throw new Error(`${where}: unexpected error code ${code} (${message})`);
  if (typeof message !== 'string' || message.trim() === '') throw new Error(`${where}: a ${code} with an empty message`);
  if (/unexpected problem/i.test(message)) throw new Error(`${where}: a raw exception reached the guard: ${message}`);
  if (/\bat \S+ \(|\n\s+at /.test(message)) throw new Error(`${where}: a stack trace in the message: ${message}`);
  const says = saysWhatToDo(message);
  if (says !== 'verb') vagueMessages.set(shape(message), message);
  if (says === false) throw new Error(`${where}: the message does not say what to do: ${message}`);
}

/** Every cell of a grid result: a finite number, a blank, text where allowed, or a per-cell error. */
export function checkGrid(value: unknown, where: string, allowText = false): void {
  if (!Array.isArray(value)) throw new Error(`${where}: result is not a grid: ${String(value)}`);
  for (const row of value) {
    if (!Array.isArray(row)) throw new Error(`${where}: a result row is not a list`);
    for (const c of row) checkCell(c, where, allowText);
  }
}

export function checkCell(c: unknown, where: string, allowText: boolean): void {
  if (typeof c === 'number') {
    if (!Number.isFinite(c)) throw new Error(`${where}: a result cell is ${c}`);
    return;
  }
  if (c === '') return;
  if (c instanceof StubSheetError) return checkSheetError(c.code, c.message, `${where} (cell)`);
  if (allowText && (typeof c === 'string' || typeof c === 'boolean')) return;
  throw new Error(`${where}: a result cell is ${JSON.stringify(c)}`);
}

/** A finite number result (costs). */
export function checkNumber(v: unknown, where: string): void {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new Error(`${where}: result ${String(v)} is not a finite number`);
  if (v < 0) throw new Error(`${where}: a squared cost is negative (${v})`);
}
