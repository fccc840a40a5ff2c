import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import type { FitContext, TransportMap } from '../engine/map';
import { getMethod, restoreMap, startFit } from '../engine/methods';
import { parseMapJSON } from '../engine/map-json';
import type { Sample } from '../engine/points';
import { gaussianW2Squared } from '../engine/linear/bures';
import { chooseMethod } from '../engine/auto';
import { type CellIn, type CellOut, type Grid } from './cells';
import { asRows, readNumbers, readSample, readSettings, readText, readValues, writeValues, type ReadSample } from './coerce';
import { reportTable } from './report';
import { makeHandle, recallOrFit, remember, resolveMap } from './store';

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
interface FitInputs {
  readonly method: string;
  readonly reason: string | null;
  readonly source: ReadSample;
  readonly target: ReadSample;
  readonly settings: Record<string, unknown>;
  readonly handle: string;
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
  const handle = makeHandle(name, s.sample.n, s.sample.d, fingerprintFit(name, s.sample, t.sample, raw));
  return { method: name, reason, source: s, target: t, settings: raw, handle };
}

function fingerprintFit(method: string, s: Sample, t: Sample, raw: Record<string, unknown>): string {
  const f = new Fingerprint().text(method).word(s.d);
  f.numbers(s.data).numbers(s.weights).numbers(t.data).numbers(t.weights);
  for (const k of Object.keys(raw).sort()) f.text(k.toLowerCase()).text(String(raw[k]));
  return f.hex();
}

/** Fits (or finds) the map the inputs describe. */
export function fitFromInputs(inputs: FitInputs, ctx: Omit<FitContext, 'dropped' | 'columns'> = {}): MaybePromise<TransportMap> {
  return recallOrFit(inputs.handle, () =>
    startFit(inputs.method, inputs.source.sample, inputs.target.sample, inputs.settings, {
      ...ctx,
      dropped: { source: inputs.source.dropped, target: inputs.target.dropped },
      columns: inputs.source.columns ?? inputs.target.columns,
    }),
  );
}

/** REMAP.VALUES: values mapped from the source's distribution onto the target's. */
export function values(vals: CellIn, source: CellIn, target: CellIn, method?: CellIn, sourceWeights?: CellIn, targetWeights?: CellIn, settings?: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.VALUES';
  const inputs = readFit(fn, source, target, method, settings, sourceWeights, targetWeights);
  const { points, layout } = readValues(vals, inputs.source.sample.d, fn);
  return then(fitFromInputs(inputs), (map) => writeValues(map.apply(points), layout));
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
export function fit(source: CellIn, target: CellIn, method?: CellIn, settings?: CellIn, sourceWeights?: CellIn, targetWeights?: CellIn, ctx: Omit<FitContext, 'dropped' | 'columns'> = {}): MaybePromise<string> {
  const inputs = readFit('REMAP.FIT', source, target, method, settings, sourceWeights, targetWeights);
  return then(fitFromInputs(inputs, ctx), () => inputs.handle);
}

/** REMAP.APPLY: a fitted map applied to values. */
export function apply(model: CellIn, vals: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.APPLY';
  return then(resolveMap(modelText(model, fn), fn), (map) => {
    const { points, layout } = readValues(vals, map.d, fn);
    return writeValues(map.apply(points), layout);
  });
}

/** REMAP.INVERT: a fitted map's inverse applied to values. */
export function invert(model: CellIn, vals: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.INVERT';
  return then(resolveMap(modelText(model, fn), fn), (map) => {
    const { points, layout } = readValues(vals, map.d, fn);
    return writeValues(map.invert(points), layout);
  });
}

/** REMAP.REPORT: a fitted map's diagnostics as a label/value table. */
export function report(model: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.REPORT';
  return then(resolveMap(modelText(model, fn), fn), (map) => reportTable(map.diagnostics()) as CellOut[][]);
}

/** REMAP.SAVE: a fitted map as JSON text. */
export function save(model: CellIn): MaybePromise<string> {
  const fn = 'REMAP.SAVE';
  return then(resolveMap(modelText(model, fn), fn), (map) => JSON.stringify(map.toJSON()));
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
    return out;
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
