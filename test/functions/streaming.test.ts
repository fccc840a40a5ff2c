// The gradient-net entry of the method list is replaced by a stand-in that trains for `steps` x 5 ms.
jest.mock('../../src/engine/gradient-net/method', () => ({ gradientNetMethod: require('../helpers/slow-method').slowMethod('gradient-net') }));
import { MAX_CELL_TEXT, MAX_RESULT_BYTES } from '../../src/functions/calls';
import * as F from '../../src/functions/functions';
import { forgetAll, watchFits } from '../../src/fits';
import { installCustomFunctionsStub, StubSheetError } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => forgetAll());

const col = (xs: number[]) => Object.freeze(xs.map((x) => Object.freeze([x]))) as unknown as any[][];
const tick = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Waits until `done()` holds, checking every 20 ms, for at most `limitMs` (generous: CI machines are loaded). */
async function until(done: () => boolean, limitMs = 30000): Promise<void> {
  const t0 = Date.now();
  while (!done() && Date.now() - t0 < limitMs) await tick(20);
}

/** A fake StreamingInvocation recording every result. */
function invocation(address = 'Sheet1!F2') {
  const results: unknown[] = [];
  const inv = { address, onCanceled: undefined as undefined | (() => void), setResult: (v: unknown) => results.push(v) };
  return { inv: inv as unknown as CustomFunctions.StreamingInvocation<string>, results, cancel: () => inv.onCanceled?.() };
}

const src = col([1, 2, 3, 4, 5, 6, 7, 8]);
const tgt = col([10, 14, 20, 21, 30, 35, 38, 50]);

describe('REMAP.FIT streams', () => {
  test('a synchronous fit sets the handle at once, through the invocation, and nothing else', () => {
    const { inv, results } = invocation();
    F.fit(src, tgt, null, null, undefined, undefined, inv);
    expect(results).toHaveLength(1);
    expect(results[0]).toMatch(/^remap:quantile:8x1:[0-9a-f]{14}$/);
  });

  test('a background fit shows "fitting <method>: ..." text, then the handle', async () => {
    const { inv, results } = invocation();
    F.fit(src, tgt, 'gradient-net', 'steps=30', undefined, undefined, inv);
    expect(results).toEqual(['fitting gradient-net: starting']);
    await until(() => /^remap:/.test(String(results[results.length - 1])));
    const last = results[results.length - 1] as string;
    expect(last).toMatch(/^remap:gradient-net:8x1:[0-9a-f]{14}$/);
    expect(results.slice(0, -1).every((r) => typeof r === 'string' && r.startsWith('fitting gradient-net:'))).toBe(true);
  });

  test('a progress text reads "fitting <method>: step s/n (t s)"', async () => {
    const { inv, results, cancel } = invocation();
    F.fit(src, tgt, 'gradient-net', 'steps=400', undefined, undefined, inv);
    await until(() => results.some((r) => /^fitting gradient-net: step \d+\/400/.test(String(r))));
    cancel();
    expect(results.some((r) => /^fitting gradient-net: step \d+\/400 \(\d+ s\)$/.test(String(r)))).toBe(true);
  });

  test('Excel cancelling the cell (inputs changed, cell cleared) aborts the fit and sets nothing more', async () => {
    const { inv, results, cancel } = invocation();
    let lastStep = 0;
    const stopWatching = watchFits((_h, p) => {
      lastStep = p.step;
    });
    F.fit(src, tgt, 'gradient-net', 'steps=401', undefined, undefined, inv);
    await until(() => lastStep > 0);
    cancel();
    const count = results.length;
    const stepAtCancel = lastStep;
    await tick(200);
    stopWatching();
    expect(stepAtCancel).toBeGreaterThan(0);
    expect(results.length).toBe(count);
    expect(lastStep).toBeLessThanOrEqual(stepAtCancel + 1); // the fit stopped at its next check of the signal
    // the map was not fitted: the same inputs in another cell start a new fit
    const other = invocation();
    F.fit(src, tgt, 'gradient-net', 'steps=401', undefined, undefined, other.inv);
    expect(other.results).toEqual(['fitting gradient-net: starting']);
    other.cancel();
  });

  test('a method without its own time budget is stopped at time_budget with a clear #N/A', () => {
    const rows = Array.from({ length: 400 }, (_, i) => [Math.sin(i), Math.cos(3 * i)]);
    const { inv, results } = invocation();
    F.fit(
      rows,
      rows.map(([a, b]) => [2 * a, b + 1]),
      'entropic',
      'time_budget=0.001; tolerance=1e-12',
      undefined,
      undefined,
      inv,
    );
    expect(results).toHaveLength(1);
    const e = results[0] as StubSheetError;
    expect(e).toBeInstanceOf(StubSheetError);
    expect(e.code).toBe('#N/A');
    expect(e.message).toMatch(/stopped when its time budget of 0.001 s ran out.*time_budget=/);
  });

  test('an enforced time_budget does not change the handle (a finished map does not depend on it)', async () => {
    const rows = Array.from({ length: 30 }, (_, i) => [i % 7, (i * 3) % 11]);
    const a = await F.fit(rows, rows, 'entropic');
    const b = await F.fit(rows, rows, 'entropic', 'time_budget=600');
    expect(b).toBe(a);
    expect(() => F.fit(rows, rows, 'entropic', 'time_budget=-1')).toThrow(/time_budget must be a number of seconds greater than 0/);
  });

  test('cells that apply a map still fitting say so (#N/A), rather than "not a map"', () => {
    let err: StubSheetError | null = null;
    try {
      F.apply('fitting gradient-net: step 3/40 (0 s)', [[1]]);
    } catch (e) {
      err = e as StubSheetError;
    }
    expect(err?.code).toBe('#N/A');
    expect(err?.message).toMatch(/still working/);
  });
});

describe('results within Excel limits', () => {
  test('a result over the 5 MB payload limit is #VALUE! saying to apply the map to fewer rows at a time', async () => {
    const h = (await F.fit(src, tgt)) as unknown as string;
    const n = 300_000; // about 20 characters a value: about 6 MB of JSON
    const vals = Array.from({ length: n }, (_, i) => [1 + (7 * i) / n + Math.PI * 1e-9]);
    let err: StubSheetError | null = null;
    try {
      await F.apply(h, vals);
    } catch (e) {
      err = e as StubSheetError;
    }
    expect(err?.code).toBe('#VALUE!');
    expect(err?.message).toMatch(
      /more than the 5 MB Excel accepts from one function. Apply the map to fewer rows at a time: split the range into blocks of at most [\d,]+ rows/,
    );
    const blocks = Number(/at most ([\d,]+) rows/.exec(String(err?.message))?.[1].replace(/,/g, ''));
    const ok = (await F.apply(h, vals.slice(0, blocks))) as number[][];
    expect(JSON.stringify(ok).length).toBeLessThanOrEqual(MAX_RESULT_BYTES);
  });

  test('REMAP.SAVE beyond 32,767 characters says the map is kept under its handle and how to export it', async () => {
    const big = Array.from({ length: 4000 }, (_, i) => Math.sqrt(i + 0.5) * 1.2345678);
    const h = (await F.fit(col(big), col(big.map((x) => x * x)))) as unknown as string;
    let err: StubSheetError | null = null;
    try {
      await F.save(h);
    } catch (e) {
      err = e as StubSheetError;
    }
    expect(err?.code).toBe('#VALUE!');
    expect(err?.message).toMatch(new RegExp(`more than the 32,767 an Excel cell can hold.*${h}.*Export JSON.*remap fit`));
    expect(MAX_CELL_TEXT).toBe(32767); // Source: Excel specifications and limits (Microsoft), 32,767 characters per cell
  });

  test('SAVE then LOAD gives bit-identical APPLY results (linear map, several columns)', async () => {
    const s = Array.from({ length: 40 }, (_, i) => [Math.sin(i) + i / 40, Math.cos(2 * i)]);
    const t = s.map(([a, b]) => [3 * a - 1, a + 2 * b]);
    const h = (await F.fit(s, t, 'linear')) as unknown as string;
    const probe = [
      [0.1, 0.2],
      [-1.5, 3],
      [7, -2],
    ];
    const direct = (await F.apply(h, probe)) as number[][];
    const json = (await F.save(h)) as unknown as string;
    forgetAll();
    const loaded = F.load(json);
    const again = (await F.apply(loaded, probe)) as number[][];
    for (let i = 0; i < probe.length; i++) for (let k = 0; k < 2; k++) expect(Object.is(again[i][k], direct[i][k])).toBe(true);
  });
});

/** A fake CancelableInvocation: Excel sets nothing on it but calls onCanceled. */
function cancelable() {
  const inv = { onCanceled: undefined as undefined | (() => void) };
  return { inv: inv as unknown as CustomFunctions.CancelableInvocation, cancel: () => inv.onCanceled?.() };
}

describe('REMAP.VALUES, REMAP.COST and REMAP.PAIRS are cancelable', () => {
  test.each(['values', 'cost'] as const)('Excel cancelling a REMAP.%s cell stops its background fit', async (which) => {
    const { inv, cancel } = cancelable();
    let lastStep = 0;
    const stopWatching = watchFits((_h, p) => {
      lastStep = p.step;
    });
    const run =
      which === 'values'
        ? (F.values(col([2, 3]), src, tgt, 'gradient-net', 'steps=402', undefined, undefined, inv) as unknown as Promise<unknown>)
        : (F.cost(src, tgt, 'gradient-net', 'steps=402', undefined, undefined, inv) as unknown as Promise<unknown>);
    await until(() => lastStep > 0);
    cancel();
    const stepAtCancel = lastStep;
    // Source: design choice (a cancelled call ends as #N/A; Excel discards it)
    await expect(run).rejects.toMatchObject({ code: '#N/A' });
    await tick(100);
    stopWatching();
    expect(lastStep).toBeLessThanOrEqual(stepAtCancel + 1); // stopped at its next check of the signal, far before step 402
  });

  test('without an invocation (the headless demo, scripts) REMAP.VALUES still returns its values', async () => {
    // Source: quantile matching (the stand-in fits it) sends the smallest and largest source values to the smallest and largest target values
    const out = await (F.values(col([1, 8]), src, tgt, 'gradient-net', 'steps=3') as unknown as Promise<number[][]>);
    expect(out).toEqual([[10], [50]]);
  });

  test('a cell that joined a fit another cell started, and saw it cancelled there, fits again itself', async () => {
    const first = cancelable();
    let lastStep = 0;
    const stopWatching = watchFits((_h, p) => {
      lastStep = p.step;
    });
    const a = F.values(col([1]), src, tgt, 'gradient-net', 'steps=20', undefined, undefined, first.inv) as unknown as Promise<unknown>;
    const b = F.values(col([8]), src, tgt, 'gradient-net', 'steps=20') as unknown as Promise<number[][]>;
    await until(() => lastStep > 0);
    first.cancel();
    await expect(a).rejects.toMatchObject({ code: '#N/A' });
    // Source: the quantile map sends the largest source value to the largest target value (50)
    await expect(b).resolves.toEqual([[50]]);
    stopWatching();
  });
});
