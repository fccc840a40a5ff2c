import * as calls from '../../src/functions/calls';
import { forgetAll } from '../../src/fits';
import { formatSummary, short, summariseFormulas } from '../../src/headless/fit-summary';

afterEach(() => forgetAll());

describe('summariseFormulas', () => {
  test("finds REMAP.FIT cells with their map's diagnostics, and formulas that gave errors", () => {
    // Source: src/functions/calls.ts fit(), called directly
    const handle = calls.fit([[1], [2], [3], [4]], [[10], [20], [30], [40]]) as string;
    const s = summariseFormulas([
      { cell: { sheet: 'S', row: 0, col: 0, address: 'A1', formula: 'REMAP.FIT(B1:B4, C1:C4)' }, block: [[handle]] },
      { cell: { sheet: 'S', row: 0, col: 1, address: 'B1', formula: 'REMAP.APPLY(A1, X1:X2)' }, block: [[1], [{ error: '#VALUE!', message: 'Not a number' }]] },
    ]);
    expect(s.fits).toHaveLength(1);
    expect(s.fits[0].diagnostics?.method).toBe('quantile');
    expect(s.errors).toEqual([{ cell: 'S!B1', error: '#VALUE!', message: 'Not a number' }]);
    const text = formatSummary(s).join('\n');
    expect(text).toContain('S!A1  quantile, 4 -> 4 rows x 1 column');
    expect(text).toContain('energy distance');
    expect(text).toContain('S!B1: #VALUE! Not a number');
  });
  test("prints each cost after its label: a linear map's figure is a lower bound, a one-column quantile figure exact", () => {
    const src = [
      [0, 1],
      [1, 0],
      [2, 3],
      [3, 1],
      [4, 4],
      [5, 2],
      [6, 7],
      [7, 5],
      [8, 6],
      [9, 9],
      [10, 8],
      [11, 12],
    ];
    const tgt = [
      [5, 2],
      [6, 1],
      [8, 4],
      [9, 7],
      [3, 3],
      [12, 10],
      [4, 8],
      [15, 11],
      [6, 5],
      [10, 14],
      [7, 13],
      [14, 12],
    ];
    const linear = calls.fit(src, tgt, 'linear') as string;
    const quantile = calls.fit([[1], [2], [3]], [[10], [20], [30]]) as string;
    const text = formatSummary(
      summariseFormulas([
        { cell: { sheet: 'S', row: 0, col: 0, address: 'A1', formula: 'REMAP.FIT(B1:C12, D1:E12, "linear")' }, block: [[linear]] },
        { cell: { sheet: 'S', row: 1, col: 0, address: 'A2', formula: 'REMAP.FIT(F1:F3, G1:G3)' }, block: [[quantile]] },
      ]),
    ).join('\n');
    // Source: design choice (Gelbrich 1990: the Gaussian figure bounds the samples' squared W2 from below, and the line says so)
    expect(text).toMatch(/^ {6}squared W2, lower bound \(.*Gelbrich\) \d/m);
    // Source: worked by hand: (1,2,3) -> (10,20,30): (81 + 324 + 729) / 3 = 378, exact in one column
    expect(text).toMatch(/^ {6}squared W2, exact 378$/m);
    expect(text).not.toMatch(/cost \(squared W2\)/);
  });

  test('short() writes 4 significant digits, thousands separators for large numbers, and - for missing ones', () => {
    // Source: worked examples
    expect(short(992.6620369886601)).toBe('992.7');
    expect(short(180987038.23)).toBe('180,987,038');
    expect(short(0.000007791)).toBe('0.00000779');
    expect(short(undefined)).toBe('-');
  });
});
