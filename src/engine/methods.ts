import { BaseMap } from './base';
import { RemapError } from './errors';
import type { FitContext, MapJSON, MethodName, TransportMap } from './map';
import type { MethodSpec } from './method';
import type { Sample } from './points';
import { resolveSettings, type SettingSpec, type Settings } from './settings';
import { outsideBothTails } from './outside';
import { asSample, checkSameColumns, checkSample, checkScale } from './validate';
import { entropicMethod } from './entropic/method';
import { gradientNetMethod } from './gradient-net/method';
import { linearMethod } from './linear/method';
import { pairsMethod } from './pairs/method';
import { ordinalMethod } from './quantile/ordinal-method';
import { quantileMethod } from './quantile/quantile-method';
import { stepMethod } from './quantile/step-method';

/**
 * Every method the product offers, in the order menus list them. The list is
 * explicit: whoever imports this module sees every method, with no import
 * done for its side effects. To add a method, add its spec here
 * (DEVELOPERS.md, "Adding a method").
 */
const METHODS: readonly MethodSpec[] = Object.freeze([quantileMethod, stepMethod, ordinalMethod, linearMethod, pairsMethod, entropicMethod, gradientNetMethod]);

/** All methods, in menu order. */
export function listMethods(): readonly MethodSpec[] {
  return METHODS;
}

/**
 * The spec of method `name` (case-insensitive).
 * @throws RemapError listing the known methods.
 */
export function getMethod(name: string): MethodSpec {
  const key = String(name).trim().toLowerCase();
  const m = METHODS.find((s) => s.name === key);
  if (!m) throw new RemapError(`Unknown method "${name}"; choose one of ${METHODS.map((s) => s.name).join(', ')}, or auto.`);
  return m;
}

/**
 * The full list of settings a method takes: its own. No setting is common to
 * every method (`tails` is listed by the methods that honour it: TAILS_SETTING).
 */
export function settingSpecs(method: MethodSpec): readonly SettingSpec[] {
  return method.settings;
}

/**
 * What `method` does with values outside the fitted range, in words, for the
 * pane, reports and the README: its spec's own `outside` text, else the
 * product's text for it (outside.ts), both tails choices named where it has them.
 * O(1).
 * @example outsideSummary(getMethod('linear')) // 'the same affine map continues beyond the fitted range: ...'
 */
export function outsideSummary(method: MethodSpec): string {
  return method.outside ?? outsideBothTails(method.name);
}

/** Validates samples and settings for `method`; returns the resolved settings. */
export function prepareFit(method: MethodSpec, source: Sample, target: Sample, rawSettings: Readonly<Record<string, unknown>>): Settings {
  const fn = `fit (${method.name})`;
  checkSameColumns(source, target, fn);
  if (source.d < 1) throw new RemapError(`${fn}: the source has no columns; select at least one column of numbers.`);
  const min = method.minRows(source.d);
  checkSample(source, 'source', min, fn);
  checkSample(target, 'target', min, fn);
  if (method.shape === 'joint') {
    checkScale(source, 'source', fn);
    checkScale(target, 'target', fn);
  }
  if (!method.weights && (source.weights || target.weights)) {
    throw new RemapError(`${fn}: the ${method.name} method does not take row weights; leave the weights out or choose a method that takes them.`);
  }
  return resolveSettings(method.name, settingSpecs(method), rawSettings);
}

/**
 * Fits a map with the named method. Validates everything first.
 * @example await fitMap('quantile', sample([1, 2, 3]), sample([10, 20, 30])) // a quantile map
 */
export async function fitMap(
  name: string,
  source: Sample,
  target: Sample,
  rawSettings: Readonly<Record<string, unknown>> = {},
  ctx: FitContext = {},
): Promise<TransportMap> {
  return await startFit(name, source, target, rawSettings, ctx);
}

/**
 * Starts a fit: validates, then returns the map at once for methods that fit
 * synchronously, or a Promise for those that train in the background.
 */
export function startFit(
  name: string,
  source: Sample,
  target: Sample,
  rawSettings: Readonly<Record<string, unknown>> = {},
  ctx: FitContext = {},
): TransportMap | Promise<TransportMap> {
  const method = getMethod(name);
  const fn = `fit (${method.name})`;
  const s = asSample(source, 'source', fn);
  const t = asSample(target, 'target', fn);
  const settings = prepareFit(method, s, t, rawSettings);
  const r = method.fit(s, t, settings, ctx);
  return r instanceof Promise ? r.then((m) => withSamples(m, s, t)) : withSamples(r, s, t);
}

/** Lets a fitted map compare its mapped source with the target when diagnostics are asked for. */
function withSamples(map: TransportMap, source: Sample, target: Sample): TransportMap {
  if (map instanceof BaseMap) map.attachSamples(source, target);
  return map;
}

/**
 * Fits a map synchronously; for methods whose fit is synchronous (all but the
 * trained ones). Used where the caller cannot wait (a synchronous spreadsheet engine).
 * @throws RemapError if the method only fits asynchronously.
 */
export function fitMapSync(
  name: string,
  source: Sample,
  target: Sample,
  rawSettings: Readonly<Record<string, unknown>> = {},
  ctx: FitContext = {},
): TransportMap {
  const method = getMethod(name);
  const refuse = (): never => {
    throw new RemapError(`The ${method.name} method trains in the background; use REMAP.FIT and apply its handle instead.`);
  };
  if (method.background) refuse();
  const r = startFit(name, source, target, rawSettings, ctx);
  if (r instanceof Promise) {
    r.then(
      (m) => m.dispose(),
      () => undefined,
    );
    refuse();
  }
  return r as TransportMap;
}

/** Restores a map from JSON already checked by `parseMapJSON`. */
export function restoreMap(json: MapJSON): TransportMap {
  return getMethod(json.method).fromJSON(json);
}

export type { MethodName };
