import { RemapError } from '../engine/errors';
import type { Points, Sample } from '../engine/points';
import { parseSettingsText } from '../engine/settings';
import { CellError, cellKind, type CellIn, type CellOut, type Grid } from './cells';

/**
 * The one place where cells become numbers. Every worksheet function and the
 * command line read their ranges through here, so the rules below hold
 * everywhere (README, "Input rules"):
 *
 * - A range is a list of rows. A range of one row and several columns, given as
 *   a source, target or weights, is read as one column laid out sideways.
 * - A first row made only of text, above rows holding numbers, is a header: it
 *   names the columns and is not data.
 * - Blank cells, text, logical values and error values are skipped: one at a
 *   time in a single column; in several columns they drop their whole row. Each
 *   skipped entry is counted and reported in diagnostics. Blank rows at the very
 *   end of a range (a whole-column reference) are ignored without counting.
 * - A non-finite number (NaN, +-Infinity, only possible from files and scripts)
 *   is an error, never skipped: it usually means a broken upstream calculation.
 * - Weights: one per data row, in a range of the same height. A blank or
 *   non-numeric weight drops its row (counted); a negative or non-finite weight
 *   is an error; all-zero weights are an error (the engine checks totals).
 */

/** A sample read from cells, with what was skipped. */
export interface ReadSample {
  readonly sample: Sample;
  /** Skipped entries: cells (one column) or rows (several columns). */
  readonly dropped: number;
  /** Column names from a header row, or null. */
  readonly columns: string[] | null;
  /** For each sample row, its row in the range (0-based, counting a header row). */
  readonly rows: Int32Array;
}

export interface ReadSampleOptions {
  /** "source", "target": used in messages. */
  readonly name: string;
  /** The function's name for messages, e.g. "REMAP.VALUES". */
  readonly fn: string;
  /** A weights range (one column, same height), or null/undefined for none. */
  readonly weights?: CellIn;
  readonly weightsName?: string;
}

/** Turns whatever a function received into a list of rows (a scalar becomes [[v]]). */
export function asRows(cells: CellIn): CellIn[][] {
  if (Array.isArray(cells)) {
    if (cells.length === 0) return [];
    if (Array.isArray(cells[0])) return cells as CellIn[][];
    return (cells as CellIn[]).map((v) => [v]);
  }
  return [[cells]];
}

function isHeaderRow(rows: CellIn[][]): boolean {
  if (rows.length < 2) return false;
  const first = rows[0];
  if (!first.every((v) => cellKind(v) === 'text')) return false;
  // a header sits above data: some later row must hold a number
  for (let i = 1; i < rows.length; i++) if (rows[i].some((v) => cellKind(v) === 'number')) return true;
  return false;
}

/** Index one past the last row that holds anything but blanks. */
function lastUsedRow(rows: CellIn[][]): number {
  let end = rows.length;
  while (end > 0 && rows[end - 1].every((v) => cellKind(v) === 'blank')) end--;
  return end;
}

/** Orients a data range: a single row with several columns is one column sideways. */
function orient(rows: CellIn[][]): CellIn[][] {
  if (rows.length === 1 && rows[0].length > 1) return rows[0].map((v) => [v]);
  return rows;
}

function describeCell(v: CellIn): string {
  if (cellKind(v) === 'blank') return 'a blank';
  if (typeof v === 'number') return String(v);
  if (typeof v === 'string') return `"${v.length > 30 ? v.slice(0, 30) + '...' : v}"`;
  return String(v);
}

/**
 * Reads a source or target range (and its weights) into a Sample.
 * Cost: O(rows x columns).
 * @throws RemapError for a ragged range, a non-finite number, a bad weight or a
 * weights range of the wrong height.
 * @example readSample([[1], ['x'], [3]], { name: 'source', fn: 'REMAP.VALUES' })
 *   // { sample: { n: 2, d: 1, data: [1, 3], weights: null }, dropped: 1, columns: null }
 */
export function readSample(cells: CellIn, opts: ReadSampleOptions): ReadSample {
  const { name, fn } = opts;
  let rows = orient(asRows(cells));
  let columns: string[] | null = null;
  let weightRows: CellIn[][] | null = null;
  if (opts.weights !== undefined && opts.weights !== null && !isOmitted(opts.weights)) {
    weightRows = orient(asRows(opts.weights));
  }
  if (rows.length === 0) throw new RemapError(`${fn}: the ${name} range is empty; select the cells holding the ${name} data.`);
  const d = rows[0].length;
  for (let i = 1; i < rows.length; i++) {
    if (rows[i].length !== d)
      throw new RemapError(`${fn}: the ${name} range is ragged (row ${i + 1} has ${rows[i].length} cells, row 1 has ${d}); select a rectangular range.`);
  }
  let offset = 0;
  if (isHeaderRow(rows)) {
    columns = rows[0].map((v) => String(v).trim());
    rows = rows.slice(1);
    offset = 1;
    if (weightRows && weightRows.length === rows.length + 1) {
      weightRows = weightRows.slice(1);
    }
  }
  if (weightRows) {
    if (weightRows.some((r) => r.length !== 1)) {
      throw new RemapError(`${fn}: the ${opts.weightsName ?? name + ' weights'} must be a single column; select one cell per ${name} row.`);
    }
    if (weightRows.length !== rows.length) {
      throw new RemapError(
        `${fn}: the ${opts.weightsName ?? name + ' weights'} range has ${weightRows.length} rows but the ${name} has ${rows.length}; select one ` +
          `weight per ${name} row.`,
      );
    }
  }
  const end = Math.max(lastUsedRow(rows), weightRows ? lastUsedRow(weightRows) : 0);
  const data: number[] = [];
  const weights: number[] = [];
  const kept: number[] = [];
  let dropped = 0;
  for (let i = 0; i < end; i++) {
    const row = rows[i];
    const sheetRow = i + 1 + offset;
    let w = 1;
    let rowOk = true;
    if (weightRows) {
      const wv = weightRows[i][0];
      const k = cellKind(wv);
      if (k === 'number') {
        w = wv as number;
        if (w < 0)
          throw new RemapError(
            `${fn}: the ${opts.weightsName ?? name + ' weights'} in row ${sheetRow} is negative (${w}); weights must be zero or positive: replace it.`,
          );
      } else if (k === 'non-finite') {
        throw new RemapError(
          `${fn}: the ${opts.weightsName ?? name + ' weights'} in row ${sheetRow} is not a finite number (${describeCell(wv)}); replace it with a number.`,
        );
      } else {
        rowOk = false;
      }
    }
    if (d === 1) {
      const v = row[0];
      const k = cellKind(v);
      if (k === 'non-finite')
        throw new RemapError(`${fn}: the ${name} has a non-finite number (${describeCell(v)}) in row ${sheetRow}; remove it or replace it with a number.`);
      if (k !== 'number' || !rowOk) {
        dropped++;
        continue;
      }
      data.push(v as number);
      weights.push(w);
      kept.push(i + offset);
      continue;
    }
    let allNumbers = rowOk;
    for (let k = 0; k < d; k++) {
      const v = row[k];
      const kind = cellKind(v);
      if (kind === 'non-finite')
        throw new RemapError(
          `${fn}: the ${name} has a non-finite number (${describeCell(v)}) in row ${sheetRow}, column ${k + 1}; remove it or replace it with a number.`,
        );
      if (kind !== 'number') allNumbers = false;
    }
    if (!allNumbers) {
      dropped++;
      continue;
    }
    for (let k = 0; k < d; k++) data.push(row[k] as number);
    weights.push(w);
    kept.push(i + offset);
  }
  const n = weights.length;
  const sample: Sample = {
    n,
    d,
    data: Float64Array.from(data),
    weights: weightRows ? Float64Array.from(weights) : null,
  };
  return { sample, dropped, columns, rows: Int32Array.from(kept) };
}

/** Where each point to map came from, so results go back in the same shape. */
export interface ValuesLayout {
  readonly rows: number;
  readonly cols: number;
  readonly d: number;
  /** For each output row-block: the index of its point, or -1 with the reason. */
  readonly slots: Int32Array;
  readonly reasons: (CellOut | null)[];
}

/**
 * Reads the values to map. For a one-column map every cell is a value and the
 * result keeps the range's shape. For a d-column map the range must have d
 * columns and each row is one point. A blank cell (or blank row) gives a blank
 * result; text, logical and error cells give #VALUE! in their place; the rest
 * is mapped. Non-finite numbers give #NUM! in their place.
 * Cost: O(cells).
 * @throws RemapError when the column count does not fit the map.
 */
export function readValues(cells: CellIn, d: number, fn: string): { points: Points; layout: ValuesLayout } {
  const rows = asRows(cells);
  const nr = rows.length;
  const nc = nr > 0 ? rows[0].length : 0;
  for (let i = 1; i < nr; i++) {
    if (rows[i].length !== nc) throw new RemapError(`${fn}: the values range is ragged; select a rectangular range.`);
  }
  if (d === 1) {
    const slots = new Int32Array(nr * nc);
    const reasons: (CellOut | null)[] = new Array(nr * nc).fill(null);
    const data: number[] = [];
    for (let i = 0; i < nr; i++) {
      for (let j = 0; j < nc; j++) {
        const idx = i * nc + j;
        const r = pointReason(rows[i][j]);
        if (r === null) {
          slots[idx] = data.length;
          data.push(rows[i][j] as number);
        } else {
          slots[idx] = -1;
          reasons[idx] = r;
        }
      }
    }
    return { points: { n: data.length, d: 1, data: Float64Array.from(data) }, layout: { rows: nr, cols: nc, d, slots, reasons } };
  }
  if (nc !== d) {
    throw new RemapError(`${fn}: the values have ${nc} column${nc === 1 ? '' : 's'} but the map takes ${d}; select ${d} columns, one row per point.`);
  }
  const slots = new Int32Array(nr);
  const reasons: (CellOut | null)[] = new Array(nr).fill(null);
  const data: number[] = [];
  let count = 0;
  for (let i = 0; i < nr; i++) {
    const reason = rowReason(rows[i], d, i + 1, fn);
    if (reason === null) {
      slots[i] = count++;
      for (let k = 0; k < d; k++) data.push(rows[i][k] as number);
    } else {
      slots[i] = -1;
      reasons[i] = reason;
    }
  }
  return { points: { n: count, d, data: Float64Array.from(data) }, layout: { rows: nr, cols: nc, d, slots, reasons } };
}

/** Why row `row` of a d-column values range cannot be mapped, or null if it can. */
function rowReason(cells: CellIn[], d: number, row: number, fn: string): CellOut | null {
  let blanks = 0;
  let firstBad: CellOut | null = null;
  for (let k = 0; k < d; k++) {
    const r = pointReason(cells[k]);
    if (r === '') blanks++;
    else if (r !== null && firstBad === null) firstBad = r;
  }
  if (blanks === d) return '';
  if (firstBad !== null) return firstBad;
  if (blanks > 0) return new CellError('value', `${fn}: row ${row} of the values has a blank cell; fill it or clear the whole row.`);
  return null;
}

function pointReason(v: CellIn): CellOut | null {
  switch (cellKind(v)) {
    case 'number':
      return null;
    case 'blank':
      return '';
    case 'non-finite':
      return new CellError('num', `Not a finite number: ${describeCell(v)}; replace it with a number or clear the cell.`);
    default:
      return new CellError('value', `Not a number: ${describeCell(v)}; only numbers can be mapped: replace it with a number or clear the cell.`);
  }
}

/**
 * Puts mapped points back in the shape `readValues` read them from. A mapped
 * value that is not finite (a map whose result overflows, e.g. tails=linear
 * far outside the fitted range) becomes a #NUM! error in its place, never a
 * number a spreadsheet would show as something else. O(cells).
 */
export function writeValues(mapped: Points, layout: ValuesLayout): Grid {
  const out: Grid = [];
  if (layout.d === 1) {
    for (let i = 0; i < layout.rows; i++) {
      const row: CellOut[] = new Array(layout.cols);
      for (let j = 0; j < layout.cols; j++) {
        const s = layout.slots[i * layout.cols + j];
        row[j] = s >= 0 ? finiteOrError(mapped.data[s]) : (layout.reasons[i * layout.cols + j] as CellOut);
      }
      out.push(row);
    }
    return out;
  }
  const d = layout.d;
  for (let i = 0; i < layout.rows; i++) {
    const s = layout.slots[i];
    if (s >= 0) {
      const row: CellOut[] = Array.from(mapped.data.subarray(s * d, (s + 1) * d));
      if (!row.every((v) => Number.isFinite(v))) row.fill(notFinite(row.find((v) => !Number.isFinite(v)) as number));
      out.push(row);
    } else out.push(new Array(d).fill(layout.reasons[i]));
  }
  return out;
}

function finiteOrError(v: number): CellOut {
  return Number.isFinite(v) ? v : notFinite(v);
}

function notFinite(v: number): CellError {
  return new CellError(
    'num',
    `The mapped value is not a finite number (${v}): it overflows. Rescale the data, or use tails=clamp for values far outside the fitted range.`,
  );
}

/**
 * Reads a block that must be all numbers (a mean vector, a covariance matrix).
 * No skipping here: any other cell is an error naming its position.
 * @throws RemapError for blank, text, logical, error or non-finite cells.
 */
export function readNumbers(cells: CellIn, name: string, fn: string): { rows: number; cols: number; data: Float64Array } {
  const rows = asRows(cells);
  const nr = rows.length;
  const nc = nr > 0 ? rows[0].length : 0;
  if (nr === 0 || nc === 0) throw new RemapError(`${fn}: ${name} is empty; give it numbers.`);
  const data = new Float64Array(nr * nc);
  for (let i = 0; i < nr; i++) {
    if (rows[i].length !== nc) throw new RemapError(`${fn}: ${name} is ragged; select a rectangular range.`);
    for (let j = 0; j < nc; j++) {
      const v = rows[i][j];
      if (cellKind(v) !== 'number') {
        throw new RemapError(`${fn}: ${name} has ${describeCell(v)} in row ${i + 1}, column ${j + 1}; every cell of ${name} must be a finite number.`);
      }
      data[i * nc + j] = v as number;
    }
  }
  return { rows: nr, cols: nc, data };
}

/** True when an optional argument was left out (undefined, null, or a blank cell). */
export function isOmitted(v: CellIn): boolean {
  if (v === undefined || v === null) return true;
  if (Array.isArray(v)) {
    const rows = asRows(v);
    return rows.every((r) => r.every((c) => c === null || c === undefined || c === ''));
  }
  return typeof v === 'string' && v.trim() === '';
}

/**
 * Reads an optional text argument (a method name, an output choice).
 * @throws RemapError when it is not text.
 */
export function readText(v: CellIn, name: string, fn: string, fallback: string): string {
  if (isOmitted(v)) return fallback;
  const cell = Array.isArray(v) ? asRows(v)[0][0] : v;
  if (typeof cell !== 'string') throw new RemapError(`${fn}: ${name} must be text, e.g. "${fallback || 'auto'}", not ${describeCell(cell)}.`);
  return cell.trim().toLowerCase();
}

/**
 * Reads settings given in a formula: either one text cell ("seed=7; smoothing=0.05")
 * or a range of two columns (name, value), one setting per row. Names are
 * checked later against the method's list.
 * @throws RemapError for a range of another shape or an unreadable piece.
 */
export function readSettings(v: CellIn, fn: string): Record<string, unknown> {
  if (isOmitted(v)) return Object.create(null);
  const rows = asRows(v);
  if (rows.length === 1 && rows[0].length === 1) {
    const cell = rows[0][0];
    if (typeof cell !== 'string') throw new RemapError(`${fn}: settings must be text like "seed=7; tails=linear" or a two-column range of names and values.`);
    return parseSettingsText(cell);
  }
  if (rows[0].length !== 2) {
    throw new RemapError(`${fn}: a settings range must have two columns (name, value); this one has ${rows[0].length}.`);
  }
  const out: Record<string, unknown> = Object.create(null);
  for (const [name, value] of rows) {
    if (cellKind(name) === 'blank' && cellKind(value) === 'blank') continue;
    if (typeof name !== 'string' || name.trim() === '') {
      throw new RemapError(`${fn}: each settings row needs a name in its first column; found ${describeCell(name)}.`);
    }
    out[name.trim()] = value;
  }
  return out;
}
