/**
 * One test per defect the fuzzers found, each on the smallest input that showed it.
 * Source: the fuzz runs in this folder (inputs found there, shrunk by hand).
 */
import { RemapError } from '../../src/engine/errors';
import { fitMap } from '../../src/engine/methods';
import { column, sample } from '../../src/engine/points';
import { hazenGrid } from '../../src/engine/quantile/hazen-grid';
import { buildKnots } from '../../src/engine/quantile/knots';
import { weightedCdfSorted } from '../../src/engine/stats/weighted-cdf';
import { CellError } from '../../src/input/cells';
import { readValues, writeValues } from '../../src/input/coerce';
import * as F from '../../src/functions/functions';
import { forgetAll } from '../../src/fits';
import { installCustomFunctionsStub, StubSheetError } from '../helpers/custom-functions-stub';
import { runCli as cli } from '../helpers/run-cli';

installCustomFunctionsStub();
afterEach(() => forgetAll());

function sheetError(f: () => unknown): StubSheetError {
  try {
    f();
  } catch (e) {
    if (e instanceof StubSheetError) return e;
    throw e;
  }
  throw new Error('expected a sheet error');
}

describe('quantile/hazen-grid.ts and quantile/knots.ts: weights adding up beyond half the largest double', () => {
  test('hazenGrid keeps positions finite and in [0, 1] when 2 x total weight overflows (was NaN, and the fit then looped for ever)', () => {
    const cdf = weightedCdfSorted(Float64Array.of(1, 2, 3), Float64Array.of(1e308, 5e-324, 1));
    const p = hazenGrid(cdf).p;
    // Source: Hazen positions (C_{k-1} + C_k) / 2W with C = [1e308, 1e308, 1e308], W = 1e308: 0.5, 1, 1
    expect(Array.from(p)).toEqual([0.5, 1, 1]);
  });

  test('a quantile fit with such weights finishes with finite results (REMAP.VALUES)', () => {
    const col = (xs: number[]) => xs.map((x) => [x]);
    const out = F.values(col([1, 2, 3]), col([1, 2, 3]), col([1, 2, 3]), 'quantile', undefined, col([1e308, 5e-324, 1])) as unknown[][];
    for (const [v] of out) expect(Number.isFinite(v as number) || v instanceof StubSheetError).toBe(true);
  });

  test('buildKnots refuses a grid holding NaN instead of looping for ever', () => {
    const bad = { p: Float64Array.of(0, NaN, NaN), v: Float64Array.of(1, 2, 3) };
    const good = { p: Float64Array.of(1 / 6, 0.5, 5 / 6), v: Float64Array.of(1, 2, 3) };
    expect(() => buildKnots(bad, good, true)).toThrow(RemapError);
  });
});

describe('quantile/fit-columns.ts: a cost that overflows', () => {
  test('REMAP.COST on values near 1e300 is #NUM! saying to rescale (was Infinity, which SAVE wrote as null and LOAD then refused)', () => {
    const e = sheetError(() => F.cost([[1e300], [-1e300], [5e299]], [[1], [2], [3]]));
    expect(e.code).toBe('#NUM!');
    expect(e.message).toMatch(/rescale/);
  });

  test('values of size 1e150 still fit (their squares are finite)', async () => {
    const m = await fitMap('quantile', sample([1e150, -1e150, 3e149]), sample([1, 2, 3]));
    expect(Number.isFinite(m.cost().w2Squared)).toBe(true);
  });
});

describe('input/coerce.ts writeValues: a mapped value that is not finite', () => {
  test('tails=linear far outside the fitted range gives #NUM! in that cell (was Infinity in the cell)', () => {
    const col = (xs: number[]) => xs.map((x) => [x]);
    const out = F.values(col([1e300, 0]), col([0, 1e-300]), col([0, 1]), 'quantile', 'tails=linear') as unknown[][];
    expect(out[0][0]).toBeInstanceOf(StubSheetError);
    expect((out[0][0] as StubSheetError).code).toBe('#NUM!');
    expect((out[0][0] as StubSheetError).message).toMatch(/rescale/i);
    expect(out[1][0]).toBe(0);
  });

  test('a d-column row with a non-finite result becomes #NUM! across the row', () => {
    const { layout } = readValues([[1, 2]], 2, 'test');
    const grid = writeValues({ n: 1, d: 2, data: Float64Array.of(1, Infinity) }, layout);
    expect(grid[0].every((c) => c instanceof CellError && c.kind === 'num')).toBe(true);
  });

  test('per-cell errors for text and non-finite values say what to do', () => {
    const { layout, points } = readValues([['x'], [NaN]], 1, 'test');
    const grid = writeValues({ ...points, data: new Float64Array(0) }, layout);
    for (const [c] of grid) expect((c as CellError).message).toMatch(/replace it with a number or clear the cell/);
  });
});

describe('cli/main.ts', () => {
  test('apply whose result overflows exits 1 with one line, instead of writing the unmapped input in its place', async () => {
    const files: Record<string, string> = { 's.csv': 'a\n0\n1e-300\n', 't.csv': 'a\n0\n1\n', 'x.csv': 'a\n1e300\n0.5\n' };
    expect((await cli(['fit', '--source', 's.csv', '--target', 't.csv', '--tails', 'linear', '--out', 'm.json'], files)).code).toBe(0);
    const r = await cli(['apply', '--model', 'm.json', '--input', 'x.csv'], files);
    expect(r.code).toBe(1);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^remap: x\.csv, line 2, column a: .*not a finite number.*Rescale/);
    expect(r.err.split('\n')).toHaveLength(2);
  });

  test('an error naming a quoted header that holds a line break is still one stderr line', async () => {
    const files = { 's.csv': 'a,"b\nc"\n1,2\n3,4\n', 't.csv': 'a,b\n1,2\n3,4\n' };
    const r = await cli(['cost', '--source', 's.csv', '--target', 't.csv'], files);
    expect(r.code).toBe(1);
    expect(r.err.split('\n')).toHaveLength(2);
  });

  test('usage errors say what to do', async () => {
    for (const argv of [
      ['fit', 'stray'],
      ['fit', '--out'],
      ['fit', '--out', 'a', '--out', 'b'],
    ]) {
      const r = await cli(argv, {});
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/write options as|give one|give it once/);
    }
  });
});

describe('linear/fit.ts with linear/scale-check.ts: data too small or too large for double precision', () => {
  const rows = (scale: number) => Array.from({ length: 12 }, (_, i) => [(((i * 7) % 12) - 5) * scale]);
  test.each([1e-300, 1e-160, 1e-100, 1e150])(
    'data of size %p: #NUM! saying to rescale (was "every value is the same" or an internal eigen-solver ' + 'message)',
    (scale) => {
      const target = Array.from({ length: 12 }, (_, i) => [((i * 5) % 12) * (scale === 1e-100 ? 1e-100 : 1)]);
      const e = sheetError(() => F.cost(rows(scale), scale === 1e-100 ? target : rows(1), 'linear'));
      expect(e.code).toBe('#NUM!');
      expect(e.message).toMatch(/rescale/);
      expect(e.message).not.toMatch(/symmetricEigen|spectralFunction|same/);
    },
  );

  test('ordinary data is unaffected', () => {
    expect(Number.isFinite(F.cost(rows(1), rows(2), 'linear') as number)).toBe(true);
  });

  test('a ridge too large for the data is #NUM! saying to rescale, not an internal message', () => {
    const e = sheetError(() =>
      F.cost(
        [
          [1, 1],
          [1, 2],
          [1, 3],
          [1, 4],
        ],
        [
          [1, 2],
          [3, 4],
          [5, 6],
          [7, 9],
        ],
        'linear',
        'ridge=1e308',
      ),
    );
    expect(e.message).not.toMatch(/symmetricEigen/);
    expect(e.message).toMatch(/rescale/);
  });
});

describe('engine: a fitted map at the edge of double range still applies to finite numbers', () => {
  test('quantile map on 1e150-size data maps its own source to finite values', async () => {
    const m = await fitMap('quantile', sample([1e150, -1e150, 3e149]), sample([1, 2, 3]));
    expect(Array.from(m.apply(column([1e150, 0])).data).every(Number.isFinite)).toBe(true);
  });
});
