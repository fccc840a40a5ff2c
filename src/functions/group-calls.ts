import { RemapError } from '../engine/errors';
import type { GroupLabel } from '../engine/groups/group-labels';
import type { GroupedMap } from '../engine/groups/grouped-map';
import type { Points } from '../engine/points';
import { asRows, CellError, readText, readValues, type CellIn, type CellOut, type Grid } from '../input';
import { then, type FitRun, type MaybePromise } from '../fits';
import { labelAt } from '../fits/group-labels-in';
import { fitGrouped, readGroupedFit } from '../fits/grouped-fit';
import { resolveGrouped } from '../fits/grouped-store';
import { groupTable } from '../fits/group-table';
import { checkPayload } from './calls';

/**
 * Maps by group in the worksheet: REMAP.FITGROUPS (a handle), REMAP.APPLYGROUPS
 * (a handle's maps applied by group), REMAP.BYGROUP (fit and apply in one
 * formula) and REMAP.GROUPREPORT (every group's sizes, cost and warnings).
 * Argument order as every fitting function, with each sample's group range
 * right after it.
 */

/** REMAP.FITGROUPS: fits one map per group and returns the handle of them all. */
export function fitGroups(
  source: CellIn,
  sourceGroups: CellIn,
  target: CellIn,
  targetGroups: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  fallback?: CellIn,
  ctx: FitRun = {},
): MaybePromise<string> {
  const g = readGroupedFit('REMAP.FITGROUPS', { source, sourceGroups, target, targetGroups, method, settings, sourceWeights, targetWeights, fallback });
  return then(fitGrouped(g, undefined, ctx), () => g.handle);
}

/** REMAP.APPLYGROUPS: values mapped by their own group's map ("apply", default) or its inverse ("invert"). */
export function applyGroups(model: CellIn, vals: CellIn, groups: CellIn, direction?: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.APPLYGROUPS';
  const verb = readText(direction, 'direction', fn, 'apply').toLowerCase();
  if (verb !== 'apply' && verb !== 'invert') throw new RemapError(`${fn}: direction is "${verb}"; give "apply" (default) or "invert".`);
  return then(resolveGrouped(modelCell(model, fn), fn), (map) => {
    const read = readGroupedValues(vals, groups, map.d, fn);
    return checkPayload(runByGroup(map, read, verb), fn);
  });
}

/** REMAP.BYGROUP: fits one map per group and maps the values by their group, in one formula. */
export function byGroup(
  vals: CellIn,
  valueGroups: CellIn,
  source: CellIn,
  sourceGroups: CellIn,
  target: CellIn,
  targetGroups: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  fallback?: CellIn,
  ctx: FitRun = {},
): MaybePromise<Grid> {
  const fn = 'REMAP.BYGROUP';
  const g = readGroupedFit(fn, { source, sourceGroups, target, targetGroups, method, settings, sourceWeights, targetWeights, fallback });
  const read = readGroupedValues(vals, valueGroups, g.inputs.source.sample.d, fn);
  return then(fitGrouped(g, read.labels, ctx), (map) => checkPayload(runByGroup(map, read, 'apply'), fn));
}

/** REMAP.GROUPREPORT: a grouped map's groups with their sizes, costs and warnings (see groupTable). */
export function groupReport(model: CellIn): MaybePromise<Grid> {
  const fn = 'REMAP.GROUPREPORT';
  return then(resolveGrouped(modelCell(model, fn), fn), (map) => groupTable(map.report()));
}

/** Values to map by group: the points, one label each, and where each row's result goes. */
interface GroupedValues {
  readonly points: Points;
  readonly labels: GroupLabel[];
  /** Per values row: the point's index, or -1 with the cell(s) to show instead. */
  readonly slots: Int32Array;
  readonly reasons: (CellOut | null)[];
  readonly d: number;
}

/**
 * Reads values (one row per point: one column for a 1-D map) and their groups
 * (one cell per row, the same height). A row whose value is blank stays blank
 * whatever its group; a value with a blank group gives #VALUE! saying so.
 */
function readGroupedValues(vals: CellIn, groups: CellIn, d: number, fn: string): GroupedValues {
  const rows = asRows(vals);
  if (d === 1 && rows.length > 0 && rows[0].length !== 1) {
    throw new RemapError(`${fn}: the values have ${rows[0].length} columns; give one column of values beside one column of groups.`);
  }
  const { points, layout } = readValues(vals, d, fn);
  const g = asRows(groups);
  if (g.length !== layout.rows || g.some((r) => r.length !== 1)) {
    throw new RemapError(`${fn}: the groups range must be one column as tall as the values (${layout.rows} rows); it is ${g.length} x ${g[0]?.length ?? 0}.`);
  }
  const keep: number[] = [];
  const labels: GroupLabel[] = [];
  const slots = new Int32Array(layout.rows).fill(-1);
  const reasons: (CellOut | null)[] = layout.reasons.slice(0, layout.rows);
  for (let i = 0; i < layout.rows; i++) {
    const s = layout.slots[i];
    if (s < 0) continue;
    try {
      labels.push(labelAt(g[i][0], `group in row ${i + 1}`, fn));
    } catch (e) {
      reasons[i] = new CellError('value', (e as Error).message);
      continue;
    }
    slots[i] = keep.length;
    keep.push(s);
  }
  const data = new Float64Array(keep.length * d);
  keep.forEach((s, j) => data.set(points.data.subarray(s * d, (s + 1) * d), j * d));
  return { points: { n: keep.length, d, data }, labels, slots, reasons, d };
}

function runByGroup(map: GroupedMap, v: GroupedValues, verb: 'apply' | 'invert'): Grid {
  const mapped = v.points.n === 0 ? v.points : verb === 'apply' ? map.apply(v.points, v.labels) : map.invert(v.points, v.labels);
  const out: Grid = [];
  for (let i = 0; i < v.slots.length; i++) {
    const s = v.slots[i];
    if (s < 0) {
      out.push(new Array(v.d).fill(v.reasons[i] ?? ''));
      continue;
    }
    const row: CellOut[] = [];
    for (let k = 0; k < v.d; k++) {
      const y = mapped.data[s * v.d + k];
      row.push(Number.isFinite(y) ? y : new CellError('num', `The mapped value is not a finite number (${y}); rescale the data or use tails=clamp.`));
    }
    out.push(row);
  }
  return out;
}

function modelCell(model: CellIn, fn: string): string {
  const v = Array.isArray(model) ? (Array.isArray(model[0]) ? model[0][0] : model[0]) : model;
  if (typeof v !== 'string' || v.trim() === '')
    throw new RemapError(`${fn}: the model must be the cell holding REMAP.FITGROUPS's handle; got ${v === '' || v == null ? 'a blank' : String(v)}.`);
  return v;
}
