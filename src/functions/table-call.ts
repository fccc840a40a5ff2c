import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import { extrapolationWarning } from '../engine/outside';
import type { TransportMap } from '../engine/map';
import { fitFromTables, type Distribution1d } from '../engine/tables/fit-from-tables';
import { frequencyTable } from '../engine/tables/frequency-table';
import { quantileTable } from '../engine/tables/quantile-table';
import { asRows, cellKind, readSample, readSettings, readText, readValues, writeValues, type CellIn, type Grid } from '../input';
import { makeHandle, noteCellMap, recallOrFit, type MaybePromise } from '../fits';
import { checkPayload, type CallSite } from './calls';

/**
 * REMAP.TOTABLE: values mapped between a sample and a distribution given as a
 * published table, in the shape of `values`. `table_side` "target" (default):
 * the sample is the source and values are mapped onto the table's
 * distribution; "source": the table is the source and values (on the table's
 * scale) are mapped onto the sample's distribution.
 * - table_kind "quantiles" (default): two columns (probability as a share 0..1,
 *   value), probabilities rising; the table's quantile function is read as a
 *   straight line between its points (linear in probability), so values at the
 *   source's share p land exactly on the table's value at p. Beyond the first
 *   and last probability `beyond` "hold" (default) keeps the end value, "extend"
 *   continues the end steps in a straight line. Method quantile only.
 * - table_kind "frequencies": two columns (value, count or share): exactly the
 *   values written out row by row, weighted by their counts; any 1-D method.
 * A header row of text is skipped. The engine's fitFromTables warns of a coarse
 * table and of values beyond its probabilities; the map is kept by a handle
 * made from every input's exact bits (as REMAP.FIT's), so recalculating with
 * unchanged inputs does not fit again, and the calling cell is recorded with
 * that handle and the warning about its own values outside the fitted range,
 * so the pane's formula list shows the map's warnings beside the cell.
 * Cost: O((n + K) log(n + K)) for a new fit; O(values) when the handle is known.
 * @throws RemapError for bad input, naming the argument and the row.
 */
export function toTable(
  vals: CellIn,
  source: CellIn,
  table: CellIn,
  tableKind?: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  beyond?: CellIn,
  tableSide?: CellIn,
  site: CallSite = {},
): MaybePromise<Grid> {
  const fn = 'REMAP.TOTABLE';
  const side = readText(tableSide, 'table_side', fn, 'target').toLowerCase();
  if (side !== 'target' && side !== 'source') {
    throw new RemapError(
      `${fn}: table_side is "${side}"; give "target" (default: the sample is mapped onto the table) or "source" (the table is mapped onto the sample).`,
    );
  }
  const kind = readText(tableKind, 'table_kind', fn, 'quantiles').toLowerCase();
  if (kind !== 'quantiles' && kind !== 'frequencies') {
    throw new RemapError(`${fn}: table_kind is "${kind}"; give "quantiles" (probability, value) or "frequencies" (value, count or share).`);
  }
  const how = readText(beyond, 'beyond', fn, 'hold').toLowerCase();
  if (how !== 'hold' && how !== 'extend') throw new RemapError(`${fn}: beyond is "${how}"; give "hold" (keep the table's end values) or "extend".`);
  const name = readText(method, 'method', fn, 'quantile').toLowerCase();
  const s = readSample(source, { name: 'sample', fn, weights: sourceWeights, weightsName: 'sample_weights' });
  if (s.sample.d !== 1) throw new RemapError(`${fn}: the sample has ${s.sample.d} columns; a table maps one column: select one.`);
  const [a, b] = readTableColumns(table, fn);
  const raw = readSettings(settings, fn);
  const published: Distribution1d =
    kind === 'quantiles'
      ? { kind: 'quantiles', table: quantileTable(a, b, `${fn} table`) }
      : { kind: 'frequencies', table: frequencyTable(a, b, `${fn} table`) };
  const sample: Distribution1d = { kind: 'sample', sample: s.sample };
  const [from, to] = side === 'target' ? [sample, published] : [published, sample];
  const { points, layout } = readValues(vals, 1, fn);
  const f = new Fingerprint().text('totable').text(name).text(kind).text(side).text(how);
  f.numbers(s.sample.data).numbers(s.sample.weights).numbers(a).numbers(b);
  for (const k of Object.keys(raw).sort()) f.text(k.toLowerCase()).text(String(raw[k]));
  const handle = makeHandle(`table-${name}`, s.sample.n, 1, f.hex());
  const fitted = recallOrFit(handle, () => fitFromTables(name, from, to, raw, how), site.cell ? { cell: site.cell } : undefined);
  const finish = (map: TransportMap): Grid => {
    const mapped = map.apply(points);
    if (site.cell) {
      const w = extrapolationWarning(map, mapped, 'apply');
      noteCellMap(site.cell, fn, handle, w ? [w] : []);
    }
    return checkPayload(writeValues(mapped, layout), fn);
  };
  return fitted instanceof Promise ? fitted.then(finish) : finish(fitted);
}

/** The two columns of a table, skipping a header row of text and blank rows at the end; any other non-number is an error naming its row. */
function readTableColumns(table: CellIn, fn: string): [number[], number[]] {
  let rows = asRows(table);
  if (rows.length > 0 && rows[0].length !== 2) throw new RemapError(`${fn}: the table must have two columns; it has ${rows[0].length}.`);
  let first = 0;
  if (rows.length > 0 && rows[0].every((v) => cellKind(v) === 'text')) first = 1;
  let end = rows.length;
  while (end > first && rows[end - 1].every((v) => cellKind(v) === 'blank')) end--;
  rows = rows.slice(0, end);
  const a: number[] = [];
  const b: number[] = [];
  for (let i = first; i < rows.length; i++) {
    for (const v of rows[i]) {
      if (cellKind(v) !== 'number')
        throw new RemapError(`${fn}: row ${i + 1} of the table holds ${cellKind(v) === 'blank' ? 'a blank' : `"${String(v)}"`}; every row needs two numbers.`);
    }
    a.push(rows[i][0] as number);
    b.push(rows[i][1] as number);
  }
  if (a.length < 2) throw new RemapError(`${fn}: the table has ${a.length} row${a.length === 1 ? '' : 's'} of numbers; give at least 2.`);
  return [a, b];
}
