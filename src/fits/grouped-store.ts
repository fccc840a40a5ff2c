import { RemapError } from '../engine/errors';
import type { GroupedMap } from '../engine/groups/grouped-map';

/**
 * Maps by group, by handle, for this session (the 64 most recently used), as
 * store.ts keeps single maps: REMAP.FITGROUPS remembers, REMAP.APPLYGROUPS and
 * REMAP.GROUPREPORT and the pane's group list recall. A grouped handle reads
 * "remap:groups-<method>:<n>x<d>:<hex>".
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
 * The map under `handle`, fitted by `fit` if the session lacks it; a fit
 * already running for the handle is shared, not started twice.
 */
export function recallOrFitGrouped(handle: string, fit: () => GroupedMap | Promise<GroupedMap>): GroupedMap | Promise<GroupedMap> {
  const known = recallGrouped(handle);
  if (known) return known;
  const running = inflight.get(handle);
  if (running) return running;
  const r = fit();
  if (!(r instanceof Promise)) {
    rememberGrouped(handle, r);
    return r;
  }
  const p = r.then(
    (m) => {
      inflight.delete(handle);
      rememberGrouped(handle, m);
      return m;
    },
    (e: unknown) => {
      inflight.delete(handle);
      throw e;
    },
  );
  inflight.set(handle, p);
  return p;
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
  throw new RemapError(`${fn}: no map by group is known under ${t} in this session; recalculate the REMAP.FITGROUPS cell that made it.`);
}
