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
  test('short() writes 4 significant digits, thousands separators for large numbers, and - for missing ones', () => {
    // Source: worked examples
    expect(short(992.6620369886601)).toBe('992.7');
    expect(short(180987038.23)).toBe('180,987,038');
    expect(short(0.000007791)).toBe('0.00000779');
    expect(short(undefined)).toBe('-');
  });
});
