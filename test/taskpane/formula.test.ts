import { applyFormula, excelString, fitFormula } from '../../src/taskpane/formula';

describe('formulas the pane writes', () => {
  test('fitFormula leaves out empty trailing arguments and keeps empty middle ones blank', () => {
    const base = { source: 'Sheet1!A1:A9', target: 'Sheet2!B1:B9', method: 'auto', settings: '', sourceWeights: '', targetWeights: '' };
    expect(fitFormula(base)).toBe('=REMAP.FIT(Sheet1!A1:A9,Sheet2!B1:B9,"auto")');
    expect(fitFormula({ ...base, targetWeights: 'Sheet2!C1:C9' })).toBe('=REMAP.FIT(Sheet1!A1:A9,Sheet2!B1:B9,"auto",,,Sheet2!C1:C9)');
    expect(fitFormula({ ...base, method: '', settings: 'seed=7' })).toBe('=REMAP.FIT(Sheet1!A1:A9,Sheet2!B1:B9,,"seed=7")');
    expect(() => fitFormula({ ...base, source: ' ' })).toThrow(/Choose a source range/);
  });

  test('text arguments are Excel string literals with quotes doubled', () => {
    // Source: Excel formula syntax (common practice): a double quote inside a string literal is written twice
    expect(excelString('a "b"')).toBe('"a ""b"""');
  });

  test('applyFormula writes APPLY or INVERT of the map cell over the values', () => {
    expect(applyFormula('Sheet1!F2', "'Wave 2'!A2:A100", 'apply')).toBe("=REMAP.APPLY(Sheet1!F2,'Wave 2'!A2:A100)");
    expect(applyFormula('F2', 'A2:A5', 'invert')).toBe('=REMAP.INVERT(F2,A2:A5)');
    expect(() => applyFormula('', 'A1', 'apply')).toThrow(/cell that holds the map/);
  });
});
