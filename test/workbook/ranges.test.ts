import type { ExcelRun } from '../../src/workbook/excel-run';
import { insertComparisonChart } from '../../src/workbook/comparison-chart';
import { readFormula, readValues, reenterFormula, selectedAddress, splitAddress, writeFormula } from '../../src/workbook/ranges';

const officeMock = require('../browser/office-mock.js');

describe('reading and writing cells through Office.js (mocked)', () => {
  test('splitAddress reads quoted sheet names', () => {
    expect(splitAddress("'Q1 ''data'''!B2:C9")).toEqual({ sheet: "Q1 'data'", cells: 'B2:C9' });
    expect(splitAddress('A1')).toEqual({ sheet: null, cells: 'A1' });
  });

  test('readValues gives numbers, text, "" for blanks and { code } for error cells, without rows below the used range', async () => {
    const wb = officeMock.createWorkbook();
    wb.setValues('Sheet1!A1', [['x'], [1], [{ error: '#N/A' }], [''], [4]]);
    const run = wb.run as ExcelRun;
    expect(await readValues(run, 'Sheet1!A:A')).toEqual([['x'], [1], [{ code: '#N/A' }], [''], [4]]);
    wb.select('Sheet1!A2:A5');
    expect(await selectedAddress(run)).toBe('Sheet1!A2:A5');
  });

  test('large ranges are read in blocks that each stay under the payload limit', async () => {
    const wb = officeMock.createWorkbook({ payloadLimit: 400_000 });
    const rows = Array.from({ length: 60_000 }, (_, i) => [i + 0.25, -i]);
    wb.setValues('Sheet1!A1', rows);
    const got = await readValues(wb.run as ExcelRun, 'Sheet1!A1:B60000', 10_000);
    expect(got).toEqual(rows);
  });

  test('writeFormula puts the formula in the top-left cell; reenterFormula writes it again', async () => {
    const wb = officeMock.createWorkbook();
    const run = wb.run as ExcelRun;
    expect(await writeFormula(run, 'Sheet1!F2:G4', '=SUM(A1:A2)')).toBe('Sheet1!F2');
    expect(await readFormula(run, 'Sheet1!F2')).toBe('=SUM(A1:A2)');
    expect(await reenterFormula(run, 'Sheet1!F2')).toBe('=SUM(A1:A2)');
    expect(await reenterFormula(run, 'Sheet1!Z9')).toBe('');
  });

  test('insertComparisonChart adds a sheet with the table and one XY chart, under a name not yet taken', async () => {
    const wb = officeMock.createWorkbook();
    const run = wb.run as ExcelRun;
    const table = {
      title: 't',
      header: ['share', 'a', 'b'],
      rows: [
        [0, 1, NaN],
        [1, 2, 3],
      ],
    };
    expect(await insertComparisonChart(run, table)).toBe('Remap chart');
    expect(await insertComparisonChart(run, table)).toBe('Remap chart 2');
    const sheet = wb.state.sheets.find((s: { name: string }) => s.name === 'Remap chart');
    expect(sheet.charts).toHaveLength(1);
    expect(sheet.charts[0]).toMatchObject({ type: 'XYScatterLinesNoMarkers', seriesBy: 'Columns', title: { text: 't' }, source: "'Remap chart'!A1:C3" });
    expect(await readValues(run, "'Remap chart'!A1:C3")).toEqual([
      ['share', 'a', 'b'],
      [0, 1, ''],
      [1, 2, 3],
    ]);
    await expect(insertComparisonChart(run, { title: 't', header: ['x'], rows: [[1]] })).rejects.toThrow(/at least two names/);
  });
});
