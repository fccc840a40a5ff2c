import { noteCellMap } from './cell-maps';
import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import { fitGroupedMap, fitGroupedMapSync } from '../engine/groups/fit-grouped';
import { groupKey, type GroupLabel } from '../engine/groups/group-labels';
import type { GroupedMap } from '../engine/groups/grouped-map';
import { getMethod } from '../engine/methods';
import { readText, type CellIn } from '../input';
import { readGroupLabels } from './group-labels-in';
import { currentFitter, fitInThisThread, type FitRun } from './fit-service';
import { recallOrFitGrouped } from './grouped-store';
import { budgetError } from './time-budget';
import { makeHandle } from './handles';
import type { MaybePromise } from './maybe-promise';
import { readFit, type FitCells, type FitInputs } from './read-fit';

/** The cells of a fit by group: a fit's cells plus a group range per sample and the fallback. */
export interface GroupedFitCells extends FitCells {
  readonly sourceGroups: CellIn;
  readonly targetGroups: CellIn;
  readonly fallback?: CellIn;
}

/** A fit by group read from cells, with its handle. */
export interface GroupedFitInputs {
  readonly inputs: FitInputs;
  readonly sourceGroups: GroupLabel[];
  readonly targetGroups: GroupLabel[];
  readonly fallback: 'none' | 'pooled';
  readonly handle: string;
}

/**
 * Reads a fit by group: samples, method and settings as every fit reads them
 * (readFit), one label per kept row of each sample, and the fallback ("none",
 * the default, or "pooled"). The handle covers the labels too, so relabelling
 * rows fits again. O(n d).
 * @throws RemapError naming `fn` and the argument for any bad input.
 */
export function readGroupedFit(fn: string, cells: GroupedFitCells): GroupedFitInputs {
  const inputs = readFit(fn, cells);
  const sourceGroups = readGroupLabels(cells.sourceGroups, { cells: cells.source, read: inputs.source }, 'source_groups', fn);
  const targetGroups = readGroupLabels(cells.targetGroups, { cells: cells.target, read: inputs.target }, 'target_groups', fn);
  const fallback = readText(cells.fallback, 'fallback', fn, 'none').toLowerCase();
  if (fallback !== 'none' && fallback !== 'pooled') {
    throw new RemapError(`${fn}: fallback is "${fallback}"; give "none" (a group lacking rows is an error) or "pooled" (the map of all rows stands in).`);
  }
  const f = new Fingerprint().text(inputs.handle).text(fallback);
  for (const g of sourceGroups) f.text(groupKey(g));
  f.text('|');
  for (const g of targetGroups) f.text(groupKey(g));
  const handle = makeHandle(`groups-${inputs.method}`, inputs.source.sample.n, inputs.source.sample.d, f.hex());
  return { inputs, sourceGroups, targetGroups, fallback, handle };
}

/**
 * The map by group the inputs describe: found in this session or the keeper,
 * or fitted, as REMAP.FIT fits: each group's fit goes through the fit service's
 * Fitter (a worker in the add-in; then the result is a Promise), and Remap's
 * time budget (the time_budget setting, for methods without their own) covers
 * the whole fit by group, checked between groups and inside each iterative fit;
 * running out is an error saying so. A method with its own time_budget
 * (gradient-net) gets it for each group's training. With the default Fitter a
 * method that fits synchronously is fitted synchronously.
 * `valueGroups` are checked at fit time, so a group only the values hold is an
 * error naming it (or uses the pooled map with the fallback).
 * Cost: the method's fit summed over the groups, or O(1) when the handle is known.
 */
export function fitGrouped(g: GroupedFitInputs, valueGroups?: readonly GroupLabel[], run: FitRun = {}): MaybePromise<GroupedMap> {
  const { inputs } = g;
  const outer = run.signal;
  const deadline = Number.isFinite(inputs.budgetSeconds) ? Date.now() + inputs.budgetSeconds * 1000 : Infinity;
  let overBudget = false;
  // A getter, read by the engine between groups and as iterative fits run, as fitFromInputs does for one map.
  const signal = {
    get aborted(): boolean {
      if (outer?.aborted) return true;
      if (!overBudget && Date.now() > deadline) overBudget = true;
      return overBudget;
    },
  };
  const ctx = {
    columns: inputs.source.columns ?? undefined,
    dropped: { source: inputs.source.dropped, target: inputs.target.dropped },
    signal,
    ...(run.onProgress ? { onProgress: run.onProgress } : {}),
  };
  const s = inputs.source.sample;
  const t = inputs.target.sample;
  // Value groups unknown to the samples would change the fit's checks, so they join the handle's key.
  const known = new Set([...g.sourceGroups, ...g.targetGroups].map(groupKey));
  const extra = valueGroups ? [...new Set(valueGroups.map(groupKey))].filter((k) => !known.has(k)) : [];
  const handle = extra.length === 0 ? g.handle : `${g.handle}${new Fingerprint().text(extra.join('|')).hex().slice(0, 4)}`;
  const fitter = currentFitter();
  const options = { fallback: g.fallback, valueGroups, ctx, ...(fitter === fitInThisThread ? {} : { fit: fitter }) };
  const overrun = (e: unknown): never => {
    if (overBudget && !outer?.aborted && e instanceof RemapError && e.kind === 'cancelled') {
      throw budgetError(inputs.fn, inputs.method, s.n, t.n, inputs.budgetSeconds);
    }
    throw e;
  };
  // The cell's address (REMAP.FITGROUPS, REMAP.BYGROUP) lets the pane list this formula with its map's warnings.
  if (run.cell) noteCellMap(run.cell, inputs.fn, handle);
  let r: MaybePromise<GroupedMap>;
  try {
    r = recallOrFitGrouped(
      handle,
      () =>
        getMethod(inputs.method).background || fitter !== fitInThisThread
          ? fitGroupedMap(inputs.method, s, g.sourceGroups, t, g.targetGroups, inputs.settings, options)
          : fitGroupedMapSync(inputs.method, s, g.sourceGroups, t, g.targetGroups, inputs.settings, options),
      run.cell ? { cell: run.cell } : undefined,
    );
  } catch (e) {
    return overrun(e);
  }
  return r instanceof Promise ? r.catch(overrun) : r;
}
