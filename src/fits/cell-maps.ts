import type { Warning } from '../engine/map';

/**
 * Which map each formula cell used in this session, and what its own last
 * call found, so a door that lists the workbook's formulas (the pane) can show
 * the warnings of a REMAP.VALUES or REMAP.COST cell, whose result is not a
 * handle, and the extrapolation warning of a REMAP.APPLY, REMAP.INVERT or
 * REMAP.VALUES cell for the very values that cell mapped. The map's own report
 * never holds such per-call warnings: it must not depend on which cells were
 * calculated, or in what order. Filled by the fit service whenever a fit is
 * asked for with the cell's address, and by the functions that apply a map.
 */

/** What a cell asked for: the function, the handle of its map, and the warnings of its own last call. */
export interface CellMap {
  readonly fn: string;
  /** The map's handle; '' when the cell named its map by JSON text rather than by a handle. */
  readonly handle: string;
  /** Warnings about this cell's own values (rows outside the fitted range); empty when none, or before the cell has applied the map. */
  readonly calls: readonly Warning[];
}

const MAX_CELLS = 10_000;
const byCell = new Map<string, CellMap>();

/**
 * One spelling per cell: no $ signs, no quotes around the sheet name, upper
 * case (Excel's addresses are case-insensitive). O(length).
 * @example cellKey("'Q1 data'!$F$2") // 'Q1 DATA!F2'
 */
export function cellKey(address: string): string {
  const a = address.trim().replace(/\$/g, '');
  const bang = a.lastIndexOf('!');
  if (bang < 0) return a.toUpperCase();
  let sheet = a.slice(0, bang);
  if (sheet.startsWith("'") && sheet.endsWith("'")) sheet = sheet.slice(1, -1).replace(/''/g, "'");
  return `${sheet}!${a.slice(bang + 1)}`.toUpperCase();
}

/**
 * Records that `cell` asked `fn` for the map under `handle`, with the warnings
 * of the cell's own call (none until it has applied the map). The newest record
 * wins, so a recalculated cell shows only what its latest values found; at most
 * 10,000 cells are kept. O(#warnings).
 * @example noteCellMap('Sheet1!B2', 'REMAP.APPLY', 'remap:quantile:10x1:0f3a2c1b9d4e77', [warning]); cellMap('sheet1!$B$2')?.calls.length // 1
 */
export function noteCellMap(cell: string, fn: string, handle: string, calls: readonly Warning[] = []): void {
  const key = cellKey(cell);
  byCell.delete(key);
  byCell.set(key, { fn, handle, calls: Object.freeze([...calls]) });
  if (byCell.size > MAX_CELLS) byCell.delete(byCell.keys().next().value as string);
}

/** The map `cell` last asked for in this session, if any. O(1). */
export function cellMap(cell: string): CellMap | undefined {
  return byCell.get(cellKey(cell));
}
