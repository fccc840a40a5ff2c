import { csvCell, formatCSV, parseCSV } from '../../src/cli/csv';

describe('CSV (RFC 4180)', () => {
  test('parseCSV reads quoted fields with commas, doubled quotes and line breaks', () => {
    // Source: RFC 4180, section 2 (rules 5-7)
    expect(parseCSV('a,b\r\n1,"x,""y""\nz"\n')).toEqual([
      ['a', 'b'],
      ['1', 'x,"y"\nz'],
    ]);
  });

  test('parseCSV drops a byte-order mark and trailing empty lines', () => {
    expect(parseCSV('\ufeffa\n1\n\n\n')).toEqual([['a'], ['1']]);
  });

  test('parseCSV refuses ragged lines and unterminated quotes with the line number', () => {
    expect(() => parseCSV('a,b\n1\n', 'f.csv')).toThrow(/f.csv: line 2 has 1 fields but the header has 2/);
    expect(() => parseCSV('a\n"1\n', 'f.csv')).toThrow(/starting on line 2 never ends/);
  });

  test('csvCell: blank is null, decimals are numbers, NaN/Infinity spellings are non-finite, the rest is text', () => {
    expect(csvCell('')).toBeNull();
    expect(csvCell(' 2.5e3 ')).toBe(2500);
    expect(csvCell('-.5')).toBe(-0.5);
    expect(csvCell('0x10')).toBe('0x10');
    expect(Number.isNaN(csvCell('NaN') as number)).toBe(true);
    expect(csvCell('-inf')).toBe(-Infinity);
    expect(csvCell('TRUE')).toBe('TRUE');
  });

  test('formatCSV writes numbers in shortest round-trip form so they read back bit-identical', () => {
    const x = 0.1 + 0.2;
    const text = formatCSV([['v'], [x], [null], ['a,b']]);
    expect(text).toBe('v\n0.30000000000000004\n\n"a,b"\n');
    expect(csvCell(parseCSV(text)[1][0])).toBe(x);
  });
});
