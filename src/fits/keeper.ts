/**
 * Where fitted maps are kept beyond this session. The host sets one (the
 * workbook, in the add-in); tests and the command line run without. The fit
 * store asks it for a handle this session lacks and gives it every new map.
 */

export interface Keeper {
  /** The map's JSON text for `handle`, or null if none is kept. May throw (or reject) when a kept copy is damaged. */
  load(handle: string): string | null | Promise<string | null>;
  /** Keeps `json` under `handle` (may be asynchronous; failures are reported, not thrown). */
  save(handle: string, json: string, info?: KeptInfo): void | Promise<void>;
}

/** What a keeper may record beside a map, for the pane's list of maps. */
export interface KeptInfo {
  /** The cell whose REMAP.FIT formula made the map, e.g. "Sheet1!F2", when known. */
  readonly cell?: string;
}

let keeper: Keeper | null = null;

/** Sets (or clears) where maps are kept beyond this session. */
export function setKeeper(k: Keeper | null): void {
  keeper = k;
}

/** The keeper set by the host, or null (tests, the command line). */
export function currentKeeper(): Keeper | null {
  return keeper;
}
