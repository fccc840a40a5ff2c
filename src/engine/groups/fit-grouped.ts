import { RemapError } from '../errors';
import { asSample } from '../validate';
import type { FitContext, TransportMap } from '../map';
import type { MethodSpec } from '../method';
import { fitMapSync, getMethod, prepareFit, startFit } from '../methods';
import type { Sample } from '../points';
import { kishRows } from './effective-rows';
import { groupKey, groupRows, type GroupLabel } from './group-labels';
import { GroupedMap, type GroupEntry, type GroupFallback, type GroupSizes } from './grouped-map';
import { pickSampleRows } from './pick-rows';

/** Options of a fit by group. */
export interface GroupedFitOptions {
  /** 'none' (default): a group lacking rows is an error naming it; 'pooled': the map fitted on all rows stands in, with a warning naming the group. */
  readonly fallback?: GroupFallback;
  /** The group labels of the values to be mapped: each must be mappable, so a group only they hold is checked at fit time. */
  readonly valueGroups?: ArrayLike<GroupLabel>;
  /** Column names, dropped rows, progress and cancelling, passed on to every group's fit. */
  readonly ctx?: FitContext;
  /**
   * Fits one group's map (default: the engine's own `startFit`). A host passes
   * its own to run each group's fit elsewhere (a worker), with the same inputs.
   */
  readonly fit?: GroupFitter;
}

/** Fits one group's map, as the engine's `startFit` does (sync or a Promise). */
export type GroupFitter = (
  method: string,
  source: Sample,
  target: Sample,
  settings: Readonly<Record<string, unknown>>,
  ctx: FitContext,
) => TransportMap | Promise<TransportMap>;

interface Plan {
  readonly spec: MethodSpec;
  readonly keys: readonly string[];
  readonly parts: ReadonlyMap<string, { source: Sample | null; target: Sample | null; sizes: GroupSizes; reason: string | null }>;
  readonly fallback: GroupFallback;
}

/**
 * Fits one map per group: the source rows of group g onto the target rows of
 * group g, with `method` and the same settings, weights honoured. Every group
 * found in the source, the target or `options.valueGroups` must have, on both
 * sides, at least as many Kish effective rows ((sum w)^2 / sum w^2; Kish,
 * "Survey Sampling", 1965) as the method needs (`minRows(d)`), or it is an
 * error naming the group; with `fallback: 'pooled'` the map fitted on all rows
 * stands in for such groups (and for groups first seen when applying), and the
 * report names each. Fitting the groups one by one equals this, group for
 * group, bit for bit.
 * Cost: the method's fit cost summed over the groups (plus one fit on all rows
 * with the pooled fallback), plus O(n + m) to split the rows.
 * @param method a method name (not auto: choose once for all groups).
 * @param source,target samples with the same columns; weights optional.
 * @param sourceGroups,targetGroups one label (text or number; 3 and "3" are one group) per row.
 * @param settings the method's settings, as for fitMap.
 * @throws RemapError for bad samples or labels, a group lacking rows (without fallback), or a group's fit failing (the message names the group).
 * @example await fitGroupedMap('quantile', sample([1, 2, 5, 6]), ['a', 'a', 'b', 'b'], sample([0, 1, 9, 10]), ['a', 'a', 'b', 'b'])
 */
export async function fitGroupedMap(
  method: string,
  source: Sample,
  sourceGroups: ArrayLike<GroupLabel>,
  target: Sample,
  targetGroups: ArrayLike<GroupLabel>,
  settings: Readonly<Record<string, unknown>> = {},
  options: GroupedFitOptions = {},
): Promise<GroupedMap> {
  const plan = planGroups(method, source, sourceGroups, target, targetGroups, settings, options);
  const fits = new Map<string, TransportMap>();
  const fitOne = options.fit ?? startFit;
  const ctx = options.ctx ?? {};
  // Checked between groups too, so a cancel or a caller's time budget stops many quick closed-form fits.
  const stopped = (): void => {
    if (ctx.signal?.aborted) throw new RemapError(`fit by group (${plan.spec.name}): the fit was cancelled before every group was fitted.`, 'cancelled');
  };
  try {
    for (const key of plan.keys) {
      const p = plan.parts.get(key)!;
      stopped();
      if (p.reason === null) fits.set(key, await inGroup(key, plan.spec.name, () => fitOne(plan.spec.name, p.source!, p.target!, settings, ctx)));
    }
    stopped();
    const pooled = plan.fallback === 'pooled' ? await inGroup(null, plan.spec.name, () => fitOne(plan.spec.name, source, target, settings, ctx)) : null;
    return assemble(plan, fits, pooled, source, target, settings);
  } catch (e) {
    for (const m of fits.values()) m.dispose();
    throw e;
  }
}

/**
 * `fitGroupedMap` for methods that fit synchronously (all but gradient-net).
 * @throws RemapError as fitGroupedMap, and for a method that trains in the background.
 */
export function fitGroupedMapSync(
  method: string,
  source: Sample,
  sourceGroups: ArrayLike<GroupLabel>,
  target: Sample,
  targetGroups: ArrayLike<GroupLabel>,
  settings: Readonly<Record<string, unknown>> = {},
  options: GroupedFitOptions = {},
): GroupedMap {
  const plan = planGroups(method, source, sourceGroups, target, targetGroups, settings, options);
  const fits = new Map<string, TransportMap>();
  for (const key of plan.keys) {
    const p = plan.parts.get(key)!;
    if (options.ctx?.signal?.aborted) {
      for (const m of fits.values()) m.dispose();
      throw new RemapError(`fit by group (${plan.spec.name}): the fit was cancelled before every group was fitted.`, 'cancelled');
    }
    if (p.reason === null)
      fits.set(
        key,
        inGroupSync(key, plan.spec.name, () => fitMapSync(plan.spec.name, p.source!, p.target!, settings, options.ctx ?? {})),
      );
  }
  const pooled =
    plan.fallback === 'pooled' ? inGroupSync(null, plan.spec.name, () => fitMapSync(plan.spec.name, source, target, settings, options.ctx ?? {})) : null;
  return assemble(plan, fits, pooled, source, target, settings);
}

function planGroups(
  method: string,
  source: Sample,
  sourceGroups: ArrayLike<GroupLabel>,
  target: Sample,
  targetGroups: ArrayLike<GroupLabel>,
  settings: Readonly<Record<string, unknown>>,
  options: GroupedFitOptions,
): Plan {
  const spec = getMethod(method);
  const fn = `fit by group (${spec.name})`;
  const fallback = options.fallback ?? 'none';
  if (fallback !== 'none' && fallback !== 'pooled') throw new RemapError(`${fn}: the fallback is "${String(fallback)}"; choose none or pooled.`);
  source = asSample(source, 'source', fn);
  target = asSample(target, 'target', fn);
  prepareFit(spec, source, target, settings); // checks both whole samples and the settings once
  const s = groupRows(sourceGroups, source.n, 'source group labels', fn);
  const t = groupRows(targetGroups, target.n, 'target group labels', fn);
  const keys: string[] = [];
  const seen = new Set<string>();
  const add = (k: string) => {
    if (!seen.has(k)) {
      seen.add(k);
      keys.push(k);
    }
  };
  s.keys.forEach(add);
  t.keys.forEach(add);
  if (options.valueGroups) for (let i = 0; i < options.valueGroups.length; i++) add(groupKey(options.valueGroups[i]));
  const need = spec.minRows(source.d);
  const parts = new Map<string, { source: Sample | null; target: Sample | null; sizes: GroupSizes; reason: string | null }>();
  const problems: string[] = [];
  for (const key of keys) {
    const sr = s.rows.get(key);
    const tr = t.rows.get(key);
    const sub = (x: Sample, r: Int32Array | undefined) => (r ? pickSampleRows(x, r) : null);
    const ss = sub(source, sr);
    const ts = sub(target, tr);
    const sizes: GroupSizes = {
      rows: { source: ss?.n ?? 0, target: ts?.n ?? 0 },
      effectiveRows: { source: ss ? kishRows(ss.n, ss.weights) : 0, target: ts ? kishRows(ts.n, ts.weights) : 0 },
      weight: { source: ss ? total(ss) : 0, target: ts ? total(ts) : 0 },
    };
    let reason: string | null = null;
    if (!ss && !ts) reason = 'no source and no target rows';
    else if (!ss) reason = 'no source rows';
    else if (!ts) reason = 'no target rows';
    else {
      for (const side of ['source', 'target'] as const) {
        const eff = sizes.effectiveRows[side];
        if (reason === null && eff < need - 1e-9) {
          reason = `${round(eff)} effective ${side} row${eff === 1 ? '' : 's'}, fewer than the ${need} the ${spec.name} method needs`;
        }
      }
    }
    if (reason !== null) problems.push(`group "${key}" has ${reason}`);
    parts.set(key, { source: ss, target: ts, sizes, reason });
  }
  if (problems.length > 0 && fallback === 'none') {
    const list = problems.slice(0, 8).join('; ') + (problems.length > 8 ? `; and ${problems.length - 8} more` : '');
    throw new RemapError(
      `${fn}: ${list}. Give those groups more rows (effective rows are Kish's (sum of weights)^2 / sum of squared weights), leave them out, or set the fallback to pooled to map them with the map fitted on all rows.`,
    );
  }
  return { spec, keys, parts, fallback };
}

function assemble(
  plan: Plan,
  fits: Map<string, TransportMap>,
  pooled: TransportMap | null,
  source: Sample,
  _target: Sample,
  settings: Readonly<Record<string, unknown>>,
): GroupedMap {
  const entries: GroupEntry[] = plan.keys.map((key) => {
    const p = plan.parts.get(key)!;
    return { group: key, ...p.sizes, map: fits.get(key) ?? null, reason: p.reason };
  });
  const first = fits.values().next().value ?? pooled;
  const resolved = first ? first.diagnostics().settings : settings;
  const columns = first ? first.diagnostics().columns : null;
  return new GroupedMap(plan.spec.name, source.d, columns, resolved as GroupedMap['settings'], plan.fallback, entries, pooled);
}

async function inGroup(key: string | null, method: string, f: () => TransportMap | Promise<TransportMap>): Promise<TransportMap> {
  try {
    return await f();
  } catch (e) {
    throw named(e, key, method);
  }
}

function inGroupSync(key: string | null, method: string, f: () => TransportMap): TransportMap {
  try {
    return f();
  } catch (e) {
    throw named(e, key, method);
  }
}

function named(e: unknown, key: string | null, method: string): unknown {
  if (!(e instanceof RemapError) || e.kind === 'cancelled') return e;
  return new RemapError(`fit by group (${method}), ${key === null ? 'the pooled map on all rows' : `group "${key}"`}: ${e.message}`, e.kind);
}

function total(s: Sample): number {
  if (!s.weights) return s.n;
  let t = 0;
  for (let i = 0; i < s.n; i++) t += s.weights[i];
  return t;
}

function round(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toPrecision(3);
}
