import * as F from '../../src/functions/functions';
import { cellMap, forgetAll } from '../../src/fits';
import { installCustomFunctionsStub } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => forgetAll());

const col = (xs: number[]) => xs.map((x) => [x]) as unknown as any[][];
const at = (address: string) => ({ address, onCanceled: null }) as unknown as CustomFunctions.CancelableInvocation;
const ONE_TO_TEN = col([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
const TENS = col([10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);

describe('the extrapolation warning of each call is kept with its cell, in words', () => {
  test('APPLY of a quantile map fitted on 1..10 to 11, 0 and 5: two rows lay outside, recorded for that cell', async () => {
    const h = await F.fit(ONE_TO_TEN, TENS);
    await F.apply(h, col([11, 0, 5]), at("'Q1 data'!$B$2"));
    const rec = cellMap('Q1 DATA!B2');
    expect(rec?.fn).toBe('REMAP.APPLY');
    expect(rec?.handle).toBe(h);
    // Source: counted by hand: 11 > 10 and 0 < 1 lie outside [1, 10]; 5 does not
    expect(rec?.calls).toHaveLength(1);
    expect(rec?.calls[0].message).toMatch(/^2 of 3 rows \(66\.7%\) lay outside the source range/);
    // Source: design choice (the warning says what the method did, in words, not a setting's name)
    expect(rec?.calls[0].message).toMatch(/clamped/);
  });

  test('a recalculation whose values all lie inside clears that cell\u2019s warning; other cells keep theirs', async () => {
    const h = await F.fit(ONE_TO_TEN, TENS);
    await F.apply(h, col([11]), at('Sheet1!C1'));
    await F.apply(h, col([-3]), at('Sheet1!C2'));
    await F.apply(h, col([2, 9]), at('Sheet1!C1'));
    // Source: counted by hand: 2 and 9 lie in [1, 10]; -3 does not
    expect(cellMap('Sheet1!C1')?.calls).toEqual([]);
    expect(cellMap('Sheet1!C2')?.calls[0].message).toMatch(/^1 of 1 row /);
  });

  test('INVERT compares with the fitted target range', async () => {
    const h = await F.fit(ONE_TO_TEN, TENS);
    await F.invert(h, col([5, 50, 150]), at('Sheet1!D1'));
    // Source: counted by hand: the target range is [10, 100]; 5 and 150 lie outside
    expect(cellMap('Sheet1!D1')?.calls[0].message).toMatch(/^2 of 3 rows .* outside the target range/);
  });

  test('VALUES records its own rows outside the fitted range beside the handle of its map', async () => {
    await F.values(col([0.5, 3, 12]), ONE_TO_TEN, TENS, 'quantile', 'tails=linear', undefined, undefined, at('Sheet1!E1'));
    const rec = cellMap('Sheet1!E1');
    expect(rec?.handle).toMatch(/^remap:quantile:10x1:/);
    // Source: counted by hand: 0.5 < 1 and 12 > 10; with tails=linear the text says the map continues linearly (design choice)
    expect(rec?.calls[0].message).toMatch(/^2 of 3 rows .*continue linearly/);
  });

  test('APPLY on a map given as JSON text records the warning with no handle', async () => {
    const h = await F.fit(ONE_TO_TEN, TENS);
    const json = (await F.save(h)) as string;
    await F.apply(json, col([20]), at('Sheet1!F1'));
    // Source: design choice ('' when the cell names its map by JSON text)
    expect(cellMap('Sheet1!F1')).toMatchObject({ fn: 'REMAP.APPLY', handle: '' });
    expect(cellMap('Sheet1!F1')?.calls).toHaveLength(1);
  });
});
