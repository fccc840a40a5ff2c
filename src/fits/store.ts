import { RemapError } from '../engine/errors';
import type { TransportMap } from '../engine/map';
import { parseMapJSON } from '../engine/map-json';
import { restoreMap } from '../engine/methods';
import { isHandle, isProgressText } from './handles';
import { currentKeeper, type KeptInfo } from './keeper';
import { Shelf } from './shelf';

/**
 * Fitted maps by handle, for this session. A handle is text derived from the
 * method, the data and the settings ("remap:linear:5000x3:0f3a2c1b9d4e77"), so a
 * recalculation with unchanged inputs finds the map it already has instead of
 * fitting again. Maps may also be kept outside the session (the workbook, in the
 * add-in): a `Keeper` set by the host is asked for a handle this session lacks.
 */

const shelf = new Shelf<TransportMap>((json) => restoreMap(parseMapJSON(json)));

/**
 * Remembers a map fitted elsewhere (the pane's background fit) and keeps it
 * with the keeper, waiting until it is kept: a REMAP.FIT formula written
 * afterwards finds it in this session or, in another runtime, in the workbook.
 * @throws whatever the keeper's save throws, so the caller can say the map was not kept.
 */
export async function rememberAndKeep(handle: string, map: TransportMap, info?: KeptInfo): Promise<void> {
  remember(handle, map);
  await currentKeeper()?.save(handle, JSON.stringify(map.toJSON()), info);
}

/** Remembers a fitted map under its handle (most recently used last; the oldest is dropped past 64). */
export function remember(handle: string, map: TransportMap): void {
  shelf.remember(handle, map);
}

/** The map for `handle` if this session has it. */
export function recall(handle: string): TransportMap | undefined {
  return shelf.recall(handle);
}

/** Forgets a map (and disposes it). */
export function forget(handle: string): void {
  shelf.forget(handle);
}

/** Forgets every map (tests, and the pane's "clear"). */
export function forgetAll(): void {
  shelf.forgetAll();
}

/**
 * Returns the map for `handle`, fitting it with `fit` only if neither this
 * session nor the keeper has it; concurrent requests for one handle share one fit.
 */
export function recallOrFit(handle: string, fit: () => TransportMap | Promise<TransportMap>, info?: KeptInfo): TransportMap | Promise<TransportMap> {
  return shelf.recallOrFit(handle, fit, info);
}

/** The running fit for `handle`, if one is in flight in this session. */
export function running(handle: string): Promise<TransportMap> | undefined {
  return shelf.running(handle);
}

/**
 * Finds the map a formula names: a handle (this session, then the keeper) or the
 * JSON text REMAP.SAVE wrote.
 * @throws RemapError (#N/A) when the handle is unknown.
 */
export function resolveMap(model: string, fn: string): TransportMap | Promise<TransportMap> {
  const text = String(model ?? '').trim();
  if (text.startsWith('{')) return restoreMap(parseMapJSON(text));
  if (isProgressText(text)) {
    throw new RemapError(`${fn}: the REMAP.FIT cell is still working ("${text.slice(0, 80)}"); this cell fills in when the fit ends.`, 'na');
  }
  if (!isHandle(text)) {
    throw new RemapError(`${fn}: "${text.slice(0, 60)}" is not a map; give the cell holding REMAP.FIT's result or REMAP.SAVE's JSON text.`);
  }
  return shelf.find(text, () => {
    throw new RemapError(
      `${fn}: no map with handle ${text} is open; recalculate the REMAP.FIT cell that made it, or load its saved JSON with REMAP.LOAD.`,
      'na',
    );
  });
}
