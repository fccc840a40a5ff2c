import { RemapError } from './errors';
import type { MapJSON } from './map';
import { listMethods } from './methods';

/** The largest map JSON text we read (characters). Larger text is refused, not parsed. */
export const MAX_MAP_JSON_CHARS = 50_000_000;

const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Reads map JSON text (from REMAP.LOAD, a file or the workbook store) and checks
 * its envelope: size, format tag, version, a known method, the shape fields, the
 * fit record's fields (shown as they are by reports) and that every number in it is finite. The method's own fromJSON then checks its
 * parameters. The text is parsed as data with JSON.parse only, never evaluated;
 * keys that could reach an object's prototype are refused.
 * Cost: O(length of text).
 * @throws RemapError saying what is wrong and that the text should come from REMAP.SAVE or `remap fit`.
 */
export function parseMapJSON(text: string): MapJSON {
  if (typeof text !== 'string') throw new RemapError('Map JSON must be text, as written by REMAP.SAVE or `remap fit --out`.');
  if (text.length > MAX_MAP_JSON_CHARS) {
    throw new RemapError(`Map JSON is ${text.length} characters; the limit is ${MAX_MAP_JSON_CHARS}. Fit the map again on fewer rows.`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text, (key, value) => {
      if (FORBIDDEN_KEYS.has(key)) throw new RemapError(`Map JSON has a forbidden key "${key}"; it was not written by Remap.`);
      return value;
    });
  } catch (e) {
    if (e instanceof RemapError) throw e;
    throw new RemapError(`Map JSON could not be read (${(e as Error).message}); give the exact text REMAP.SAVE or \`remap fit --out\` wrote.`);
  }
  return checkMapJSON(raw);
}

/** Checks an already parsed object as `parseMapJSON` does. */
export function checkMapJSON(raw: unknown): MapJSON {
  const bad = (what: string): never => {
    throw new RemapError(`Map JSON: ${what}; give the exact text REMAP.SAVE or \`remap fit --out\` wrote.`);
  };
  if (!isPlainObject(raw)) bad('the top level is not an object');
  const o = raw as Record<string, unknown>;
  if (o.format !== 'remap.map') bad('the "format" field is not "remap.map"');
  if (o.version !== 1) bad(`version ${String(o.version)} is not one this version of Remap reads (1)`);
  const method = o.method;
  if (typeof method !== 'string' || !listMethods().some((m) => m.name === method)) bad(`unknown method ${JSON.stringify(method)}`);
  if (!isCount(o.d) || (o.d as number) < 1 || (o.d as number) > 10_000) bad('"d" is not a column count');
  if (!isPlainObject(o.settings)) bad('"settings" is not an object');
  for (const v of Object.values(o.settings as object)) {
    if (!['number', 'string', 'boolean'].includes(typeof v)) bad('a setting is not a number, text or logical value');
  }
  if (o.columns !== null && !(Array.isArray(o.columns) && o.columns.length === o.d && o.columns.every((c) => typeof c === 'string'))) {
    bad('"columns" is neither null nor one name per column');
  }
  for (const f of ['n', 'dropped'] as const) {
    const v = o[f] as Record<string, unknown>;
    if (!isPlainObject(v) || !isCount(v.source) || !isCount(v.target)) bad(`"${f}" is not a pair of row counts`);
  }
  if (!isPlainObject(o.fitted)) bad('"fitted" is missing');
  checkFitRecord(o.fitted as Record<string, unknown>, bad);
  checkAllFinite(raw, 0);
  return raw as MapJSON;
}

const COST_KINDS = new Set(['exact-1d', 'per-column-1d', 'bures', 'assignment', 'sinkhorn-divergence', 'mapped']);
const COST_BOUNDS = new Set(['exact', 'lower', 'estimate']);
const OPTIONAL_FIGURES = ['energyBefore', 'energyAfter', 'ksMaxAfter', 'minJacobianEigenvalue'] as const;

/**
 * The fit record is shown as it is (REMAP.REPORT, `remap report`), so every field
 * must have the type the report expects: a cost with a known kind, numbers where
 * numbers go, text where text goes, warnings with code, message and action.
 */
function checkFitRecord(fitted: Record<string, unknown>, bad: (what: string) => never): void {
  const cost = fitted.cost as Record<string, unknown>;
  if (!isPlainObject(cost) || typeof cost.w2Squared !== 'number') bad('"fitted.cost" is missing');
  if (!COST_KINDS.has(cost.kind as string)) bad('"fitted.cost.kind" is not a kind of cost Remap reports');
  if (!((cost.w2Squared as number) >= 0) || typeof cost.w2 !== 'number' || !((cost.w2 as number) >= 0))
    bad('"fitted.cost" does not hold a squared W2 and W2 of at least 0');
  if (cost.w1 !== undefined && typeof cost.w1 !== 'number') bad('"fitted.cost.w1" is not a number');
  if (cost.perColumn !== undefined && !(Array.isArray(cost.perColumn) && cost.perColumn.every((v) => typeof v === 'number')))
    bad('"fitted.cost.perColumn" is not a list of numbers');
  if (typeof cost.note !== 'string') bad('"fitted.cost.note" is not text');
  if (cost.bound !== undefined && !COST_BOUNDS.has(cost.bound as string)) bad('"fitted.cost.bound" is not exact, lower or estimate');
  if (cost.label !== undefined && typeof cost.label !== 'string') bad('"fitted.cost.label" is not text');
  if (cost.units !== undefined && cost.units !== 'raw' && cost.units !== 'standardised') bad('"fitted.cost.units" is not raw or standardised');
  const eff = fitted.effectiveSize as Record<string, unknown> | undefined;
  if (eff !== undefined && !(isPlainObject(eff) && typeof eff.source === 'number' && typeof eff.target === 'number'))
    bad('"fitted.effectiveSize" is not a pair of numbers');
  const cmp = fitted.comparison as Record<string, unknown> | undefined;
  if (cmp !== undefined) {
    const pair = (v: unknown) => isPlainObject(v) && isCount(v.source) && isCount(v.target);
    if (
      !isPlainObject(cmp) ||
      (cmp.basis !== 'fitting rows' && cmp.basis !== 'rows given') ||
      !pair(cmp.ks) ||
      !pair(cmp.energy) ||
      typeof cmp.note !== 'string' ||
      !(cmp.seed === null || isCount(cmp.seed))
    ) {
      bad('"fitted.comparison" does not say which rows the comparison used');
    }
  }
  for (const f of OPTIONAL_FIGURES) if (fitted[f] !== undefined && typeof fitted[f] !== 'number') bad(`"fitted.${f}" is not a number`);
  const c = fitted.convergence as Record<string, unknown> | undefined;
  if (c !== undefined) {
    if (
      !isPlainObject(c) ||
      !isCount(c.iterations) ||
      typeof c.finalError !== 'number' ||
      typeof c.converged !== 'boolean' ||
      typeof c.criterion !== 'string'
    ) {
      bad('"fitted.convergence" does not hold iterations, finalError, converged and criterion');
    }
  }
  if (!Array.isArray(fitted.warnings)) bad('"fitted.warnings" is not a list');
  for (const w of fitted.warnings as unknown[]) {
    const r = w as Record<string, unknown>;
    if (!isPlainObject(r) || typeof r.code !== 'string' || typeof r.message !== 'string' || typeof r.action !== 'string')
      bad('a warning in "fitted.warnings" lacks its code, message or action');
  }
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && Object.getPrototypeOf(v) === Object.prototype;
}

function isCount(v: unknown): boolean {
  return typeof v === 'number' && Number.isInteger(v) && v >= 0;
}

/** JSON cannot hold NaN or Infinity, but numbers like 1e999 parse to Infinity: refuse them. */
function checkAllFinite(v: unknown, depth: number): void {
  if (depth > 64) throw new RemapError('Map JSON is nested too deeply; it was not written by Remap.');
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new RemapError('Map JSON holds a number too large to be finite; it was not written by Remap.');
    return;
  }
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) {
      const x = v[i];
      if (typeof x === 'number') {
        if (!Number.isFinite(x)) throw new RemapError('Map JSON holds a number too large to be finite; it was not written by Remap.');
      } else checkAllFinite(x, depth + 1);
    }
    return;
  }
  if (v !== null && typeof v === 'object') for (const x of Object.values(v)) checkAllFinite(x, depth + 1);
}
