import { RemapError } from '../engine/errors';
import { isGroupedMapJSON, parseGroupedMapJSON, restoreGroupedMap } from '../engine/groups/grouped-json';
import type { GroupedMap } from '../engine/groups/grouped-map';
import { currentKeeper, type KeptInfo } from './keeper';

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

const MAX_GROUPED = 64;
const grouped = new Map<string, GroupedMap>();
const inflight = new Map<string, Promise<GroupedMap>>();

/** True when `text` names a map by group (as opposed to a single map). */
export function isGroupedHandle(text: string): boolean {
  return /^remap:groups-[a-z-]+:\d+x\d+:[0-9a-f]+$/.test(text.trim());
}

/** Remembers a map by group under its handle; the oldest past 64 is dropped and disposed. */
export function rememberGrouped(handle: string, map: GroupedMap): void {
  grouped.delete(handle);
  grouped.set(handle, map);
  while (grouped.size > MAX_GROUPED) {
    const oldest = grouped.keys().next().value as string;
    grouped.get(oldest)?.dispose();
    grouped.delete(oldest);
  }
}

/** The map by group under `handle`, if this session has it. */
export function recallGrouped(handle: string): GroupedMap | undefined {
  const m = grouped.get(handle.trim());
  if (m) {
    grouped.delete(handle.trim());
    grouped.set(handle.trim(), m);
  }
  return m;
}

/** Every grouped handle this session knows, most recent last (the pane's list). */
export function groupedHandles(): string[] {
  return [...grouped.keys()];
}

/** Forgets every map by group (tests). */
export function forgetAllGrouped(): void {
  for (const m of grouped.values()) m.dispose();
  grouped.clear();
  inflight.clear();
}

/**
 * The map under `handle`: this session's, else the keeper's copy, else fitted
 * by `fit` (and then kept); a fit already running for the handle is shared,
 * not started twice. A kept copy that no longer reads is fitted again.
 */
export function recallOrFitGrouped(handle: string, fit: () => GroupedMap | Promise<GroupedMap>, info?: KeptInfo): GroupedMap | Promise<GroupedMap> {
  const known = recallGrouped(handle);
  if (known) return known;
  const running = inflight.get(handle);
  if (running) return running;
  const finish = (json: string | null): GroupedMap | Promise<GroupedMap> => {
    const restored = fromKept(handle, json);
    if (restored) return restored;
    const r = fit();
    if (!(r instanceof Promise)) {
      store(handle, r, info);
      return r;
    }
    const p = r.then(
      (m) => {
        inflight.delete(handle);
        store(handle, m, info);
        return m;
      },
      (e: unknown) => {
        inflight.delete(handle);
        throw e;
      },
    );
    inflight.set(handle, p);
    return p;
  };
  const kept = keptText(handle);
  return kept instanceof Promise ? kept.then(finish, () => finish(null)) : finish(kept);
}

/** The keeper's text for `handle` (null when none is kept or there is no keeper; a damaged copy reads as none). */
function keptText(handle: string): string | null | Promise<string | null> {
  try {
    return currentKeeper()?.load(handle) ?? null;
  } catch {
    return null;
  }
}

/** A kept copy restored and remembered, or null when `json` is absent or not a map by group that reads. */
function fromKept(handle: string, json: string | null): GroupedMap | null {
  if (!json) return null;
  try {
    const m = restoreGroupedMap(parseGroupedMapJSON(json));
    rememberGrouped(handle, m);
    return m;
  } catch {
    return null;
  }
}

/** Remembers a fitted map by group and gives it to the keeper (best effort: it still works in this session). */
function store(handle: string, m: GroupedMap, info?: KeptInfo): void {
  rememberGrouped(handle, m);
  const keeper = currentKeeper();
  if (!keeper) return;
  try {
    const r = keeper.save(handle, JSON.stringify(m.toJSON()), info);
    if (r instanceof Promise) r.catch(() => undefined);
  } catch {
    /* keeping is best effort */
  }
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
  const m = recallGrouped(t);
  if (m) return m;
  const running = inflight.get(t);
  if (running) return running;
  const missing = (): never => {
    throw new RemapError(
      `${fn}: no map by group is known under ${t} in this session or this workbook; recalculate the REMAP.FITGROUPS cell that made it.`,
      'na',
    );
  };
  const found = (json: string | null): GroupedMap => {
    if (json && isGroupedMapJSON(safeParse(json))) return restoreKept(t, json);
    return missing();
  };
  const kept = currentKeeper()?.load(t) ?? null;
  return kept instanceof Promise ? kept.then(found) : found(kept);
}

function safeParse(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

/** Restores a kept copy for a using cell: a copy that does not read is an error saying so (the using cell cannot refit). */
function restoreKept(handle: string, json: string): GroupedMap {
  const m = restoreGroupedMap(parseGroupedMapJSON(json));
  rememberGrouped(handle, m);
  return m;
}
