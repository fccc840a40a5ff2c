import { CellError } from '../../src/input/cells';
import { asRows, isOmitted, readNumbers, readSample, readSettings, readText, readValues, writeValues } from '../../src/input/coerce';

const fn = 'REMAP.TEST';
const deepFreeze = (rows: unknown[][]): unknown[][] => Object.freeze(rows.map((r) => Object.freeze(r))) as unknown[][];

describe('readSample: the input rules of the README', () => {
  test('one column skips blanks, text, logicals and error values one cell at a time and counts them', () => {
    // Source: the README's input rules (our own contract)
    const cells = deepFreeze([[1], [null], ['n/a'], [true], [new CellError('value', 'x')], [''], [4], [{ code: '#DIV/0!' }]]);
    const r = readSample(cells, { name: 'source', fn });
    expect(Array.from(r.sample.data)).toEqual([1, 4]);
    expect(r.dropped).toBe(6);
    expect(r.sample.weights).toBeNull();
  });

  test('several columns drop the whole row of any non-number and count rows', () => {
    const cells = deepFreeze([
      [1, 2],
      [3, null],
      ['x', 5],
      [6, 7],
    ]);
    const r = readSample(cells, { name: 'source', fn });
    expect(r.sample.d).toBe(2);
    expect(Array.from(r.sample.data)).toEqual([1, 2, 6, 7]);
    expect(r.dropped).toBe(2);
  });

  test('a first row of text above numbers is a header naming the columns, not a dropped row', () => {
    const r = readSample(
      [
        ['income', 'spend'],
        [1, 2],
        [3, 4],
      ],
      { name: 'target', fn },
    );
    expect(r.columns).toEqual(['income', 'spend']);
    expect(r.sample.n).toBe(2);
    expect(r.dropped).toBe(0);
  });

  test('a single row of several cells is one column laid out sideways', () => {
    const r = readSample([[5, 1, 3]], { name: 'source', fn });
    expect(r.sample.d).toBe(1);
    expect(Array.from(r.sample.data)).toEqual([5, 1, 3]);
  });

  test('blank rows at the end of a range (a whole-column reference) are ignored without counting', () => {
    const r = readSample([[1], [2], [null], [''], [null]], { name: 'source', fn });
    expect(r.sample.n).toBe(2);
    expect(r.dropped).toBe(0);
  });

  test('non-finite numbers are an error naming the row, never skipped', () => {
    expect(() => readSample([[1], [NaN]], { name: 'source', fn })).toThrow(/non-finite number \(NaN\) in row 2/);
    expect(() => readSample([[1, Infinity]], { name: 'target', fn })).toThrow(/non-finite/);
  });

  test('a ragged range is an error', () => {
    expect(() => readSample([[1, 2], [3]], { name: 'source', fn })).toThrow(/ragged/);
  });

  test('an empty range is an error that says what to select', () => {
    expect(() => readSample([], { name: 'source', fn })).toThrow(/source range is empty/);
  });

  test('weights: one per row; blank weight drops its row; negative and non-finite weights are errors', () => {
    const r = readSample([[1], [2], [3]], { name: 'source', fn, weights: [[2], [null], [0.5]] });
    expect(Array.from(r.sample.data)).toEqual([1, 3]);
    expect(Array.from(r.sample.weights!)).toEqual([2, 0.5]);
    expect(r.dropped).toBe(1);
    expect(() => readSample([[1], [2]], { name: 'source', fn, weights: [[1], [-1]] })).toThrow(/row 2 is negative \(-1\)/);
    expect(() => readSample([[1], [2]], { name: 'source', fn, weights: [[1], [Infinity]] })).toThrow(/not a finite number/);
    expect(() => readSample([[1], [2]], { name: 'source', fn, weights: [[1]] })).toThrow(/has 1 rows but the source has 2/);
  });

  test('weights beside a header row may include or leave out the header cell', () => {
    const a = readSample([['x'], [1], [2]], { name: 'source', fn, weights: [['w'], [1], [3]] });
    const b = readSample([['x'], [1], [2]], { name: 'source', fn, weights: [[1], [3]] });
    expect(Array.from(a.sample.weights!)).toEqual([1, 3]);
    expect(Array.from(b.sample.weights!)).toEqual([1, 3]);
  });

  test('a scalar is a one-cell range', () => {
    expect(asRows(7)).toEqual([[7]]);
    expect(asRows([1, 2])).toEqual([[1], [2]]);
  });
});

describe('readValues / writeValues keep the shape of the values', () => {
  test('one column: every cell is a value; blanks stay blank; text becomes #VALUE! in place', () => {
    const { points, layout } = readValues(
      [
        [1, null],
        ['x', 4],
      ],
      1,
      fn,
    );
    expect(Array.from(points.data)).toEqual([1, 4]);
    const out = writeValues({ n: 2, d: 1, data: Float64Array.from([10, 40]) }, layout);
    expect(out[0][0]).toBe(10);
    expect(out[0][1]).toBe('');
    expect(out[1][0]).toBeInstanceOf(CellError);
    expect((out[1][0] as CellError).kind).toBe('value');
    expect(out[1][1]).toBe(40);
  });

  test('several columns: one point per row; a blank row stays blank; a partly blank row is #VALUE!', () => {
    const { points, layout } = readValues(
      [
        [1, 2],
        [null, null],
        [3, null],
        [5, 6],
      ],
      2,
      fn,
    );
    expect(points.n).toBe(2);
    const out = writeValues({ n: 2, d: 2, data: Float64Array.from([10, 20, 50, 60]) }, layout);
    expect(out[0]).toEqual([10, 20]);
    expect(out[1]).toEqual(['', '']);
    expect(out[2][0]).toBeInstanceOf(CellError);
    expect(out[3]).toEqual([50, 60]);
  });

  test('a values range with the wrong number of columns for the map is an error', () => {
    expect(() => readValues([[1, 2, 3]], 2, fn)).toThrow(/values have 3 columns but the map takes 2/);
  });
});

describe('settings, text and numbers', () => {
  test('settings as one text cell or as a two-column range', () => {
    expect({ ...readSettings('seed=7; tails=linear', fn) }).toEqual({ seed: '7', tails: 'linear' });
    expect({
      ...readSettings(
        [
          ['seed', 7],
          ['eps', 0.1],
        ],
        fn,
      ),
    }).toEqual({ seed: 7, eps: 0.1 });
    expect({ ...readSettings(null, fn) }).toEqual({});
    expect(() => readSettings([[1, 2, 3]], fn)).toThrow(/two columns/);
    expect(() => readSettings('seed', fn)).toThrow(/name=value/);
  });

  test('readText lower-cases and falls back when omitted; non-text is an error', () => {
    expect(readText(' Linear ', 'method', fn, 'quantile')).toBe('linear');
    expect(readText(undefined, 'method', fn, 'quantile')).toBe('quantile');
    expect(() => readText(3, 'method', fn, 'quantile')).toThrow(/method must be text/);
  });

  test('readNumbers accepts only numbers and names the bad cell', () => {
    expect(
      Array.from(
        readNumbers(
          [
            [1, 2],
            [3, 4],
          ],
          'cov1',
          fn,
        ).data,
      ),
    ).toEqual([1, 2, 3, 4]);
    expect(() => readNumbers([[1, null]], 'cov1', fn)).toThrow(/row 1, column 2/);
  });

  test('isOmitted treats undefined, null, blank text and all-blank ranges as left out', () => {
    expect(isOmitted(undefined)).toBe(true);
    expect(isOmitted([[null]])).toBe(true);
    expect(isOmitted('')).toBe(true);
    expect(isOmitted([[0]])).toBe(false);
  });
});
