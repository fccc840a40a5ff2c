import * as ss from 'simple-statistics';
import * as F from '../../src/functions/functions';
import { forgetAll } from '../../src/fits';
import { installCustomFunctionsStub, StubSheetError } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => forgetAll());

const col = (xs: number[]) => Object.freeze(xs.map((x) => Object.freeze([x]))) as unknown as any[][];

/** Calls a worksheet function and returns the spreadsheet error it throws. */
function sheetError(f: () => unknown): StubSheetError {
  try {
    f();
  } catch (e) {
    if (e instanceof StubSheetError) return e;
    throw e;
  }
  throw new Error('expected a spreadsheet error');
}

describe('REMAP.VALUES', () => {
  test('equal-size columns: the i-th smallest source value maps to the i-th smallest target value', () => {
    // Source: quantile matching of equal-size samples is the sorted (monotone) matching (fact of the trade)
    const out = F.values(col([3, 1, 2]), col([3, 1, 2]), col([30, 10, 20]));
    expect(out).toEqual([[30], [10], [20]]);
  });

  test('keeps the shape of values; blanks stay blank; text gives #VALUE! in place', () => {
    const out = F.values(
      [
        [1, null],
        ['x', 3],
      ],
      col([1, 2, 3]),
      col([10, 20, 30]),
    );
    expect(out[0][0]).toBe(10);
    expect(out[0][1]).toBe('');
    expect(out[1][0]).toBeInstanceOf(StubSheetError);
    expect((out[1][0] as StubSheetError).code).toBe('#VALUE!');
    expect(out[1][1]).toBe(30);
  });

  test('several columns default to the linear map, which moves the source mean onto the target mean', () => {
    // Source: the Gaussian map T(x) = m2 + A (x - m1) sends m1 to m2 (Knott & Smith 1984)
    const src = [
      [0, 0],
      [1, 0],
      [0, 1],
      [1, 1],
      [0.5, 0.2],
      [0.2, 0.7],
    ];
    const tgt = src.map(([a, b]) => [2 * a + 5, 3 * b - 1]);
    const m1 = [ss.mean(src.map((r) => r[0])), ss.mean(src.map((r) => r[1]))];
    const out = F.values([m1], src, tgt);
    expect(out[0][0]).toBeCloseTo(2 * m1[0] + 5, 12);
    expect(out[0][1]).toBeCloseTo(3 * m1[1] - 1, 12);
  });

  test('weights: a weight of 2 counts as the row twice (step mode)', () => {
    // Source: frequency weights (common practice)
    const a = F.values(col([1, 2, 3]), col([1, 2, 3]), col([1, 5, 7, 9]), 'step', undefined, col([1, 1, 1]), col([2, 1, 1, 0]));
    const b = F.values(col([1, 2, 3]), col([1, 2, 3]), col([1, 1, 5, 7]), 'step');
    expect(a).toEqual(b);
  });

  test('bad input becomes #VALUE! with a message that says what to fix', () => {
    const e1 = sheetError(() =>
      F.values(
        col([1]),
        [
          [1, 2],
          [3, 4],
          [5, 6],
        ],
        col([1, 2, 3]),
      ),
    );
    expect(e1.code).toBe('#VALUE!');
    expect(e1.message).toMatch(/source has 2 columns and the target 1/);
    const e2 = sheetError(() => F.values(col([1]), col([1, 2, 3]), col([1, 2, 3]), 'wibble'));
    expect(e2.message).toMatch(/Unknown method "wibble"; choose one of quantile, step, ordinal, linear/);
    const e3 = sheetError(() => F.values(col([1]), col([1, 2, 3]), col([1, 2, 3]), 'quantile', undefined, col([1, -1, 1])));
    expect(e3.message).toMatch(/negative/);
    const e4 = sheetError(() => F.values(col([1]), col([1, 2, 3]), col([1, 2, 3]), 'quantile', undefined, col([0, 0, 0])));
    expect(e4.message).toMatch(/all source weights are zero/);
    const e5 = sheetError(() => F.values(col([1]), col([1]), col([1, 2, 3])));
    expect(e5.message).toMatch(/at least 2/);
    const e6 = sheetError(() => F.values(col([1]), col([1, 2, 3]), col([1, 2, 3]), 'quantile', 'colour=red'));
    expect(e6.message).toMatch(/Unknown setting "colour" for method quantile. Known settings: tails/);
  });

  test('tails=linear continues the end slope beyond the source range; the default clamps', () => {
    const clamp = F.values(col([4]), col([1, 2, 3]), col([10, 20, 30]));
    const linear = F.values(col([4]), col([1, 2, 3]), col([10, 20, 30]), 'quantile', 'tails=linear');
    expect(clamp).toEqual([[30]]);
    expect(linear[0][0]).toBeCloseTo(40, 12);
  });

  test('inputs are not mutated', () => {
    const src = [[3], [1], [2]];
    const copy = JSON.parse(JSON.stringify(src));
    F.values(src, src, col([5, 6, 7]));
    expect(src).toEqual(copy);
  });
});

describe('REMAP.COST and REMAP.GAUSSCOST', () => {
  test('COST of one column is the exact squared W2 of the empirical distributions', () => {
    // Source: for equal sizes, W2^2 = mean of squared differences of sorted values (fact of the trade): ((5)^2+(5)^2+(5)^2)/3 = 25
    expect(F.cost(col([0, 1, 3]), col([5, 6, 8]))).toBeCloseTo(25, 12);
  });

  test('GAUSSCOST of N(0, I) and N(0, diag(4, 9)) is 5', () => {
    // Source: Bures formula, commuting case: tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2) = (1 + 4 - 4) + (1 + 9 - 6) = 5
    expect(
      F.gausscost(
        [[0], [0]],
        [
          [1, 0],
          [0, 1],
        ],
        [[0], [0]],
        [
          [4, 0],
          [0, 9],
        ],
      ),
    ).toBeCloseTo(5, 12);
  });

  test('GAUSSCOST refuses a blank in a covariance', () => {
    expect(sheetError(() => F.gausscost([[0]], [[null]], [[0]], [[1]])).message).toMatch(/cov1 has a blank in row 1, column 1/);
  });
});

describe('REMAP.FIT, APPLY, INVERT, REPORT, SAVE', () => {
  const src = col([1, 2, 3, 4, 5, 6, 7, 8]);
  const tgt = col([10, 14, 20, 21, 30, 35, 38, 50]);

  test('FIT returns a handle naming method and size, derived from the data: the same inputs give the same handle', async () => {
    const h1 = await F.fit(src, tgt);
    const h2 = await F.fit(src, tgt);
    expect(h1).toMatch(/^remap:quantile:8x1:[0-9a-f]{14}$/);
    expect(h2).toBe(h1);
    expect(await F.fit(src, tgt, 'step')).not.toBe(h1);
  });

  test('APPLY on the handle equals VALUES; INVERT undoes it', async () => {
    const h = await F.fit(src, tgt);
    const applied = (await F.apply(h, [[2.5], [7]])) as number[][];
    expect(applied).toEqual(F.values([[2.5], [7]], src, tgt));
    const back = (await F.invert(h, applied)) as number[][];
    expect(back[0][0]).toBeCloseTo(2.5, 12);
    expect(back[1][0]).toBeCloseTo(7, 12);
  });

  test('REPORT is a two-column label/value table with the method and cost', async () => {
    const h = await F.fit(src, tgt);
    const table = (await F.report(h)) as unknown[][];
    expect(table.every((r) => r.length === 2)).toBe(true);
    expect(table).toContainEqual(['Method', 'quantile']);
    const cost = table.find((r) => r[0] === 'Cost: squared W2');
    expect(typeof cost?.[1]).toBe('number');
  });

  test('SAVE gives JSON that APPLY accepts in place of the handle, with identical results', async () => {
    const h = await F.fit(src, tgt);
    const json = (await F.save(h)) as string;
    expect(JSON.parse(json).format).toBe('remap.map');
    forgetAll();
    const a = (await F.apply(json, [[3.3], [6.1]])) as number[][];
    const h2 = await F.fit(src, tgt);
    expect(a).toEqual(await F.apply(h2, [[3.3], [6.1]]));
  });

  test('an unknown handle is #N/A telling the user to recalculate the FIT cell', () => {
    const e = sheetError(() => F.apply('remap:linear:10x2:00000000000000', [[1, 2]]));
    expect(e.code).toBe('#N/A');
    expect(e.message).toMatch(/recalculate the REMAP.FIT cell/);
  });

  test('a model that is not a handle or JSON is #VALUE!', () => {
    expect(sheetError(() => F.apply('hello', [[1]])).message).toMatch(/is not a map/);
    expect(sheetError(() => F.apply(7, [[1]])).message).toMatch(/must be the cell holding REMAP.FIT/);
  });
});

describe('diagnostics for every method', () => {
  test('REPORT of a quantile map includes energy distances and the KS statistic after mapping', async () => {
    // Source: equal-size samples map exactly onto the target's order statistics, so after mapping
    // the two empirical distributions coincide: KS = 0 and energy distance = 0 (definitions, Szekely & Rizzo)
    const h = await F.fit(col([5, 1, 4, 2, 3]), col([50, 10, 40, 20, 30]));
    const table = (await F.report(h)) as unknown[][];
    const get = (label: string) => table.find((r) => r[0] === label)?.[1];
    expect(get('Largest KS statistic after')).toBe(0);
    expect(get('Energy distance after')).toBeCloseTo(0, 12);
    expect(get('Energy distance before') as number).toBeGreaterThan(10);
  });
});

describe('REMAP.PAIRS and REMAP.LOAD', () => {
  test('PAIRS in one column is the sorted matching; "index" gives row numbers within the target range', async () => {
    // Source: in 1-D the monotone rearrangement is the optimal assignment (fact of the trade)
    const vals = await F.pairs(col([3, 1, 2]), col([20, 30, 10]));
    expect(vals).toEqual([[30], [10], [20]]);
    const idx = await F.pairs([['x'], [3], [1], [2]], [['y'], [20], [30], [10]], 'index');
    // header row echoed; target rows counted from the range's first row (the header), as INDEX() counts
    expect(idx).toEqual([['target row'], [3], [4], [2]]);
  });

  test('PAIRS keeps skipped source rows blank so results line up with the sheet', async () => {
    const out = await F.pairs([[1], ['n/a'], [2]], col([5, 6]));
    expect(out).toEqual([[5], [''], [6]]);
  });

  test('PAIRS of unequal sizes says to use the entropic method', () => {
    expect(sheetError(() => F.pairs(col([1, 2, 3]), col([1, 2]))).message).toMatch(/entropic/);
  });

  test("LOAD restores SAVE's JSON: the same JSON gives the same handle and identical results", async () => {
    const h = await F.fit(col([1, 2, 3, 4]), col([2, 4, 8, 16]));
    const json = (await F.save(h)) as string;
    forgetAll();
    const loaded = F.load(json);
    expect(loaded).toMatch(/^remap:quantile:4x1:[0-9a-f]{14}$/);
    expect(F.load(json)).toBe(loaded);
    expect(await F.apply(loaded, [[2.5]])).toEqual(await F.apply(json, [[2.5]]));
    expect(sheetError(() => F.load('not json')).message).toMatch(/JSON text REMAP.SAVE wrote/);
    expect(sheetError(() => F.load('{"format":"other"}')).message).toMatch(/"format" field is not "remap.map"/);
  });
});
