/* Worksheet functions of the REMAP namespace. Each is JSDoc for Excel's formula
 * tooltips (functions.json is generated from it) and one guarded call into
 * calls.ts; no numeric logic lives here. */
import * as calls from './calls';
import { guard, toSheetError } from './excel-errors';
import { fitInThisThread, setFitter, setKeeper, type Fitter } from '../fits';
import { workerFitter } from '../fits/worker/worker-fitter';
import { workbookKeeper } from '../workbook/keeper';

/**
 * Maps values from the source's distribution onto the target's (monotone transport map), spilled in the shape of values. The map is an estimate: the
 * Remap pane lists this formula with its map's warnings.
 * @customfunction VALUES
 * @cancelable
 * @requiresAddress
 * @param values Cells to map: any shape for one column; one row per point for several columns.
 * @param source The source sample: one column, or several columns with one row per observation.
 * @param target The target sample, with the same columns as the source.
 * @param [method] "quantile" (default for one column), "step", "ordinal", "linear" (default for several columns), "entropic", "gradient-net" or "auto".
 * @param [settings] Settings as text, e.g. "tails=linear; seed=7", or a two-column range of names and values.
 * @param [source_weights] One non-negative weight per source row (e.g. survey weights).
 * @param [target_weights] One non-negative weight per target row.
 * @param invocation Excel's cancel hook: a long fit stops when the inputs change or the cell is cleared.
 * @returns The mapped values.
 */
export function values(
  values: any[][],
  source: any[][],
  target: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  invocation?: CustomFunctions.CancelableInvocation,
): any[][] {
  return guard(() => calls.values(values, source, target, method, settings, source_weights, target_weights, cancelledBy(invocation))) as unknown as any[][];
}

/**
 * Squared 2-Wasserstein cost of moving the source distribution onto the target (exact for one column). The Remap pane lists this formula with its
 * map's warnings.
 * @customfunction COST
 * @cancelable
 * @requiresAddress
 * @param source The source sample.
 * @param target The target sample, with the same columns.
 * @param [method] How to estimate it: "quantile" (exact, one column), "linear" (Gaussian closed form), "pairs", "entropic", "gradient-net".
 * @param [settings] Settings as text or a two-column range.
 * @param [source_weights] One non-negative weight per source row.
 * @param [target_weights] One non-negative weight per target row.
 * @param invocation Excel's cancel hook: a long fit stops when the inputs change or the cell is cleared.
 * @returns The squared W2 estimate.
 */
export function cost(
  source: any[][],
  target: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  invocation?: CustomFunctions.CancelableInvocation,
): number {
  return guard(() => calls.cost(source, target, method, settings, source_weights, target_weights, cancelledBy(invocation))) as unknown as number;
}

/**
 * Squared 2-Wasserstein distance between two Gaussians, in closed form (Bures).
 * @customfunction GAUSSCOST
 * @param mean1 Mean vector of the first Gaussian (a row or a column).
 * @param cov1 Covariance matrix of the first Gaussian (square, symmetric).
 * @param mean2 Mean vector of the second Gaussian.
 * @param cov2 Covariance matrix of the second Gaussian.
 * @returns The squared W2 distance.
 */
export function gausscost(mean1: any[][], cov1: any[][], mean2: any[][], cov2: any[][]): number {
  return guard(() => calls.gaussCost(mean1, cov1, mean2, cov2)) as unknown as number;
}

/**
 * Fits a monotone transport map from source to target and returns its handle, for REMAP.APPLY, REMAP.INVERT and REMAP.REPORT. While a trained method
 * works the cell shows its progress. The Remap pane lists this formula with its map's warnings.
 * @customfunction FIT
 * @streaming
 * @requiresAddress
 * @param source The source sample.
 * @param target The target sample, with the same columns.
 * @param [method] "quantile", "step", "ordinal", "linear", "pairs", "entropic", "gradient-net" or "auto".
 * @param [settings] Settings as text, e.g. "seed=7; time_budget=300", or a two-column range of names and values.
 * @param [source_weights] One non-negative weight per source row.
 * @param [target_weights] One non-negative weight per target row.
 * @param invocation Excel's streaming handle: progress text while fitting, then the handle.
 * @returns A handle naming the fitted map.
 */
export function fit(
  source: any[][],
  target: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  invocation?: CustomFunctions.StreamingInvocation<string>,
): void {
  // Called without Excel's invocation (tests, the headless demo): the handle is returned, or a Promise of it.
  if (!invocation) return guard(() => calls.fit(source, target, method, settings, source_weights, target_weights)) as unknown as void;
  calls.streamFitCell([source, target, method, settings, source_weights, target_weights], invocation, toSheetError);
}

/**
 * Applies a fitted map to values.
 * @customfunction APPLY
 * @param model The cell holding REMAP.FIT's handle, or REMAP.SAVE's JSON text.
 * @param values Cells to map (one row per point for several columns).
 * @returns The mapped values.
 */
export function apply(model: any, values: any[][]): any[][] {
  return guard(() => calls.apply(model, values)) as unknown as any[][];
}

/**
 * Applies the inverse of a fitted map: from the target's distribution back to the source's.
 * @customfunction INVERT
 * @param model The cell holding REMAP.FIT's handle, or REMAP.SAVE's JSON text.
 * @param values Cells to map back.
 * @returns The values mapped back.
 */
export function invert(model: any, values: any[][]): any[][] {
  return guard(() => calls.invert(model, values)) as unknown as any[][];
}

/**
 * A fitted map's diagnostics: cost, fit quality, convergence, settings and warnings, as a two-column table.
 * @customfunction REPORT
 * @param model The cell holding REMAP.FIT's handle, or REMAP.SAVE's JSON text.
 * @returns Labels and values.
 */
export function report(model: any): any[][] {
  return guard(() => calls.report(model)) as unknown as any[][];
}

/**
 * A fitted map as JSON text, to keep in a cell, a file or send to a colleague; REMAP.LOAD restores it. Maps longer than a cell holds (32,767
 * characters) stay in the workbook under their handle.
 * @customfunction SAVE
 * @param model The cell holding REMAP.FIT's handle.
 * @returns The map's JSON text.
 */
export function save(model: any): string {
  return guard(() => calls.save(model)) as unknown as string;
}

/**
 * For each source row, the target row that the exact optimal one-to-one assignment matches it with (equal-size samples).
 * @customfunction PAIRS
 * @cancelable
 * @requiresAddress
 * @param source The source sample: one row per observation.
 * @param target The target sample: the same number of rows and columns.
 * @param [output] "values" (default: the matched target row's values) or "index" (its row number within the target range).
 * @param invocation Excel's cancel hook: a long assignment stops when the inputs change or the cell is cleared.
 * @returns One matched target row (or row number) per source row.
 */
export function pairs(source: any[][], target: any[][], output?: any, invocation?: CustomFunctions.CancelableInvocation): any[][] {
  return guard(() => calls.pairs(source, target, output, cancelledBy(invocation))) as unknown as any[][];
}

/**
 * Restores a map from the JSON text REMAP.SAVE wrote and returns its handle, for REMAP.APPLY and REMAP.REPORT.
 * @customfunction LOAD
 * @param json The map's JSON text.
 * @returns A handle naming the restored map.
 */
export function load(json: any): string {
  return guard(() => calls.load(json)) as unknown as string;
}

/**
 * A fit's cancellation from Excel's invocation: when Excel cancels the call
 * (inputs changed, cell cleared, workbook closing) the signal aborts and the
 * fit stops. Without an invocation (tests, the headless demo) nothing cancels.
 */
function cancelledBy(invocation?: CustomFunctions.CancelableInvocation): { signal: { aborted: boolean }; cell?: string } {
  const signal = { aborted: false };
  if (!invocation) return { signal };
  invocation.onCanceled = () => {
    signal.aborted = true;
  };
  // The cell's address (with @requiresAddress) lets the pane list this formula with its map's warnings.
  return invocation.address ? { signal, cell: invocation.address } : { signal };
}

let wasmPathSet: Promise<void> | null = null;

/**
 * Fits on the page (closed-form methods, or every method where workers fail):
 * a trained fit first tells the wasm tensor backend where its binaries are
 * served (wasm/, next to the page), as the fit worker does, so it does not fall
 * back to the slower cpu backend.
 */
const onPage: Fitter = (method, source, target, settings, ctx) => {
  if (method !== 'gradient-net' || typeof document === 'undefined') return fitInThisThread(method, source, target, settings, ctx);
  wasmPathSet ??= import('../engine/gradient-net/backend').then(
    (b) => b.configureBackend({ wasmPath: new URL('wasm/', document.baseURI).href }),
    () => undefined,
  );
  return wasmPathSet.then(() => fitInThisThread(method, source, target, settings, ctx));
};

// In Excel, fitted maps are also kept in the workbook (src/workbook), so they outlive the session,
// and fits of the slow methods run in a Web Worker, so the page (and the pane on it) never blocks.
if (typeof Excel !== 'undefined') {
  setKeeper(workbookKeeper());
  setFitter(typeof Worker !== 'undefined' ? workerFitter({ fallback: onPage }) : onPage);
}
