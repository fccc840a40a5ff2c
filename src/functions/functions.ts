/* Worksheet functions of the REMAP namespace. Each is JSDoc for Excel's formula
 * tooltips (functions.json is generated from it) and one guarded call into
 * calls.ts; no numeric logic lives here. */
import * as calls from './calls';
import * as boundsCall from './bounds-call';
import * as groupCalls from './group-calls';
import * as tableCall from './table-call';
import { guard, toSheetError } from './excel-errors';
import { fitInThisThread, setFitter, setKeeper, setMapper, type Fitter } from '../fits';
import { pageWorkers, type WorkerLike } from '../fits/worker/page-workers';
import { workerMapper } from '../fits/worker/worker-mapper';
import { workerFitter } from '../fits/worker/worker-fitter';
import { workbookKeeper } from '../workbook/keeper';

/**
 * Maps values from the source's distribution onto the target's (monotone transport map), spilled in the shape of values. The map is an estimate: the
 * Remap pane lists this formula with its map's warnings and with how many of its values lay outside the fitted range.
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
 * Transport cost of moving the source distribution onto the target. What the number is depends on the method: the exact squared 2-Wasserstein
 * distance (quantile, step or ordinal on one column; pairs), a lower bound on it (linear; quantile on several columns), or an estimate (entropic,
 * gradient-net). REMAP.REPORT and the Remap pane give its label; the pane lists this formula with its map's warnings.
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
 * @returns The cost; its label (exact, lower bound, estimate) is in REMAP.REPORT and the pane.
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
 * Applies a fitted map to values. Values outside the range the map was fitted on are extrapolated: the Remap pane lists this formula with how many
 * of its values were and what the method did with them.
 * @customfunction APPLY
 * @requiresAddress
 * @param model The cell holding REMAP.FIT's handle, or REMAP.SAVE's JSON text.
 * @param values Cells to map (one row per point for several columns).
 * @param invocation Excel's call details: the cell's address, to record this call's warnings for the pane.
 * @returns The mapped values.
 */
export function apply(model: any, values: any[][], invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => calls.apply(model, values, siteOf(invocation))) as unknown as any[][];
}

/**
 * Applies the inverse of a fitted map: from the target's distribution back to the source's. The Remap pane lists this formula with how many of its
 * values lay outside the fitted target range.
 * @customfunction INVERT
 * @requiresAddress
 * @param model The cell holding REMAP.FIT's handle, or REMAP.SAVE's JSON text.
 * @param values Cells to map back.
 * @param invocation Excel's call details: the cell's address, to record this call's warnings for the pane.
 * @returns The values mapped back.
 */
export function invert(model: any, values: any[][], invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => calls.invert(model, values, siteOf(invocation))) as unknown as any[][];
}

/** The calling cell's address (with @requiresAddress), so the pane can show the warnings of this cell's own values. */
function siteOf(invocation?: CustomFunctions.Invocation): calls.CallSite {
  return invocation?.address ? { cell: invocation.address } : {};
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
 * For each value, the mapped value and a lower and upper bound at a level (default 95 %): three columns per value (mapped, lower, upper). A seeded
 * bootstrap resamples both samples (settings seed=..., replicates=..., default 0 and 1000), or the survey's replicate weights are used when given.
 * Methods quantile, step, ordinal and linear.
 * @customfunction BOUNDS
 * @param values One column of values to map (one row per point for several columns).
 * @param source The source sample.
 * @param target The target sample, with the same columns.
 * @param [method] "quantile" (default for one column), "step", "ordinal" or "linear".
 * @param [settings] The method's settings and the bounds' own: seed, replicates, fay (Fay's factor for brr), multiplier (custom), shared=yes.
 * @param [source_weights] One non-negative weight per source row.
 * @param [target_weights] One non-negative weight per target row.
 * @param [level] Nominal coverage between 0 and 1 (default 0.95).
 * @param [replicates_source] The source's replicate weights: one column per replicate, one row per source row.
 * @param [replicates_target] The target's replicate weights, likewise.
 * @param [replicate_kind] "bootstrap" (default), "jackknife", "brr" or "custom": how the replicate weights were made.
 * @returns Mapped value, lower bound and upper bound per value.
 */
export function bounds(
  values: any[][],
  source: any[][],
  target: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  level?: any,
  replicates_source?: any[][],
  replicates_target?: any[][],
  replicate_kind?: any,
): any[][] {
  return guard(() =>
    boundsCall.bounds(values, source, target, method, settings, source_weights, target_weights, level, replicates_source, replicates_target, replicate_kind),
  ) as unknown as any[][];
}

/**
 * Maps values within their groups (region, wave, age band): one map per group, fitted from the source and target rows of that group, and each value
 * mapped by its own group's map. A group lacking rows is an error naming it unless fallback is "pooled".
 * @customfunction BYGROUP
 * @cancelable
 * @requiresAddress
 * @param values One column of values (one row per point for several columns).
 * @param value_groups The group of each value: one cell per row, as tall as values.
 * @param source The source sample.
 * @param source_groups The group of each source row, as tall as source.
 * @param target The target sample, with the same columns.
 * @param target_groups The group of each target row, as tall as target.
 * @param [method] Any method name; "quantile" is the default for one column.
 * @param [settings] Settings as text or a two-column range, the same for every group.
 * @param [source_weights] One non-negative weight per source row.
 * @param [target_weights] One non-negative weight per target row.
 * @param [fallback] "none" (default) or "pooled": the map fitted on all rows stands in for groups lacking rows, with a warning.
 * @param invocation Excel's cancel hook: the fit stops when the inputs change or the cell is cleared.
 * @returns The values mapped within their groups.
 */
export function bygroup(
  values: any[][],
  value_groups: any[][],
  source: any[][],
  source_groups: any[][],
  target: any[][],
  target_groups: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  fallback?: any,
  invocation?: CustomFunctions.CancelableInvocation,
): any[][] {
  return guard(() =>
    groupCalls.byGroup(
      values,
      value_groups,
      source,
      source_groups,
      target,
      target_groups,
      method,
      settings,
      source_weights,
      target_weights,
      fallback,
      cancelledBy(invocation),
    ),
  ) as unknown as any[][];
}

/**
 * Fits one map per group and returns a handle for them all, for REMAP.APPLYGROUPS and REMAP.GROUPREPORT.
 * @customfunction FITGROUPS
 * @cancelable
 * @requiresAddress
 * @param source The source sample.
 * @param source_groups The group of each source row, as tall as source.
 * @param target The target sample, with the same columns.
 * @param target_groups The group of each target row, as tall as target.
 * @param [method] Any method name; "quantile" is the default for one column.
 * @param [settings] Settings as text or a two-column range, the same for every group.
 * @param [source_weights] One non-negative weight per source row.
 * @param [target_weights] One non-negative weight per target row.
 * @param [fallback] "none" (default) or "pooled".
 * @param invocation Excel's cancel hook: the fit stops when the inputs change or the cell is cleared.
 * @returns A handle naming the maps by group; the maps are kept in the workbook, so they outlive the session.
 */
export function fitgroups(
  source: any[][],
  source_groups: any[][],
  target: any[][],
  target_groups: any[][],
  method?: any,
  settings?: any,
  source_weights?: any[][],
  target_weights?: any[][],
  fallback?: any,
  invocation?: CustomFunctions.CancelableInvocation,
): string {
  return guard(() =>
    groupCalls.fitGroups(source, source_groups, target, target_groups, method, settings, source_weights, target_weights, fallback, cancelledBy(invocation)),
  ) as unknown as string;
}

/**
 * Applies maps by group to values, each by its own group's map (or the inverse).
 * @customfunction APPLYGROUPS
 * @param model The cell holding REMAP.FITGROUPS's handle.
 * @param values One column of values (one row per point for several columns).
 * @param groups The group of each value, as tall as values.
 * @param [direction] "apply" (default) or "invert".
 * @returns The mapped values.
 */
export function applygroups(model: any, values: any[][], groups: any[][], direction?: any): any[][] {
  return guard(() => groupCalls.applyGroups(model, values, groups, direction)) as unknown as any[][];
}

/**
 * Every group of a map by group: rows and effective rows per side, cost, whether the pooled map stood in, warnings; then all groups together.
 * @customfunction GROUPREPORT
 * @param model The cell holding REMAP.FITGROUPS's handle.
 * @returns A table with a header row.
 */
export function groupreport(model: any): any[][] {
  return guard(() => groupCalls.groupReport(model)) as unknown as any[][];
}

/**
 * Maps values between a sample and a distribution published as a table: onto the table (table_side "target", default) or from it ("source"). A quantile
 * table (probability 0..1, value) is read as a straight line between its points; beyond its first and last probability its end values hold. A frequency
 * table (value, count or share) is the values written out. The Remap pane lists this formula with the map's warnings (a coarse table, values in the
 * table's tails) and how many of its own values lay outside the fitted range.
 * @customfunction TOTABLE
 * @requiresAddress
 * @param values Cells to map (one column): on the sample's scale, or on the table's with table_side "source".
 * @param sample The sample on the other side: one column (the source by default; the target with table_side "source").
 * @param table Two columns: probability and value (quantiles), or value and count or share (frequencies); a header row is skipped.
 * @param [table_kind] "quantiles" (default) or "frequencies".
 * @param [method] "quantile" (default; the only one for a quantile table), "step" or "ordinal" for a frequency table.
 * @param [settings] Settings as text or a two-column range, e.g. "tails=linear".
 * @param [sample_weights] One non-negative weight per sample row.
 * @param [beyond] "hold" (default: keep the table's end values) or "extend" (continue its end steps, an extrapolation).
 * @param [table_side] "target" (default: the sample is mapped onto the table) or "source" (the table is mapped onto the sample).
 * @param invocation Excel's call details: the cell's address, to record the map's and this call's warnings for the pane.
 * @returns The mapped values, in the shape of values.
 */
export function totable(
  values: any[][],
  sample: any[][],
  table: any[][],
  table_kind?: any,
  method?: any,
  settings?: any,
  sample_weights?: any[][],
  beyond?: any,
  table_side?: any,
  invocation?: CustomFunctions.Invocation,
): any[][] {
  return guard(() =>
    tableCall.toTable(values, sample, table, table_kind, method, settings, sample_weights, beyond, table_side, siteOf(invocation)),
  ) as unknown as any[][];
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
// and fits of the slow methods, and heavy applications of maps, run in Web Workers (two, shared), so the page
// (and the pane on it) never blocks.
if (typeof Excel !== 'undefined') {
  setKeeper(workbookKeeper());
  if (typeof Worker !== 'undefined') {
    const workers = pageWorkers(() => new Worker('fit-worker.js') as unknown as WorkerLike, 2);
    setFitter(workerFitter({ fallback: onPage, workers }));
    setMapper(workerMapper({ workers }));
  } else setFitter(onPage);
}
