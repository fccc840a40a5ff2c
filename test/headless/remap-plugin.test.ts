import { DetailedCellError, HyperFormula } from 'hyperformula';
import * as calls from '../../src/functions/calls';
import { forgetAll } from '../../src/fits';
import { REPORT_ROWS, registerRemapPlugin } from '../../src/headless/remap-plugin';

registerRemapPlugin();
afterEach(() => forgetAll());

const SRC = Object.freeze([3, 1, 4, 1, 5, 9, 2, 6, 5, 3, 5, 8]);
const TGT = Object.freeze([10, 20, 30, 25, 15, 40, 35, 50, 45, 60]);

function build(extra: (string | number | null)[][]): HyperFormula {
  const rows: (string | number | null)[][] = [];
  for (let i = 0; i < 12; i++) rows.push([SRC[i], i < TGT.length ? TGT[i] : null]);
  extra.forEach((r, i) => (rows[i] = [...rows[i], ...r]));
  return HyperFormula.buildFromArray(rows, { licenseKey: 'gpl-v3', smartRounding: false });
}
const col = (xs: readonly number[]) => xs.map((x) => [x]);

describe('REMAP functions in HyperFormula', () => {
  test('REMAP.VALUES spills in the shape of its values range with the numbers calls.values gives', () => {
    // Source: src/functions/calls.ts values(), called directly with the same cells
    const hf = build([[null, '=REMAP.VALUES(A1:A12, A1:A12, B1:B10)']]);
    const direct = calls.values(col(SRC), col(SRC), col(TGT)) as number[][];
    for (let i = 0; i < 12; i++) expect(hf.getCellValue({ sheet: 0, row: i, col: 3 })).toBe(direct[i][0]);
    hf.destroy();
  });
  test('REMAP.FIT gives a handle that REMAP.APPLY, INVERT and REPORT use; REPORT fills a block of REPORT_ROWS x 2', () => {
    // Source: src/functions/calls.ts fit/apply/invert/report called directly
    const hf = build([[null, '=REMAP.FIT(A1:A12, B1:B10, "quantile")', '=REMAP.APPLY(D1, A1:A3)', '=REMAP.INVERT(D1, 30)', '=REMAP.REPORT(D1)']]);
    const handle = calls.fit(col(SRC), col(TGT), 'quantile') as string;
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 3 })).toBe(handle);
    const applied = calls.apply(handle, col(SRC.slice(0, 3))) as number[][];
    for (let i = 0; i < 3; i++) expect(hf.getCellValue({ sheet: 0, row: i, col: 4 })).toBe(applied[i][0]);
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 5 })).toBe((calls.invert(handle, 30) as number[][])[0][0]);
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 6 })).toBe('Method');
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 7 })).toBe('quantile');
    // the block is reserved: its last row is blank, not an error
    expect(hf.getCellValue({ sheet: 0, row: REPORT_ROWS - 1, col: 6 })).toBeNull();
    expect(hf.isCellPartOfArray({ sheet: 0, row: REPORT_ROWS - 1, col: 7 })).toBe(true);
    hf.destroy();
  });
  test('REMAP.COST and REMAP.GAUSSCOST return the numbers calls.* return', () => {
    // Source: Bures formula in 1-D: (m1 - m2)^2 + (s1 - s2)^2 = 0 + (1 - 2)^2 = 1
    const hf = build([[null, '=REMAP.COST(A1:A12, B1:B10)', '=REMAP.GAUSSCOST(0, 1, 0, 4)']]);
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 3 })).toBe(calls.cost(col(SRC), col(TGT)));
    expect(hf.getCellValue({ sheet: 0, row: 0, col: 4 })).toBeCloseTo(1, 12);
    hf.destroy();
  });
  test('errors arrive as spreadsheet errors of the same type, with the message saying what to fix', () => {
    // Source: src/functions/excel-errors.ts mapping (value -> #VALUE!, na -> #N/A)
    const hf = build([
      [
        null,
        '=REMAP.FIT(A1:A12, B1:B10, "nope")',
        '=REMAP.APPLY("remap:linear:5x1:0123", A1:A2)',
        '=REMAP.VALUES(A1:A2, A1:A12, B1:B10, "quantile", "colour=red")',
      ],
    ]);
    const unknown = hf.getCellValue({ sheet: 0, row: 0, col: 3 }) as DetailedCellError;
    expect(unknown).toBeInstanceOf(DetailedCellError);
    expect(unknown.value).toBe('#VALUE!');
    expect(unknown.message).toMatch(/Unknown method "nope"; choose one of .*linear/);
    const missing = hf.getCellValue({ sheet: 0, row: 0, col: 4 }) as DetailedCellError;
    expect(missing.value).toBe('#N/A');
    expect(missing.message).toMatch(/no map with handle/);
    const setting = hf.getCellValue({ sheet: 0, row: 0, col: 5 }) as DetailedCellError;
    expect(setting.value).toBe('#VALUE!');
    expect(setting.message).toMatch(/Unknown setting "colour"/);
    hf.destroy();
  });
  test('per-cell errors inside a spilled result keep their place: text in values gives #VALUE! there', () => {
    // Source: README "Input rules" (text in values gives #VALUE! in its place; a blank stays blank)
    const hf = HyperFormula.buildFromArray(
      [
        [1, 10, 1],
        [2, 20, 'x'],
        [3, 30, null],
        [4, 40, 3],
        ['', '', '=REMAP.VALUES(C1:C4, A1:A4, B1:B4)'],
      ],
      { licenseKey: 'gpl-v3' },
    );
    expect(hf.getCellValue({ sheet: 0, row: 4, col: 2 })).toBe(10);
    expect((hf.getCellValue({ sheet: 0, row: 5, col: 2 }) as DetailedCellError).value).toBe('#VALUE!');
    expect(hf.getCellValue({ sheet: 0, row: 6, col: 2 })).toBeNull();
    expect(hf.getCellValue({ sheet: 0, row: 7, col: 2 })).toBe(30);
    hf.destroy();
  });
  test('a fit that trains in the background shows #N/A saying so when no headless run waits for it', async () => {
    // Source: the plugin's contract (HyperFormula cannot wait; runWorkbook can)
    const hf = build([[null, '=REMAP.FIT(A1:A12, B1:B10, "gradient-net", "steps=0")']]);
    const v = hf.getCellValue({ sheet: 0, row: 0, col: 3 }) as DetailedCellError;
    expect(v.value).toBe('#N/A');
    expect(v.message).toMatch(/trains in the background/);
    hf.destroy();
    // let the background fit finish before the store is cleared
    await calls.fit(col(SRC), col(TGT), 'gradient-net', 'steps=0');
  });
});
