import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import type { FitContext, Progress, TransportMap } from '../engine/map';
import { getMethod, restoreMap, settingSpecs, startFit } from '../engine/methods';
import { normaliseName, type SettingSpec } from '../engine/settings';
import { parseMapJSON } from '../engine/map-json';
import type { Sample } from '../engine/points';
import { gaussianW2Squared } from '../engine/linear/bures';
import { chooseMethod } from '../engine/auto';
import { CellError, type CellIn, type CellOut, type Grid } from './cells';
import { asRows, readNumbers, readSample, readSettings, readText, readValues, writeValues, type ReadSample } from './coerce';
import { reportTable } from './report';
import { currentKeeper, isHandle, makeHandle, PROGRESS_PREFIX, recall, recallOrFit, remember, resolveMap, running } from './store';

/**
 * What each worksheet function does, without Office: read cells through the
 * coercion module, call the engine, shape the result as cells. functions.ts
 * wraps each in error handling and JSDoc for Excel; the spreadsheet engine used
 * by the headless demo calls the same functions.
 */

type MaybePromise<T> = T | Promise<T>;

function then<T, U>(v: MaybePromise<T>, f: (t: T) => U): MaybePromise<U> {
  return v instanceof Promise ? v.then(f) : f(v);
}

/** The data of one fit, read from cells. */
export interface FitInputs {
  readonly method: string;
  readonly reason: string | null;
  readonly source: ReadSample;
  readonly target: ReadSample;
  /** The settings the engine sees (a time budget Remap enforces itself is taken out). */
  readonly settings: Record<string, unknown>;
  readonly handle: string;
  /** Seconds a fit may run before Remap stops it, for methods without their own time_budget setting. */
  readonly budgetSeconds: number;
}

/**
 * The time budget Remap enforces (seconds) for methods that have no
 * time_budget setting of their own: long enough for the largest entropic fit
 * the auto choice sends there (5,000 x 5,000 rows), short enough that a cell
 * never waits for ever. Methods with their own setting (gradient-net) stop
 * training at their budget and return the map with a warning instead.
 */
export const DEFAULT_TIME_BUDGET_SECONDS = 120;

/** The time_budget setting as the pane lists it for methods that lack their own. */
export const ENFORCED_TIME_BUDGET: SettingSpec = Object.freeze({
  name: 'time_budget',
  type: 'number',
  default: DEFAULT_TIME_BUDGET_SECONDS,
  min: 0,
  minExclusive: true,
  max: 86400,
  describe: 'Seconds the fit may run at most; past it the fit stops with an error saying so (checked by Remap for this method).',
});

/** True when the method declares a time_budget setting of its own (it then stops itself and keeps the map). */
export function hasOwnTimeBudget(method: string): boolean {
  return settingSpecs(getMethod(method)).some((s) => s.name === 'time_budget');
}

/**
 * Splits a time_budget out of the raw settings for a method without its own,
 * checking it as a number of seconds; the rest go to the engine unchanged.
 */
function splitBudget(method: string, raw: Record<string, unknown>, fn: string): { settings: Record<string, unknown>; budget: number } {
  if (hasOwnTimeBudget(method)) return { settings: raw, budget: Infinity };
  const settings: Record<string, unknown> = Object.create(null);
  let budget = DEFAULT_TIME_BUDGET_SECONDS;
  for (const [k, v] of Object.entries(raw)) {
    if (normaliseName(k) !== 'time_budget') {
      settings[k] = v;
      continue;
    }
    const b = typeof v === 'number' ? v : typeof v === 'string' && v.trim() !== '' ? Number(v.trim()) : NaN;
    if (!(b > 0 && b <= 86400)) throw new RemapError(`${fn}: the setting time_budget must be a number of seconds greater than 0 and at most 86400, not "${String(v)}".`);
    budget = b;
  }
  return { settings, budget };
}

/** Reads source, target, weights, method and settings, and derives the handle. */
export function readFit(fn: string, source: CellIn, target: CellIn, method: CellIn, settings: CellIn, sourceWeights: CellIn, targetWeights: CellIn): FitInputs {
  const s = readSample(source, { name: 'source', fn, weights: sourceWeights, weightsName: 'source_weights' });
  const t = readSample(target, { name: 'target', fn, weights: targetWeights, weightsName: 'target_weights' });
  if (s.sample.d !== t.sample.d) {
    throw new RemapError(`${fn}: the source has ${s.sample.d} column${s.sample.d === 1 ? '' : 's'} and the target ${t.sample.d}; select the same columns, in the same order, for both.`);
  }
  const raw = readSettings(settings, fn);
  let name = readText(method, 'method', fn, '');
  let reason: string | null = null;
  if (name === '' || name === 'auto') {
    const choice = chooseMethod(s.sample, t.sample, raw, name === 'auto');
    name = choice.method;
    reason = choice.reason;
  }
  getMethod(name); // an unknown method fails here, listing the known ones
  // A budget Remap enforces never changes a finished map, so it stays out of the handle.
  const { settings: engineSettings, budget } = splitBudget(name, raw, fn);
  const handle = makeHandle(name, s.sample.n, s.sample.d, fingerprintFit(name, s.sample, t.sample, engineSettings));
  return { method: name, reason, source: s, target: t, settings: engineSettings, handle, budgetSeconds: budget };
}

function fingerprintFit(method: string, s: Sample, t: Sample, raw: Record<string, unknown>): string {
  const f = new Fingerprint().text(method).word(s.d);
  f.numbers(s.data).numbers(s.weights).numbers(t.data).numbers(t.weights);
  for (const k of Object.keys(raw).sort()) f.text(k.toLowerCase()).text(String(raw[k]));
  return f.hex();
}

/** What a caller may hand a fit: progress, cancellation, and the FIT cell's address (kept beside the map). */
export interface FitRun extends Omit<FitContext, 'dropped' | 'columns'> {
  readonly cell?: string;
}

/** Everyone watching fits in this session (the pane), told of every progress report with the fit's handle. */
const watchers = new Set<(handle: string, p: Progress) => void>();

/**
 * Calls `listener` with every progress report of every fit in this session
 * (cells and pane alike). Returns a function that stops it.
 */
export function watchFits(listener: (handle: string, p: Progress) => void): () => void {
  watchers.add(listener);
  return () => watchers.delete(listener);
}

/**
 * Fits (or finds) the map the inputs describe. The fit is stopped through its
 * signal when the caller's signal aborts or, for methods without their own
 * time_budget, when the budget runs out; that case throws a RemapError saying
 * what to do.
 */
export function fitFromInputs(inputs: FitInputs, ctx: FitRun = {}): MaybePromise<TransportMap> {
  const outer = ctx.signal;
  const deadline = Number.isFinite(inputs.budgetSeconds) ? Date.now() + inputs.budgetSeconds * 1000 : Infinity;
  let overBudget = false;
  // A getter: the engine reads `aborted` as it iterates, so a synchronous fit is stopped too.
  const signal = {
    get aborted(): boolean {
      if (outer?.aborted) return true;
      if (!overBudget && Date.now() > deadline) overBudget = true;
      return overBudget;
    },
  };
  const onProgress = (p: Progress): void => {
    ctx.onProgress?.(p);
    for (const w of watchers) w(inputs.handle, p);
  };
  const overrun = (e: unknown): never => {
    if (overBudget && !outer?.aborted && e instanceof RemapError && e.kind === 'cancelled') throw budgetError(inputs);
    throw e;
  };
  let r: MaybePromise<TransportMap>;
  try {
    r = recallOrFit(
      inputs.handle,
      () =>
        startFit(inputs.method, inputs.source.sample, inputs.target.sample, inputs.settings, {
          onProgress,
          signal,
          dropped: { source: inputs.source.dropped, target: inputs.target.dropped },
          columns: inputs.source.columns ?? inputs.target.columns,
        }),
      ctx.cell ? { cell: ctx.cell } : undefined,
    );
  } catch (e) {
    return overrun(e);
  }
  return r instanceof Promise ? r.catch(overrun) : r;
}

function budgetError(inputs: FitInputs): RemapError {
  const b = inputs.budgetSeconds;
  return new RemapError(
    `REMAP.FIT: the ${inputs.method} fit of ${inputs.source.sample.n} x ${inputs.target.sample.n} rows was stopped when its time budget of ${b} s ran out. ` +
      `Give it more time with the setting time_budget (e.g. "time_budget=${Math.min(86400, Math.max(2 * b, 300))}"), fit on fewer rows, or choose a faster method such as linear.`,
    'na',
  );
}

/** REMAP.VALUES: values mapped from the source's distribution onto the target's. */
export function values(vals: CellIn, source: CellIn, target: CellIn, method?: CellIn, sourceWeights?: CellIn, targetWeights?: CellIn, settings?: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.VALUES';
  const inputs = readFit(fn, source, target, method, settings, sourceWeights, targetWeights);
  const { points, layout } = readValues(vals, inputs.source.sample.d, fn);
  return then(fitFromInputs(inputs), (map) => checkPayload(writeValues(map.apply(points), layout), fn));
}

/** REMAP.COST: the squared 2-Wasserstein estimate between source and target by the chosen method. */
export function cost(source: CellIn, target: CellIn, method?: CellIn, sourceWeights?: CellIn, targetWeights?: CellIn, settings?: CellIn): MaybePromise<number> {
  const inputs = readFit('REMAP.COST', source, target, method, settings, sourceWeights, targetWeights);
  return then(fitFromInputs(inputs), (map) => map.cost().w2Squared);
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
export function fit(source: CellIn, target: CellIn, method?: CellIn, settings?: CellIn, sourceWeights?: CellIn, targetWeights?: CellIn, ctx: FitRun = {}): MaybePromise<string> {
  const inputs = readFit('REMAP.FIT', source, target, method, settings, sourceWeights, targetWeights);
  return then(fitFromInputs(inputs, ctx), () => inputs.handle);
}

/**
 * What a streaming cell offers (Excel's CustomFunctions.StreamingInvocation):
 * a result setter, a cancel hook Excel calls when the inputs change or the cell
 * is cleared, and the cell's address when the function asks for it.
 */
export interface StreamSink {
  setResult(value: unknown): void;
  onCanceled?: () => void;
  readonly address?: string;
}

/** Fewest milliseconds between two progress texts in a cell (each one recalculates the cells that depend on it). */
export const STREAM_EVERY_MS = 1000;

/**
 * REMAP.FIT as a streaming cell: shows "fitting <method>: step s/n" while a
 * background fit trains, then the handle; a synchronous fit (or a map already
 * fitted) gives the handle at once. Excel's cancel (inputs changed, cell
 * cleared) aborts the fit through its signal. Errors go to the cell through
 * `toError` (the worksheet layer's error maker). A fit shared with another cell
 * that was cancelled there is started again here, once.
 * Cost: that of the fit, plus O(1) per progress report.
 */
export function streamFit(args: readonly CellIn[], sink: StreamSink, toError: (e: unknown) => unknown): void {
  const abort = { aborted: false };
  sink.onCanceled = () => {
    abort.aborted = true;
  };
  let inputs: FitInputs;
  try {
    inputs = readFit('REMAP.FIT', args[0], args[1], args[2], args[3], args[4], args[5]);
  } catch (e) {
    sink.setResult(toError(e));
    return;
  }
  let last = -Infinity;
  const show = (p: Progress): void => {
    const now = Date.now();
    if (abort.aborted || now - last < STREAM_EVERY_MS) return;
    last = now;
    sink.setResult(progressText(inputs.method, p));
  };
  const attempt = (tries: number): void => {
    const joined = recall(inputs.handle) === undefined && running(inputs.handle) !== undefined;
    let stop: (() => void) | null = null;
    if (joined) stop = watchFits((h, p) => (h === inputs.handle ? show(p) : undefined));
    let r: MaybePromise<TransportMap>;
    try {
      r = fitFromInputs(inputs, { signal: abort, onProgress: show, cell: sink.address });
    } catch (e) {
      stop?.();
      if (!abort.aborted) sink.setResult(toError(e));
      return;
    }
    if (!(r instanceof Promise)) {
      sink.setResult(inputs.handle);
      return;
    }
    sink.setResult(`${PROGRESS_PREFIX}${inputs.method}: starting`);
    r.then(
      () => {
        stop?.();
        if (!abort.aborted) sink.setResult(inputs.handle);
      },
      (e) => {
        stop?.();
        if (abort.aborted) return;
        // Another cell's fit of the same handle was cancelled there: fit here instead.
        if (joined && tries > 0 && e instanceof RemapError && e.kind === 'cancelled') attempt(tries - 1);
        else sink.setResult(toError(e));
      },
    );
  };
  attempt(1);
}

/**
 * A progress report in a few words, as a streaming cell shows it.
 * O(1).
 * @example progressText('gradient-net', { step: 120, of: 1500, loss: 0.01, elapsedMs: 9000 }) // 'fitting gradient-net: step 120/1500 (9 s)'
 */
export function progressText(method: string, p: Progress): string {
  const secs = Math.round(p.elapsedMs / 1000);
  return `${PROGRESS_PREFIX}${method}: step ${p.step}/${p.of} (${secs} s)`;
}

/** REMAP.APPLY: a fitted map applied to values. */
export function apply(model: CellIn, vals: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.APPLY';
  return then(resolveMap(modelText(model, fn), fn), (map) => {
    const { points, layout } = readValues(vals, map.d, fn);
    return checkPayload(writeValues(map.apply(points), layout), fn);
  });
}

/** REMAP.INVERT: a fitted map's inverse applied to values. */
export function invert(model: CellIn, vals: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.INVERT';
  return then(resolveMap(modelText(model, fn), fn), (map) => {
    const { points, layout } = readValues(vals, map.d, fn);
    return checkPayload(writeValues(map.invert(points), layout), fn);
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
        ? `It is kept in this workbook under its handle ${text.trim()}, so REMAP.APPLY on the REMAP.FIT cell keeps working after the workbook is closed and reopened.`
        : `It stays available under its handle ${text.trim()} while this session lasts.`
      : '';
    throw new RemapError(
      `${fn}: the map's JSON is ${json.length.toLocaleString('en-US')} characters, more than the ${MAX_CELL_TEXT.toLocaleString('en-US')} an Excel cell can hold. ${where} ` +
        'To export it as a file, use "Export JSON" in the Remap pane\'s list of maps, or fit it with the command line: remap fit --source S.csv --target T.csv --out model.json.',
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
      size += 1 + (typeof v === 'number' ? String(v).length : typeof v === 'string' ? JSON.stringify(v).length : v instanceof CellError ? v.message.length + 40 : 5);
    }
  }
  if (size <= MAX_RESULT_BYTES) return grid;
  const fits = Math.max(1, Math.floor((rows * MAX_RESULT_BYTES) / size / 1000) * 1000 || Math.floor((rows * MAX_RESULT_BYTES) / size));
  throw new RemapError(
    `${fn}: the result would be about ${(size / 1e6).toFixed(1)} MB (${rows.toLocaleString('en-US')} rows), more than the 5 MB Excel accepts from one function. ` +
      `Apply the map to fewer rows at a time: split the range into blocks of at most ${fits.toLocaleString('en-US')} rows, one formula each.`,
  );
}

/**
 * REMAP.PAIRS: for each source row, the target row the exact optimal assignment
 * matches it with (output "values", the default) or that row's position in the
 * target range, counting a header row (output "index", ready for INDEX()).
 * Rows the coercion skipped stay blank; a header row is echoed.
 */
export function pairs(source: CellIn, target: CellIn, output?: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.PAIRS';
  const kind = readText(output, 'output', fn, 'values');
  if (kind !== 'values' && kind !== 'index') throw new RemapError(`${fn}: output must be "values" or "index", not "${kind}".`);
  const inputs = readFit(fn, source, target, 'pairs', undefined, undefined, undefined);
  return then(fitFromInputs(inputs), (map) => {
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
    throw new RemapError(`${fn}: the model must be the cell holding REMAP.FIT's result (or REMAP.SAVE's JSON text); got ${v === null || v === undefined || v === '' ? 'a blank' : String(v)}.`);
  }
  return v;
}
