import type { ReadSample } from '../input/coerce';
import { BLANK, NON_FINITE, NUMBER, TEXT, type NumericTable } from './numeric-csv';

/** Which columns a side reads, and its weights column. */
export interface SideColumns {
  /** --columns as given, or undefined for every column of numbers. */
  readonly columns: string | undefined;
  /** --source-weights / --target-weights as given, or undefined. */
  readonly weights: string | undefined;
}

/**
 * A source or target sample straight from a table read by `scanNumericCSV`,
 * by the input rules of src/input/coerce.ts (README, "Input rules"): the data
 * columns are those named, else every column holding numbers and no text; in
 * one column a blank or text cell is skipped, in several it drops its row; a
 * blank or text weight drops its row; each is counted. Trailing blank rows are
 * not counted. Cost: O(rows x columns).
 * @returns the sample as `readSample` would read it, or null for what the
 * general path must handle or word as an error: a missing column, a
 * non-finite number, a negative or non-finite weight, a first row of text
 * under the header (a second header), a single row (read sideways), no rows,
 * weights that are all blank.
 */
export function sampleFromTable(t: NumericTable, side: SideColumns): (ReadSample & { header: string[] }) | null {
  const wk = side.weights !== undefined ? t.header.indexOf(side.weights.trim()) : -1;
  if (side.weights !== undefined && wk < 0) return null;
  let cols: number[] = [];
  if (side.columns !== undefined) {
    const picked = side.columns
      .split(',')
      .map((c) => c.trim())
      .filter((c) => c !== '');
    if (picked.length === 0) return null;
    for (const c of picked) {
      const k = t.header.indexOf(c);
      if (k < 0) return null;
      cols.push(k);
    }
  } else {
    cols = [];
    for (let k = 0; k < t.header.length; k++) {
      if (k === wk) continue;
      const kinds = t.kinds[k];
      let numbers = 0;
      let text = 0;
      for (let i = 0; i < t.rows; i++) {
        const kind = kinds[i];
        if (kind === NUMBER || kind === NON_FINITE) numbers++;
        else if (kind === TEXT) text++;
      }
      if (numbers > 0 && text === 0) cols.push(k);
    }
    if (cols.length === 0) return null;
  }
  const rows = t.rows;
  const d = cols.length;
  if (rows < 2) return null;
  const kinds = cols.map((k) => t.kinds[k]);
  const values = cols.map((k) => t.values[k]);
  const wKinds = wk >= 0 ? t.kinds[wk] : null;
  const wValues = wk >= 0 ? t.values[wk] : null;
  if (wKinds) {
    let any = false;
    for (let i = 0; i < rows && !any; i++) any = wKinds[i] !== BLANK;
    if (!any) return null;
  }
  if (kinds.every((k) => k[0] === TEXT)) return null;
  // The last row holding anything but blanks, in the data or the weights.
  let end = rows;
  for (; end > 0; end--) {
    const i = end - 1;
    if (wKinds && wKinds[i] !== BLANK) break;
    let used = false;
    for (let j = 0; j < d && !used; j++) used = kinds[j][i] !== BLANK;
    if (used) break;
  }
  const data = new Float64Array(end * d);
  const weights = wKinds ? new Float64Array(end) : null;
  const kept = new Int32Array(end);
  let n = 0;
  let dropped = 0;
  for (let i = 0; i < end; i++) {
    let w = 1;
    let rowOk = true;
    if (wKinds) {
      const wkind = wKinds[i];
      if (wkind === NUMBER) {
        w = wValues![i];
        if (w < 0) return null;
      } else if (wkind === NON_FINITE) return null;
      else rowOk = false;
    }
    let all = rowOk;
    for (let j = 0; j < d; j++) {
      const kind = kinds[j][i];
      if (kind === NON_FINITE) return null;
      if (kind !== NUMBER) all = false;
    }
    if (!all) {
      dropped++;
      continue;
    }
    for (let j = 0; j < d; j++) data[n * d + j] = values[j][i];
    if (weights) weights[n] = w;
    kept[n] = i;
    n++;
  }
  return {
    sample: { n, d, data: data.slice(0, n * d), weights: weights ? weights.slice(0, n) : null },
    dropped,
    columns: cols.map((k) => t.header[k]),
    rows: kept.slice(0, n),
    header: t.header,
  };
}
