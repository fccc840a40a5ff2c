import * as F from '../../src/functions/functions';
import type { TransportMap } from '../../src/engine/map';
import { forgetAll, resolveMap, setFitter, setKeeper } from '../../src/fits';
import { forgetAllGrouped } from '../../src/fits/grouped-store';
import type { ExcelRun } from '../../src/workbook/excel-run';
import { CHUNK_NAMESPACE, INDEX_NAMESPACE, WorkbookMapStore } from '../../src/workbook/map-store';
import { installCustomFunctionsStub } from '../helpers/custom-functions-stub';

const officeMock = require('../browser/office-mock.js');

installCustomFunctionsStub();
afterEach(() => {
  setKeeper(null);
  setFitter(null);
  forgetAll();
  forgetAllGrouped();
});

const col = (xs: number[]) => Object.freeze(xs.map((x) => Object.freeze([x]))) as unknown as any[][];
const FIXED = () => new Date('2024-05-01T10:00:00.000Z');

/** A seeded sample (LCG, Numerical Recipes constants) of n rows in d columns. */
function rows(n: number, d: number, seed: number, f: (u: number, k: number) => number): number[][] {
  let s = seed >>> 0;
  const out: number[][] = [];
  for (let i = 0; i < n; i++) {
    const r: number[] = [];
    for (let k = 0; k < d; k++) {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      r.push(f(s / 4294967296, k));
    }
    out.push(r);
  }
  return out;
}

function storeOn(mock: { run: ExcelRun }, chunkChars = 1000): WorkbookMapStore {
  return new WorkbookMapStore(mock.run as ExcelRun, { chunkChars, now: FIXED });
}

describe('WorkbookMapStore keeps maps in custom XML parts', () => {
  test('a reopened workbook (a fresh store over the same parts) gives bit-identical REMAP.APPLY results without fitting', async () => {
    const mock = officeMock.createWorkbook();
    setKeeper(storeOn(mock));
    const src = rows(300, 2, 7, (u, k) => u * (k + 1));
    const tgt = rows(400, 2, 8, (u, k) => Math.exp(u) + k);
    const handle = (await F.fit(src, tgt, 'entropic', 'seed=3')) as unknown as string;
    await new Promise((r) => setTimeout(r, 0));
    // let the background save finish: list() waits for the store's queue
    const before = await storeOn(mock).list();
    expect(before.map((m) => m.handle)).toEqual([handle]);
    expect(before[0].parts.length).toBeGreaterThan(1); // split into chunks of 1,000 characters
    const probe = rows(50, 2, 9, (u) => 2 * u - 0.5);
    const first = (await F.apply(handle, probe)) as number[][];

    // Close and reopen: nothing in memory, a new store over a copy of the file's state.
    forgetAll();
    const reopened = officeMock.createWorkbook({ state: mock.state });
    setKeeper(storeOn(reopened));
    const again = (await F.apply(handle, probe)) as number[][];
    expect(again).toEqual(first);
    for (let i = 0; i < first.length; i++) for (let k = 0; k < 2; k++) expect(Object.is(again[i][k], first[i][k])).toBe(true);
  });

  test('list() reports method, sizes, cost and the saved date; remove() deletes the map and its chunks', async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    setKeeper(store);
    const h = (await F.fit(col([1, 2, 3, 4, 5]), col([2, 4, 6, 8, 10, 12]))) as unknown as string;
    const [m] = await store.list();
    // Source: exact 1-D W2^2 between {1..5} and {2,4,...,12} is positive; the store copies the map's recorded figure
    expect(m).toMatchObject({ handle: h, method: 'quantile', rows: 5, targetRows: 6, cols: 1, saved: '2024-05-01T10:00:00.000Z' });
    expect(m.cost).toBe(JSON.parse((await F.save(h)) as unknown as string).fitted.cost.w2Squared);
    expect(await store.remove(h)).toBe(true);
    expect(await store.list()).toEqual([]);
    expect(mock.state.parts.filter((p: { ns: string }) => p.ns === CHUNK_NAMESPACE)).toEqual([]);
    expect(await store.remove(h)).toBe(false);
  });

  test('saving the same map twice keeps one copy; the FIT cell is recorded', async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    const json = JSON.stringify({ ...JSON.parse(await quantileJson()) });
    await store.save('remap:quantile:3x1:00000000000001', json);
    await store.save('remap:quantile:3x1:00000000000001', json, { cell: 'Sheet1!F2' });
    const list = await store.list();
    expect(list).toHaveLength(1);
    expect(list[0].cell).toBe('Sheet1!F2');
    expect(mock.state.parts.filter((p: { ns: string }) => p.ns === INDEX_NAMESPACE)).toHaveLength(1);
    expect(await store.load('remap:quantile:3x1:00000000000001')).toBe(json);
  });

  test('a damaged copy is refused with a message, never half-read; an unknown handle gives null', async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    const json = await quantileJson();
    await store.save('remap:quantile:3x1:00000000000002', json);
    expect(await store.load('remap:quantile:9x1:00000000000009')).toBeNull();
    const chunk = mock.state.parts.find((p: { ns: string }) => p.ns === CHUNK_NAMESPACE);
    chunk.xml = chunk.xml.replace(/(index="0"[^>]*>)(.)/, (_m: string, a: string, c: string) => a + (c === '{' ? '[' : '{'));
    await expect(store.load('remap:quantile:3x1:00000000000002')).rejects.toThrow(/damaged .*fingerprint/);
  });

  test('text that would break XML (quotes, <, &, U+FFFE) round-trips to the same map', async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    const h = (await F.fit([['a<b & "c"'], [1], [2], [3]], [['\uFFFEx'], [4], [5], [9]])) as unknown as string;
    const json = (await F.save(h)) as unknown as string;
    await store.save(h, json);
    const back = (await store.load(h)) as string;
    expect(JSON.parse(back)).toEqual(JSON.parse(json));
  });

  test('a map far larger than one request is written and read in chunks under the payload limit', async () => {
    // The fake refuses any request or response over 200,000 characters here (5 MB in Excel on the web).
    const mock = officeMock.createWorkbook({ payloadLimit: 200_000 });
    const store = new WorkbookMapStore(mock.run as ExcelRun, { chunkChars: 20_000, now: FIXED });
    const n = 20000;
    const h = (await F.fit(
      col(Array.from({ length: n }, (_, i) => Math.sin(i) * 1000 + i / 7)),
      col(Array.from({ length: n }, (_, i) => Math.cos(i) * 10 + i / 3)),
      'quantile',
      'knots=100000',
    )) as unknown as string;
    const text = JSON.stringify(((await resolveMap(h, 'test')) as TransportMap).toJSON());
    expect(text.length).toBeGreaterThan(200_000);
    await store.save(h, text);
    expect((await store.list())[0].parts.length).toBe(Math.ceil(text.length / 20_000));
    expect(await new WorkbookMapStore(mock.run as ExcelRun).load(h)).toBe(text);
  });
});

async function quantileJson(): Promise<string> {
  const h = (await F.fit(col([1, 2, 3]), col([10, 20, 40]))) as unknown as string;
  return (await F.save(h)) as unknown as string;
}

describe('maps by group are kept in the workbook like single maps', () => {
  // Two groups of 40 source and 50 target rows each (seeded LCG data); every group fits on its own rows.
  const groupsOf = (n: number) => col(Array.from({ length: n }, (_, i) => (i < n / 2 ? 1 : 2))).map((r) => [r[0] === 1 ? 'North' : 'South']);
  const src = rows(80, 1, 21, (u) => 10 * u);
  const tgt = rows(100, 1, 22, (u) => 100 + 50 * u * u);
  const probe = [[0.5], [2], [7.5], [9.9]];
  const probeGroups = [['North'], ['South'], ['North'], ['South']];

  test('after reopening, REMAP.APPLYGROUPS on a REMAP.FITGROUPS handle gives bit-identical values without fitting again', async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    setKeeper(store);
    const handle = (await F.fitgroups(src, groupsOf(80), tgt, groupsOf(100))) as unknown as string;
    const first = (await F.applygroups(handle, probe, probeGroups)) as number[][];
    const [kept] = await store.list(); // waits for the background save (the store's queue)
    // Source: the data above (40 + 40 source rows, 50 + 50 target rows, 1 column); design choice: a map by group is flagged in the index
    expect(kept).toMatchObject({ handle, method: 'quantile', rows: 80, targetRows: 100, cols: 1, grouped: true });

    forgetAll();
    forgetAllGrouped();
    setKeeper(storeOn(officeMock.createWorkbook({ state: mock.state })));
    setFitter(() => {
      throw new Error('no fit may run: the map by group is in the workbook');
    });
    const again = (await F.applygroups(handle, probe, probeGroups)) as number[][];
    for (let i = 0; i < probe.length; i++) expect(Object.is(again[i][0], first[i][0])).toBe(true);
    // The FITGROUPS cell recalculated after reopening finds the kept copy too (the fitter above would throw).
    expect(await F.fitgroups(src, groupsOf(80), tgt, groupsOf(100))).toBe(handle);
  });

  test("a kept map by group records the source-weighted mean of the groups' costs, as REMAP.GROUPREPORT gives it", async () => {
    const mock = officeMock.createWorkbook();
    const store = storeOn(mock);
    setKeeper(store);
    const handle = (await F.fitgroups(src, groupsOf(80), tgt, groupsOf(100))) as unknown as string;
    const report = (await F.groupreport(handle)) as unknown[][];
    const costs = report.slice(1, 3).map((r) => r[5] as number);
    const [kept] = await store.list();
    // Source: equal source weights (40 rows each), so the weighted mean is the plain mean of the two groups' squared W2 (worked by hand)
    expect(kept.cost).toBeCloseTo((costs[0] + costs[1]) / 2, 10);
    expect(await store.load(handle)).toContain('"format":"remap.grouped-map"');
  });
});
