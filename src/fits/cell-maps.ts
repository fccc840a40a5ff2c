/**
 * Which map each formula cell used in this session, so a door that lists the
 * workbook's formulas (the pane) can show the warnings of a REMAP.VALUES or
 * REMAP.COST cell, whose result is not a handle. Filled by the fit service
 * whenever a fit is asked for with the cell's address.
 */

/** What a cell asked for: the function and the handle of its map. */
export interface CellMap {
  readonly fn: string;
  readonly handle: string;
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

/** Records that `cell` asked `fn` for the map under `handle` (the newest record wins; at most 10,000 cells are kept). O(1). */
export function noteCellMap(cell: string, fn: string, handle: string): void {
  const key = cellKey(cell);
  byCell.delete(key);
  byCell.set(key, { fn, handle });
  if (byCell.size > MAX_CELLS) byCell.delete(byCell.keys().next().value as string);
}

/** The map `cell` last asked for in this session, if any. O(1). */
export function cellMap(cell: string): CellMap | undefined {
  return byCell.get(cellKey(cell));
}
