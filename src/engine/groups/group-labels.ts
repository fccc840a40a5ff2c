import { RemapError } from '../errors';

/** A group label as a cell or CSV field gives it: text or a number. */
export type GroupLabel = string | number;

/**
 * The key a label is known by: text trimmed, a number written in JavaScript's
 * shortest form, so the number 3 and the text "3" name one group (a column
 * read from a sheet may hold either). Blank text is refused by `groupRows`.
 * @example groupKey(' North ') // 'North'; groupKey(3) // '3'
 */
export function groupKey(label: GroupLabel): string {
  return typeof label === 'number' ? String(label) : String(label).trim();
}

/** Rows of one sample split by group, in order of first appearance. */
export interface GroupRows {
  /** Group keys in order of first appearance. */
  readonly keys: readonly string[];
  /** Row indices (ascending) of each group, by key. */
  readonly rows: ReadonlyMap<string, Int32Array>;
}

/**
 * Splits rows 0..n-1 by their group labels. Cost: O(n) (one hash lookup per row).
 * @param labels one label per row.
 * @param n the number of rows the labels must cover.
 * @param what words for messages, e.g. "source groups".
 * @param fn the calling function, for messages.
 * @throws RemapError if the count differs from n, or a label is blank, not finite or neither text nor a number.
 * @example groupRows(['a', 'b', 'a'], 3, 'source groups', 'fit by group').rows.get('a') // Int32Array [0, 2]
 */
export function groupRows(labels: ArrayLike<GroupLabel>, n: number, what: string, fn: string): GroupRows {
  if (labels.length !== n) throw new RemapError(`${fn}: ${labels.length} ${what} were given for ${n} rows; give one group label per row.`);
  const lists = new Map<string, number[]>();
  for (let i = 0; i < n; i++) {
    const v = labels[i];
    if (typeof v !== 'string' && typeof v !== 'number') throw new RemapError(`${fn}: the ${what} in row ${i + 1} is ${String(v)}; give text or a number.`);
    if (typeof v === 'number' && !Number.isFinite(v)) throw new RemapError(`${fn}: the ${what} in row ${i + 1} is ${v}; give a finite number or text.`);
    const k = groupKey(v);
    if (k === '') throw new RemapError(`${fn}: the ${what} in row ${i + 1} is blank; give every row a group, or drop the row.`);
    let list = lists.get(k);
    if (!list) lists.set(k, (list = []));
    list.push(i);
  }
  const rows = new Map<string, Int32Array>();
  for (const [k, list] of lists) rows.set(k, Int32Array.from(list));
  return { keys: [...lists.keys()], rows };
}
