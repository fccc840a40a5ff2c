import fc from 'fast-check';
import { csvCell, formatCSV, parseCSV } from '../../src/cli/csv';
import { toStandardCSV, type Dialect } from '../../src/cli/dialect';
import { mapTable } from '../../src/cli/numeric-map-file';
import { BLANK, NON_FINITE, NUMBER, scanNumericBytes, scanNumericCSV, TEXT, type NumericTable } from '../../src/cli/numeric-csv';
import { sampleFromTable } from '../../src/cli/numeric-sample';
import { fitMap } from '../../src/engine';
import type { CellIn } from '../../src/input/cells';
import { readSample, readValues, writeValues } from '../../src/input/coerce';

/**
 * The typed-array reader against the general one (parseCSV + csvCell, then the
 * coercion module): the same files must give the same cells, bit for bit, the
 * same samples and skip counts, and the same output. The general reader's
 * numbers come from Number() (ECMAScript StringToNumber), the reference here.
 */

/** The general reader's cells for data rows, and its header. */
function general(text: string): { header: string[]; rows: (number | string | null)[][] } {
  const rows = parseCSV(text, 'f.csv');
  return { header: rows[0].map((h) => h.trim()), rows: rows.slice(1).map((r) => r.map(csvCell)) };
}

/** The typed-array reader's cells, in the general reader's terms. */
function cellsOf(t: NumericTable): (number | string | null)[][] {
  const out: (number | string | null)[][] = [];
  for (let i = 0; i < t.rows; i++) {
    out.push(
      t.header.map((_, k) => {
        const kind = t.kinds[k][i];
        if (kind === BLANK) return null;
        if (kind === TEXT) return t.texts[t.values[k][i]];
        expect([NUMBER, NON_FINITE]).toContain(kind);
        return t.values[k][i];
      }),
    );
  }
  return out;
}

/** Same cells, numbers compared with Object.is (so -0 differs from 0, NaN equals NaN). */
function expectSameCells(text: string): NumericTable {
  const t = scanNumericCSV(text, 'f.csv');
  expect(t).not.toBeNull();
  const g = general(text);
  expect(t!.header).toEqual(g.header);
  const got = cellsOf(t!);
  expect(got.length).toBe(g.rows.length);
  got.forEach((row, i) =>
    row.forEach((v, k) => {
      if (!Object.is(v, g.rows[i][k])) throw new Error(`row ${i + 1}, column ${k + 1}: ${String(v)} but the general reader has ${String(g.rows[i][k])}`);
    }),
  );
  return t!;
}

function bits(a: Float64Array | null): string | null {
  return a ? Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('hex') : null;
}

describe('typed-array CSV reader (reads what parseCSV + csvCell read)', () => {
  test('the edge cases of the trade: quotes, CRLF, lone CR, BOM, trailing blank lines, blanks, text, exponents, -0, long digit strings', () => {
    // Source: RFC 4180 section 2 (quoted fields, doubled quotes, CRLF); Number() for every value (ECMAScript StringToNumber).
    const files = [
      'x\n1\n2.5\n-3\n',
      'x\r\n1\r\n"2.5"\r\n" 7 "\r\n',
      'x\r1\r2\r',
      '\ufeffx\n1\n\n\n',
      'x\n1\n\n2\n \n\n',
      'x,y\n1,a\n,2\n3,\n"4,5",6\n',
      'x\n1e3\n-1.5E-7\n+.5\n5.\n.5e+2\n1e400\n-1e400\n1e-400\nNaN\n-inf\nInfinity\n',
      'x\n-0\n-0.0\n0e5\n-0e-5\n',
      'x\n123456789012345678901234567890\n0.1234567890123456789012345\n9007199254740993\n9007199254740992\n9007199254740991\n',
      'x\n0.000000000000000000001234\n1234567890123456e-30\n17976931348623157e292\n',
      'x\n0x10\n1_000\n"1,5"\n1e\n.\n-\n+\n1.2.3\n--1\n\u00a01\u00a0\n\u20001\n',
      'x,"y ""q"""\n"a""b",1\n"""",2\n"x"y,3\n"multi\nline",4\n',
      'a,b,c\n1,2,3\n,,\n4,5,6\n,,\n\n',
      'x\n""\n"1"\n',
      'x\n1\n2',
      'x\n1\n"2"',
      'x\n\u00e9t\u00e9\n3\n',
      ' x ,y\t\n\t1\t,\v2\f\n',
    ];
    for (const f of files) expectSameCells(f);
  });

  test('what the general reader refuses, the typed-array reader leaves to it (null)', () => {
    // design choice: errors are worded once, by the general reader
    expect(scanNumericCSV('a,b\n1\n', 'f.csv')).toBeNull(); // ragged
    expect(scanNumericCSV('a,b\n1,2,3\n', 'f.csv')).toBeNull();
    expect(scanNumericCSV('a,b\n\n1,2\n', 'f.csv')).toBeNull(); // an empty line in the middle of two columns is ragged
    expect(scanNumericCSV('a\n"1\n', 'f.csv')).toBeNull(); // a quote that never ends
    expect(scanNumericCSV('', 'f.csv')).toBeNull();
    expect(scanNumericCSV('\n\n', 'f.csv')).toBeNull();
    expect(scanNumericCSV('a,a\n1,2\n', 'f.csv')).toBeNull(); // a name twice
    expect(() => parseCSV('a,b\n\n1,2\n', 'f.csv')).toThrow(/line 2 has 1 fields/);
  });

  test('random text from the characters that matter reads the same both ways', () => {
    const alphabet = ['0', '1', '9', '.', 'e', 'E', '-', '+', ',', '\n', '\r', '"', ' ', 'a', 'NaN', 'inf', '\u00a0'];
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...alphabet), { maxLength: 60 }), (parts) => {
        const text = 'h\n' + parts.join('');
        const t = scanNumericCSV(text, 'f.csv');
        let rows: string[][] | null = null;
        try {
          rows = parseCSV(text, 'f.csv');
        } catch {
          rows = null;
        }
        if (t === null) {
          // only where the general reader fails, or there is nothing to read
          expect(rows === null || rows.length === 0).toBe(true);
          return;
        }
        expectSameCells(text);
      }),
      { seed: 7, numRuns: 3000 },
    );
  });

  test('numbers of 16 to 20 digits, and ties between two doubles, read as Number() reads them', () => {
    // Source: Number() (ECMAScript StringToNumber: the nearest double, ties to even) for every value.
    // 2^53 + 1 = 9007199254740993 lies halfway between 2^53 and 2^53 + 2 (IEEE 754 binary64: 53-bit significand).
    const ties = ['9007199254740993', '9007199254740995', '90071992547409930', '900719925474099300e-2', '9007199254740992.5', '4503599627370496.5'];
    const nearTies = ['9007199254740993.0000001', '9007199254740992.9999999', '1.7976931348623157e22', '12345678901234567890e-22', '98765432109876543210e22'];
    const digits = fc.stringMatching(/^[0-9]{16,20}$/);
    const strings = fc.tuple(digits, fc.integer({ min: 0, max: 20 }), fc.integer({ min: -30, max: 30 }), fc.boolean()).map(([d, point, exp, neg]) => {
      const at = Math.min(point, d.length);
      return `${neg ? '-' : ''}${d.slice(0, at)}${at < d.length ? '.' + d.slice(at) : ''}${exp !== 0 ? 'e' + exp : ''}`;
    });
    const random = fc.sample(strings, { seed: 17, numRuns: 20000 });
    const all = [...ties, ...nearTies, ...random];
    const t = scanNumericCSV('x\n' + all.join('\n') + '\n', 'f.csv')!;
    all.forEach((s, i) => {
      if (!Object.is(t.values[0][i], Number(s))) throw new Error(`${s}: read ${t.values[0][i]}, Number() gives ${Number(s)}`);
    });
  });

  test('random numbers written by String() read back bit-identical, as Number() reads them', () => {
    fc.assert(
      fc.property(fc.array(fc.double(), { minLength: 1, maxLength: 50 }), (xs) => {
        const text = 'x\n' + xs.map(String).join('\n') + '\n';
        const t = expectSameCells(text);
        // Source: ECMAScript Number::toString is the shortest round-trip form, so Number(String(x)) is x (String(-0) is "0").
        xs.forEach((x, i) => expect(Object.is(t.values[0][i], Object.is(x, -0) ? 0 : x) || (Number.isNaN(x) && Number.isNaN(t.values[0][i]))).toBe(true));
      }),
      { seed: 11, numRuns: 300 },
    );
  });
});

describe('the typed-array reader in other dialects (reads what toStandardCSV + the general reader read)', () => {
  /** Same cells as the rewrite to standard CSV read by the general reader, bit for bit; or both give up. */
  function expectSameAsRewrite(text: string, d: Dialect): void {
    let standard: string | null;
    try {
      standard = toStandardCSV(text, d, 'f.csv');
    } catch {
      standard = null;
    }
    const t = scanNumericBytes(Buffer.from(text, 'utf8'), 'f.csv', d);
    if (t === null) {
      let rows: string[][] | null = null;
      try {
        rows = standard === null ? null : parseCSV(standard, 'f.csv');
      } catch {
        rows = null;
      }
      expect(rows === null || rows.length === 0).toBe(true);
      return;
    }
    expect(standard).not.toBeNull();
    const g = general(standard!);
    expect(t.header).toEqual(g.header);
    const got = cellsOf(t);
    expect(got.length).toBe(g.rows.length);
    got.forEach((row, i) =>
      row.forEach((v, k) => {
        if (Object.is(v, g.rows[i][k])) return;
        throw new Error(`${JSON.stringify(text)}: row ${i + 1}, column ${k + 1}: ${String(v)} but the rewrite reads ${String(g.rows[i][k])}`);
      }),
    );
  }

  const semicolonComma: Dialect = { delimiter: ';', decimal: ',' };
  const tabComma: Dialect = { delimiter: '\t', decimal: ',' };
  const semicolonPoint: Dialect = { delimiter: ';', decimal: '.' };

  test('decimal commas, points, quoted numbers, text with commas, exponents, long digit strings, non-ASCII', () => {
    // Source: RFC 4180 section 2 for quotes; Number() for every value (ECMAScript StringToNumber); a decimal comma as European locales write it.
    const files = [
      'x;y\n1,5;2\n-0,25;3,\n,5;+1,5e3\n',
      'x;y\n1.5;"1,5"\n"2.5";a,b\n;\n',
      '\ufeff x ;"y;z"\r\n 1,5 ;7\r\n12345678901234567,89;0,123456789012345678\r\n',
      'x;y\n\u00a01,5\u00a0;\u00e9t\u00e9\n1,5.3;,\n1,2,3;"a""b"\n',
      'a;b\n1;2\n\n\n',
      '1,5;2,5\n1;2\n',
      'x\n"multi\nline"\n3,5\nNaN\n-inf\n1e400\n',
    ];
    for (const f of files) {
      expectSameAsRewrite(f, semicolonComma);
      expectSameAsRewrite(f, semicolonPoint);
      expectSameAsRewrite(f.replace(/;/g, '\t'), tabComma);
    }
  });

  test('random text from the characters that matter reads the same both ways', () => {
    const alphabet = ['0', '1', '9', '.', ',', ';', '\t', 'e', '-', '+', '\n', '\r', '"', ' ', 'a', 'NaN', '\u00a0', '\u00e9', '12345678901234567'];
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...alphabet), { maxLength: 60 }), fc.constantFrom(semicolonComma, tabComma, semicolonPoint), (parts, d) => {
        expectSameAsRewrite('h;k\n' + parts.join(''), d);
      }),
      { seed: 13, numRuns: 3000 },
    );
  });
});

describe('samples from the typed-array reader (the input rules of the coercion module)', () => {
  /** The general path: the named columns' cells through readSample. */
  function generalSample(text: string, cols: string[], weights?: string) {
    const g = general(text);
    const idx = cols.map((c) => g.header.indexOf(c));
    const wk = weights ? g.header.indexOf(weights) : -1;
    const cells: CellIn[][] = g.rows.map((r) => idx.map((k) => r[k]));
    return readSample(cells, { name: 'source', fn: 'remap fit', weights: wk >= 0 ? g.rows.map((r) => [r[wk]]) : null });
  }

  test.each([
    ['one column: blanks and text skipped one at a time, trailing blanks not counted', 'x\n1\n\nabc\n-0\n2e-3\n\n \n', ['x'], undefined],
    ['several columns: a blank or text drops the row', 'a,b,c\n1,2,3\n4,,6\n7,x,9\n-0,"1.5",1e2\n,,\n', ['a', 'b', 'c'], undefined],
    ['weights: a blank or text weight drops the row', 'x,w\n1,1\n2,\n3,x\n4,0.5\n,2\n', ['x'], 'w'],
    ['quoted, CRLF, BOM, header spaces', '\ufeff x ,y\r\n"1",2\r\n" 3 ",4\r\n\r\n', ['x', 'y'], undefined],
  ])('%s', (_, text, cols, weights) => {
    const t = scanNumericCSV(text, 'f.csv')!;
    const fast = sampleFromTable(t, { columns: cols.join(','), weights });
    const slow = generalSample(text, cols, weights);
    expect(fast).not.toBeNull();
    expect(fast!.dropped).toBe(slow.dropped);
    expect(fast!.sample.n).toBe(slow.sample.n);
    expect(fast!.sample.d).toBe(slow.sample.d);
    expect(bits(fast!.sample.data)).toBe(bits(slow.sample.data));
    expect(bits(fast!.sample.weights)).toBe(bits(slow.sample.weights));
    expect(Array.from(fast!.rows)).toEqual(Array.from(slow.rows));
  });

  test('every column of numbers and no text is data when no columns are named', () => {
    const t = scanNumericCSV('id,x,y\na,1,2\nb,3,\n', 'f.csv')!;
    const s = sampleFromTable(t, { columns: undefined, weights: undefined })!;
    expect(s.columns).toEqual(['x', 'y']);
    expect(s.dropped).toBe(1); // Source: README "Input rules": in several columns a blank drops its row
  });

  test('cases the general path words or reads specially give null', () => {
    const side = { columns: undefined, weights: undefined };
    expect(sampleFromTable(scanNumericCSV('x\n1\nNaN\n', 'f.csv')!, side)).toBeNull(); // non-finite: an error
    expect(sampleFromTable(scanNumericCSV('x\n1\n', 'f.csv')!, side)).toBeNull(); // one row
    expect(sampleFromTable(scanNumericCSV('x,y\nu,v\n1,2\n', 'f.csv')!, { columns: 'x,y', weights: undefined })).toBeNull(); // a second header
    expect(sampleFromTable(scanNumericCSV('x,w\n1,-1\n2,1\n', 'f.csv')!, { columns: undefined, weights: 'w' })).toBeNull(); // negative weight
    expect(sampleFromTable(scanNumericCSV('x\n1\n2\n', 'f.csv')!, { columns: 'nope', weights: undefined })).toBeNull();
  });
});

describe('apply through the typed-array reader writes what the general path writes', () => {
  /** The general path of `remap apply`: cells, readValues, the map, writeValues, formatCSV. */
  async function generalApply(text: string, map: Awaited<ReturnType<typeof fitMap>>, cols: string[]): Promise<string> {
    const g = general(text);
    const idx = cols.map((c) => g.header.indexOf(c));
    const { points, layout } = readValues(
      g.rows.map((r) => idx.map((k) => r[k])),
      map.d,
      'remap apply',
    );
    const grid = writeValues(map.apply(points), layout);
    const out: (string | number | null)[][] = [g.header];
    g.rows.forEach((r, i) => {
      const row = r.slice();
      idx.forEach((k, j) => (row[k] = grid[i][j] === '' ? null : (grid[i][j] as number)));
      out.push(row);
    });
    return formatCSV(out);
  }

  test('one column with blanks, and a file with a passed-through text and number column', async () => {
    const x = { n: 6, d: 1, data: Float64Array.from([0.1, 0.7, 1.3, 2, 3.3, 5]), weights: null };
    const y = { n: 6, d: 1, data: Float64Array.from([10, 11.5, 12, 13.25, 20, 21]), weights: null };
    const map = await fitMap('quantile', x, y, {}, { columns: ['x'] });
    for (const [text, cols] of [
      ['x\n0.2\n\n1.5e0\n-0\n"4.99"\n \n', ['x']],
      ['id,x,note\na,0.2,"b,c"\n ,1, 7.50 \nq,,NaN\nz,3,\n', ['x']],
    ] as const) {
      const fast = mapTable(scanNumericCSV(text, 'f.csv')!, map, 'apply');
      expect(fast).not.toBeNull();
      const pieces: Uint8Array[] = [];
      fast!.write((p) => pieces.push(p));
      expect(Buffer.concat(pieces).toString('utf8')).toBe(await generalApply(text, map, [...cols]));
    }
    map.dispose();
  });

  test('output of several pieces (over a megabyte) with non-ASCII text passed through is the same bytes', async () => {
    const x = { n: 5, d: 1, data: Float64Array.from([0.1, 0.7, 1.3, 2, 3.3]), weights: null };
    const y = { n: 5, d: 1, data: Float64Array.from([10, 11.5, 12, 13.25, 20]), weights: null };
    const map = await fitMap('quantile', x, y, {}, { columns: ['x'] });
    const lines = ['note,x'];
    for (let i = 0; i < 60000; i++) lines.push(`"\u00e9t\u00e9 ${i}, \u4e2d",${(i % 331) / 100}`);
    const text = lines.join('\n') + '\n';
    const fast = mapTable(scanNumericBytes(Buffer.from(text, 'utf8'), 'f.csv')!, map, 'apply');
    const pieces: Uint8Array[] = [];
    fast!.write((p) => pieces.push(p));
    expect(pieces.length).toBeGreaterThan(1);
    expect(Buffer.concat(pieces).toString('utf8')).toBe(await generalApply(text, map, ['x']));
    map.dispose();
  });

  test('text or non-finite values to map are left to the general path, which words the error', async () => {
    const x = { n: 3, d: 1, data: Float64Array.from([0, 1, 2]), weights: null };
    const map = await fitMap('quantile', x, x, {}, { columns: ['x'] });
    expect(mapTable(scanNumericCSV('x\n1\nabc\n', 'f.csv')!, map, 'apply')).toBeNull();
    expect(mapTable(scanNumericCSV('x\n1\ninf\n', 'f.csv')!, map, 'apply')).toBeNull();
    map.dispose();
  });
});
