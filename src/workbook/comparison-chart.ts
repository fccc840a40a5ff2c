import type { ExcelRun } from './excel-run';

/** The data of a comparison chart: a first column of x values and one column per line. */
export interface ChartTable {
  readonly title: string;
  /** Column names: the x column first, then one per line. */
  readonly header: readonly string[];
  /** Rows of numbers (NaN is written as a blank cell). */
  readonly rows: readonly (readonly number[])[];
  /** Name for the new sheet (made unique: "Remap chart", "Remap chart 2", ...). */
  readonly sheetName?: string;
}

/**
 * Inserts a native Excel chart of `table` on a new worksheet: writes the
 * table at A1, then adds an XY scatter with straight lines, one series per
 * column after the first, and activates the sheet. Cost: one request of
 * O(rows x columns) cells.
 * @returns the new sheet's name.
 * @throws Error when the table has fewer than two columns or no rows.
 * @example await insertComparisonChart(run, { title: 'income quantiles', header: ['share', 'source', 'mapped', 'target'], rows }) // 'Remap chart'
 */
export async function insertComparisonChart(run: ExcelRun, table: ChartTable): Promise<string> {
  if (table.header.length < 2 || table.rows.length === 0 || table.rows.some((r) => r.length !== table.header.length)) {
    throw new Error('insertComparisonChart: give a header of at least two names and rows of the same length.');
  }
  return run(async (context) => {
    const sheets = context.workbook.worksheets;
    sheets.load('items/name');
    await context.sync();
    const taken = new Set(sheets.items.map((s) => s.name.toLowerCase()));
    const base = (table.sheetName ?? 'Remap chart').slice(0, 27);
    let name = base;
    for (let k = 2; taken.has(name.toLowerCase()) && k < 10000; k++) name = `${base} ${k}`;
    const sheet = sheets.add(name);
    const values = [table.header.slice(), ...table.rows.map((r) => r.map((v) => (Number.isFinite(v) ? v : '')))];
    const data = sheet.getRangeByIndexes(0, 0, values.length, table.header.length);
    data.values = values as (string | number)[][];
    const chart = sheet.charts.add('XYScatterLinesNoMarkers', data, 'Columns');
    chart.title.text = table.title;
    chart.setPosition(sheet.getRangeByIndexes(0, table.header.length + 1, 1, 1), sheet.getRangeByIndexes(19, table.header.length + 8, 1, 1));
    sheet.activate();
    await context.sync();
    return name;
  });
}
