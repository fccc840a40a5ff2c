import { Workbook } from 'exceljs';
import { a1, columnLetters, parseA1, readSheets, writeResults } from '../../src/headless/workbook-io';

describe('A1 addresses', () => {
  test('columnLetters and parseA1 follow spreadsheet column lettering', () => {
    // Source: spreadsheet convention (A..Z, AA..AZ, ...)
    expect(columnLetters(0)).toBe('A');
    expect(columnLetters(25)).toBe('Z');
    expect(columnLetters(26)).toBe('AA');
    expect(columnLetters(27)).toBe('AB');
    expect(a1(9, 2)).toBe('C10');
    expect(parseA1('$B$2:C10')).toEqual({ r0: 1, c0: 1, r1: 9, c1: 2 });
    expect(parseA1('AA3')).toEqual({ r0: 2, c0: 26, r1: 2, c1: 26 });
    expect(() => parseA1('not a ref')).toThrow(/Not an A1 reference/);
  });
});

describe('readSheets', () => {
  test('formulas become "=..." text, cells inside an array formula block are left empty, text starting with = stays text', () => {
    // Source: the function's contract
    const wb = new Workbook();
    const ws = wb.addWorksheet('S');
    ws.getCell('A1').value = 1;
    ws.getCell('A2').value = 'hello';
    ws.getCell('A3').value = '=not a formula';
    ws.getCell('B1').value = { formula: 'REMAP.VALUES(A1:A2, A1:A2, A1:A2)', shareType: 'array', ref: 'B1:B2' } as never;
    ws.getCell('B2').value = 99; // a stale cached value inside the block
    ws.getCell('C1').value = true;
    const s = readSheets(wb);
    expect(s.names).toEqual(['S']);
    expect(s.sheets.S[0]).toEqual([1, '=REMAP.VALUES(A1:A2, A1:A2, A1:A2)', true]);
    expect(s.sheets.S[1][1]).toBeNull();
    expect(s.sheets.S[2][0]).toBe("'=not a formula");
    expect(s.formulas).toEqual([{ sheet: 'S', row: 0, col: 1, address: 'B1', formula: 'REMAP.VALUES(A1:A2, A1:A2, A1:A2)' }]);
  });
});

describe('writeResults', () => {
  test('a spilled result becomes an array formula over its block; errors become error values with their message as a note', () => {
    // Source: Office Open XML (ECMA-376) array formulas: <f t="array" ref="...">
    const wb = new Workbook();
    wb.addWorksheet('S');
    const cell = { sheet: 'S', row: 0, col: 1, address: 'B1', formula: 'F()' };
    writeResults(wb, [
      { cell, block: [[1], [{ error: '#VALUE!', message: 'Not a number' }], [null]] },
      { cell: { ...cell, col: 3, address: 'D1' }, block: [['remap:x']] },
    ]);
    const ws = wb.getWorksheet('S')!;
    expect(ws.getCell('B1').value).toEqual({ formula: 'F()', result: 1, shareType: 'array', ref: 'B1:B3' });
    expect(ws.getCell('B2').value).toEqual({ error: '#VALUE!' });
    expect(String(ws.getCell('B2').note)).toContain('Not a number');
    expect(ws.getCell('D1').value).toEqual({ formula: 'F()', result: 'remap:x' });
  });
});
