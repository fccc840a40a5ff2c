import { RemapError } from '../engine/errors';
import { isGroupedMapJSON, parseGroupedMapJSON, restoreGroupedMap } from '../engine/groups/grouped-json';
import type { GroupedMap } from '../engine/groups/grouped-map';
import type { KeptInfo } from './keeper';
import { Shelf } from './shelf';

/**
 * Maps by group, by handle, for this session (the 64 most recently used), as
 * store.ts keeps single maps: REMAP.FITGROUPS remembers, REMAP.APPLYGROUPS and
 * REMAP.GROUPREPORT and the pane's group list recall. A grouped handle reads
 * "remap:groups-<method>:<n>x<d>:<hex>". Like single maps, maps by group are
 * also given to the host's Keeper (the workbook, in the add-in) as their JSON
 * ("remap.grouped-map"), and a handle this session lacks is looked up there,
 * so after reopening a workbook REMAP.APPLYGROUPS gives the same values
 * without fitting again.
 */

const shelf = new Shelf<GroupedMap>((json) => restoreGroupedMap(parseGroupedMapJSON(json)));

/** True when `text` names a map by group (as opposed to a single map). */
export function isGroupedHandle(text: string): boolean {
  return /^remap:groups-[a-z-]+:\d+x\d+:[0-9a-f]+$/.test(text.trim());
}

/** Remembers a map by group under its handle; the oldest past 64 is dropped and disposed. */
export function rememberGrouped(handle: string, map: GroupedMap): void {
  shelf.remember(handle, map);
}

/** The map by group under `handle`, if this session has it. */
export function recallGrouped(handle: string): GroupedMap | undefined {
  return shelf.recall(handle.trim());
}

/** Every grouped handle this session knows, most recent last (the pane's list). */
export function groupedHandles(): string[] {
  return shelf.handles();
}

/** Forgets every map by group (tests). */
export function forgetAllGrouped(): void {
  shelf.forgetAll();
}

/**
 * The map by group under `handle`: this session's, else the keeper's copy, else fitted
 * by `fit` (and then kept); a fit already running for the handle is shared,
 * not started twice. A kept copy that no longer reads is fitted again.
 */
export function recallOrFitGrouped(handle: string, fit: () => GroupedMap | Promise<GroupedMap>, info?: KeptInfo): GroupedMap | Promise<GroupedMap> {
  return shelf.recallOrFit(handle, fit, info);
}

/**
 * The map by group a model cell names.
 * @throws RemapError when the text is no grouped handle, or this session does not know it.
 */
export function resolveGrouped(text: string, fn: string): GroupedMap | Promise<GroupedMap> {
  const t = text.trim();
  if (!isGroupedHandle(t)) {
    throw new RemapError(`${fn}: the model must be the cell holding REMAP.FITGROUPS's handle (it starts with "remap:groups-"); got "${t.slice(0, 60)}".`);
  }
  const missing = (): never => {
    throw new RemapError(
      `${fn}: no map by group is known under ${t} in this session or this workbook; recalculate the REMAP.FITGROUPS cell that made it.`,
      'na',
    );
  };
  return shelf.find(t, missing, (json) => isGroupedMapJSON(safeParse(json)));
}

function safeParse(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}
