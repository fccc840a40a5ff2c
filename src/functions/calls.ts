import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { gaussianW2Squared } from '../engine/linear/bures';
import type { Mapped, TransportMap } from '../engine/map';
import { extrapolationWarning } from '../engine/outside';
import { CellError, asRows, readNumbers, readText, readValues, writeValues, type CellIn, type CellOut, type Grid } from '../input';
import {
  currentKeeper,
  fitFromInputs,
  isHandle,
  makeHandle,
  noteCellMap,
  mapPoints,
  readFit,
  remember,
  reportTable,
  resolveMap,
  streamFit,
  then,
  type FitRun,
  type MaybePromise,
  type StreamSink,
} from '../fits';

/**
 * One argument order for every function that fits: (values?, source, target,
 * [method], [settings], [source_weights], [target_weights]).
 *
 * What each worksheet function does, without Office: read cells through the
 * input room, fit or find the map through the fit service, shape the result as
 * cells within Excel's limits. functions.ts wraps each in error handling and
 * JSDoc for Excel; the spreadsheet engine used by the headless demo calls the
 * same functions.
 */

/**
 * Records, for the cell that made this call (when its address is known), the
 * warning about its own values lying outside the fitted range, so the pane's
 * formula list shows it beside that cell. The map itself keeps nothing of the
 * call. Returns `mapped`. O(1).
 */
function noteCall(cell: string | undefined, fn: string, handle: string, map: TransportMap, mapped: Mapped, verb: 'apply' | 'invert'): Mapped {
  if (cell) {
    const w = extrapolationWarning(map, mapped, verb);
    noteCellMap(cell, fn, handle, w ? [w] : []);
  }
  return mapped;
}

/** Where a function that uses another cell's map was called from (Excel's @requiresAddress), when known. */
export interface CallSite {
  readonly cell?: string;
}

/** REMAP.VALUES: values mapped from the source's distribution onto the target's. */
export function values(
  vals: CellIn,
  source: CellIn,
  target: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  ctx: FitRun = {},
): MaybePromise<Grid> {
  const fn = 'REMAP.VALUES';
  const inputs = readFit(fn, { source, target, method, settings, sourceWeights, targetWeights });
  const { points, layout } = readValues(vals, inputs.source.sample.d, fn);
  return then(fitFromInputs(inputs, ctx), (map) =>
    then(mapPoints(map, points, 'apply'), (mapped) => checkPayload(writeValues(noteCall(ctx.cell, fn, inputs.handle, map, mapped, 'apply'), layout), fn)),
  );
}

/**
 * REMAP.COST: the transport cost between source and target by the chosen
 * method. What the number is depends on the method (exact squared W2, a lower
 * bound on it, or an estimate): REMAP.REPORT and the pane give its label.
 */
export function cost(
  source: CellIn,
  target: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  ctx: FitRun = {},
): MaybePromise<number> {
  const inputs = readFit('REMAP.COST', { source, target, method, settings, sourceWeights, targetWeights });
  return then(fitFromInputs(inputs, ctx), (map) => map.cost().w2Squared);
}

/** REMAP.GAUSSCOST: the closed-form squared W2 between two Gaussians given by mean and covariance. */
export function gaussCost(mean1: CellIn, cov1: CellIn, mean2: CellIn, cov2: CellIn): number {
  const fn = 'REMAP.GAUSSCOST';
  const m1 = readNumbers(mean1, 'mean1', fn);
  const c1 = readNumbers(cov1, 'cov1', fn);
  const m2 = readNumbers(mean2, 'mean2', fn);
  const c2 = readNumbers(cov2, 'cov2', fn);
  return gaussianW2Squared(m1.data, c1.data, m2.data, c2.data);
}

/** REMAP.FIT: fits a map and returns its handle. */
export function fit(
  source: CellIn,
  target: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  ctx: FitRun = {},
): MaybePromise<string> {
  const inputs = readFit('REMAP.FIT', { source, target, method, settings, sourceWeights, targetWeights });
  return then(fitFromInputs(inputs, ctx), () => inputs.handle);
}

/**
 * REMAP.FIT as a streaming cell: progress text while a background fit trains,
 * then the handle (see streamFit in the fit service). Errors reach the cell
 * through `toError`, the worksheet layer's error maker.
 */
export function streamFitCell(args: readonly CellIn[], sink: StreamSink, toError: (e: unknown) => unknown): void {
  const [source, target, method, settings, sourceWeights, targetWeights] = args;
  streamFit(() => readFit('REMAP.FIT', { source, target, method, settings, sourceWeights, targetWeights }), sink, toError);
}

/** REMAP.APPLY: a fitted map applied to values; rows outside the fitted range are recorded with the calling cell. */
export function apply(model: CellIn, vals: CellIn, site: CallSite = {}): MaybePromise<Grid> {
  return mapWith('REMAP.APPLY', model, vals, 'apply', site);
}

/** REMAP.INVERT: a fitted map's inverse applied to values; rows outside the fitted target range are recorded with the calling cell. */
export function invert(model: CellIn, vals: CellIn, site: CallSite = {}): MaybePromise<Grid> {
  return mapWith('REMAP.INVERT', model, vals, 'invert', site);
}

function mapWith(fn: string, model: CellIn, vals: CellIn, verb: 'apply' | 'invert', site: CallSite): MaybePromise<Grid> {
  const text = modelText(model, fn);
  return then(resolveMap(text, fn), (map) => {
    const { points, layout } = readValues(vals, map.d, fn);
    return then(mapPoints(map, points, verb), (mapped) =>
      checkPayload(writeValues(noteCall(site.cell, fn, isHandle(text) ? text.trim() : '', map, mapped, verb), layout), fn),
    );
  });
}

/** REMAP.REPORT: a fitted map's diagnostics as a label/value table. */
export function report(model: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.REPORT';
  return then(resolveMap(modelText(model, fn), fn), (map) => reportTable(map.diagnostics()) as CellOut[][]);
}

/** The most characters an Excel cell holds (Excel specifications and limits: 32,767 characters per cell). */
export const MAX_CELL_TEXT = 32767;

/** REMAP.SAVE: a fitted map as JSON text; longer than a cell holds, an error saying where the map is kept and how to export it. */
export function save(model: CellIn): MaybePromise<string> {
  const fn = 'REMAP.SAVE';
  const text = modelText(model, fn);
  return then(resolveMap(text, fn), (map) => {
    const json = JSON.stringify(map.toJSON());
    if (json.length <= MAX_CELL_TEXT) return json;
    const where = isHandle(text)
      ? currentKeeper()
        ? `It is kept in this workbook under its handle ${text.trim()}, so REMAP.APPLY on the REMAP.FIT cell keeps working after the workbook is ` +
          `closed and reopened.`
        : `It stays available under its handle ${text.trim()} while this session lasts.`
      : '';
    throw new RemapError(
      `${fn}: the map's JSON is ${json.length.toLocaleString('en-US')} characters, more than the ${MAX_CELL_TEXT.toLocaleString('en-US')} an ` +
        `Excel cell can hold. ${where} ` +
        'To export it as a file, use "Export JSON" in the Remap pane\'s list of maps, or fit it with the command line: remap fit --source S.csv ' +
        '--target T.csv --out model.json.',
    );
  });
}

/** The most a function result may weigh as JSON: Excel's 5 MB payload limit for custom function results, less a margin. */
export const MAX_RESULT_BYTES = 5_000_000;

/**
 * Returns `grid` when its JSON size fits Excel's payload limit for a function
 * result; otherwise throws a RemapError telling the user to map fewer rows at a
 * time. A cheap upper bound (25 characters per number) settles most grids; only
 * near the limit is the size counted exactly. O(cells).
 * @throws RemapError (#VALUE!) naming the estimated size and a row count that fits.
 */
export function checkPayload(grid: Grid, fn: string): Grid {
  const rows = grid.length;
  let bound = 2;
  for (const row of grid) {
    bound += 3;
    for (const v of row) bound += typeof v === 'string' ? 2 * v.length + 3 : v instanceof CellError ? v.message.length + 40 : 25;
  }
  if (bound <= MAX_RESULT_BYTES) return grid;
  let size = 2;
  for (const row of grid) {
    size += 3;
    for (const v of row) {
      size +=
        1 + (typeof v === 'number' ? String(v).length : typeof v === 'string' ? JSON.stringify(v).length : v instanceof CellError ? v.message.length + 40 : 5);
    }
  }
  if (size <= MAX_RESULT_BYTES) return grid;
  const fits = Math.max(1, Math.floor((rows * MAX_RESULT_BYTES) / size / 1000) * 1000 || Math.floor((rows * MAX_RESULT_BYTES) / size));
  throw new RemapError(
    `${fn}: the result would be about ${(size / 1e6).toFixed(1)} MB (${rows.toLocaleString('en-US')} rows), more than the 5 MB Excel accepts from ` +
      `one function. ` +
      `Apply the map to fewer rows at a time: split the range into blocks of at most ${fits.toLocaleString('en-US')} rows, one formula each.`,
  );
}

/**
 * REMAP.PAIRS: for each source row, the target row the exact optimal assignment
 * matches it with (output "values", the default) or that row's position in the
 * target range, counting a header row (output "index", ready for INDEX()).
 * Rows the coercion skipped stay blank; a header row is echoed.
 */
export function pairs(source: CellIn, target: CellIn, output?: CellIn, ctx: FitRun = {}): MaybePromise<Grid> {
  const fn = 'REMAP.PAIRS';
  const kind = readText(output, 'output', fn, 'values');
  if (kind !== 'values' && kind !== 'index') throw new RemapError(`${fn}: output must be "values" or "index", not "${kind}".`);
  const inputs = readFit(fn, { source, target, method: 'pairs' });
  return then(fitFromInputs(inputs, ctx), (map) => {
    const match = (map as unknown as { pairs(): Int32Array }).pairs();
    const s = inputs.source;
    const t = inputs.target;
    const d = s.sample.d;
    const sourceRows = asRows(source).length === 1 && d === 1 ? asRows(source)[0].length : asRows(source).length;
    const out: Grid = [];
    for (let r = 0; r < sourceRows; r++) out.push(new Array(kind === 'index' ? 1 : d).fill(''));
    if (s.columns) out[0] = kind === 'index' ? ['target row'] : [...(t.columns ?? s.columns)];
    for (let i = 0; i < s.sample.n; i++) {
      const j = match[i];
      out[s.rows[i]] = kind === 'index' ? [t.rows[j] + 1] : Array.from(t.sample.data.subarray(j * d, (j + 1) * d));
    }
    return checkPayload(out, fn);
  });
}

/**
 * REMAP.LOAD: restores a map from REMAP.SAVE's JSON text and returns a handle
 * for it (derived from the text, so the same JSON gives the same handle).
 */
export function load(json: CellIn): string {
  const fn = 'REMAP.LOAD';
  const text = modelText(json, fn);
  if (!text.trim().startsWith('{')) throw new RemapError(`${fn}: give the JSON text REMAP.SAVE wrote (it starts with "{").`);
  const map = restoreMap(parseMapJSON(text));
  const diag = map.diagnostics();
  const handle = makeHandle(map.method, diag.n.source, map.d, new Fingerprint().text(text).hex());
  remember(handle, map);
  return handle;
}

function modelText(model: CellIn, fn: string): string {
  const v = Array.isArray(model) ? (Array.isArray(model[0]) ? model[0][0] : model[0]) : model;
  if (typeof v !== 'string' || v.trim() === '') {
    throw new RemapError(
      `${fn}: the model must be the cell holding REMAP.FIT's result (or REMAP.SAVE's JSON text); got ` +
        `${v === null || v === undefined || v === '' ? 'a blank' : String(v)}.`,
    );
  }
  return v;
}
