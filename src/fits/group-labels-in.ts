import { RemapError } from '../engine/errors';
import type { GroupLabel } from '../engine/groups/group-labels';
import { asRows, cellKind, type CellIn, type ReadSample } from '../input';

/**
 * Group labels read from cells, one per row of a sample already read: the
 * group range is as tall as the data range (a header row in both, or in the
 * data range only, is allowed), and the label of each kept data row is taken
 * from the same row. A label is text or a number; a blank, logical or error
 * label on a data row is an error naming the row, because guessing its group
 * would map it by the wrong map. O(rows).
 * @param cells the group range (one column; a single row is read sideways, as a sample is).
 * @param data the data range's cells (for its height) and what readSample made of it.
 * @param name the argument's name, e.g. "source_groups"; `fn` the function, for messages.
 * @throws RemapError for a range of another height or width, or a missing label.
 */
export function readGroupLabels(cells: CellIn, data: { cells: CellIn; read: ReadSample }, name: string, fn: string): GroupLabel[] {
  const groups = orient(asRows(cells));
  const height = orient(asRows(data.cells)).length;
  if (groups.some((r) => r.length !== 1)) throw new RemapError(`${fn}: ${name} must be a single column; select one group cell per data row.`);
  let shift = 0;
  if (groups.length === height - 1 && data.read.columns) shift = -1;
  else if (groups.length !== height) {
    throw new RemapError(`${fn}: ${name} has ${groups.length} rows but its data range has ${height}; select one group cell per data row, the same rows.`);
  }
  const out: GroupLabel[] = new Array(data.read.rows.length);
  for (let i = 0; i < data.read.rows.length; i++) {
    const row = data.read.rows[i] + shift;
    out[i] = labelAt(groups[row][0], `${name} in row ${row + 1}`, fn);
  }
  return out;
}

/** One label: text (trimmed, not blank) or a finite number. */
export function labelAt(v: CellIn, where: string, fn: string): GroupLabel {
  const kind = cellKind(v);
  if (kind === 'number') return v as number;
  if (kind === 'text' && String(v).trim() !== '') return String(v).trim();
  throw new RemapError(
    `${fn}: the ${where} is ${kind === 'blank' ? 'blank' : `not a group label (${String(v)})`}; give every data row a group (text or a number).`,
  );
}

function orient(rows: CellIn[][]): CellIn[][] {
  if (rows.length === 1 && rows[0].length > 1) return rows[0].map((v) => [v]);
  return rows;
}
