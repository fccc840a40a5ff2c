/**
 * Determinism: for every registered method, the same inputs, settings and seed give
 * bit-identical output (compared with Object.is on every double) across two fits in one
 * process, between the engine and the worksheet functions, and between the worksheet
 * functions (data in cells) and the command line (the same data in CSV files).
 * Source: project rule 8 (seeded randomness only: same inputs + seed => bit-identical output).
 */
import { runCli as cli } from '../helpers/run-cli';
import { parseCSV } from '../../src/cli/csv';
import { fitMap, listMethods } from '../../src/engine/methods';
import { points, sample } from '../../src/engine/points';
import { Random } from '../../src/engine/stats/random';
import * as F from '../../src/functions/functions';
import { forgetAll } from '../../src/fits';
import { installCustomFunctionsStub } from '../helpers/custom-functions-stub';

installCustomFunctionsStub();
afterEach(() => forgetAll());

/** Small, fast settings for the trained methods; every method gets a seed where it takes one. */
const SETTINGS: Record<string, Record<string, string>> = {
  entropic: { seed: '11', max_iterations: '200' },
  'gradient-net': { seed: '11', steps: '3', hidden: '3', batch: '8', backend: 'cpu', time_budget: '30' },
};
const settingsText = (m: string) =>
  Object.entries(SETTINGS[m] ?? {})
    .map(([k, v]) => `${k}=${v}`)
    .join('; ');

/** Seeded data: d columns, n rows, values with long binary expansions so that rounding differences would show. */
function data(n: number, d: number, seed: number, ordinal: boolean): number[][] {
  const r = new Random(seed);
  return Array.from({ length: n }, () =>
    Array.from({ length: d }, (_, k) => (ordinal ? Math.floor(r.uniform() * 7) : r.uniform() * 3 + Math.sqrt(2) * k + r.uniform() / 3)),
  );
}

function sameBits(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

const toCSV = (rows: number[][], cols: string[]) => [cols.join(','), ...rows.map((r) => r.map(String).join(','))].join('\n') + '\n';

const cases = listMethods().map((m) => [m.name] as const);

describe.each(cases)('method %s is deterministic', (method) => {
  const d = method === 'ordinal' || method === 'quantile' || method === 'step' ? 1 : 2;
  const ordinal = method === 'ordinal';
  const n = 24;
  const src = data(n, d, 101, ordinal);
  const tgt = data(method === 'pairs' ? n : n + 5, d, 202, ordinal).map((r) => r.map((v) => 2 * v + 1));
  // pairs maps its own source rows only; every other method maps new points too
  const vals = method === 'pairs' ? src : data(9, d, 303, ordinal).map((r) => r.map((v) => v * 1.1 - 0.2));
  const settings = SETTINGS[method] ?? {};

  test('two fits in one process give bit-identical mapped values and costs', async () => {
    const a = await fitMap(method, sample(src), sample(tgt), settings);
    const b = await fitMap(method, sample(src), sample(tgt), settings);
    expect(sameBits(a.apply(points(vals)).data, b.apply(points(vals)).data)).toBe(true);
    expect(Object.is(a.cost().w2Squared, b.cost().w2Squared)).toBe(true);
    expect(JSON.stringify(a.toJSON())).toBe(JSON.stringify(b.toJSON()));
    a.dispose();
    b.dispose();
  });

  test('REMAP.VALUES (cells) gives the same bits as the engine, twice, with the cache cleared between', async () => {
    const engine = await fitMap(method, sample(src), sample(tgt), settings);
    const want = engine.apply(points(vals)).data;
    engine.dispose();
    const cells1 = (await F.values(vals, src, tgt, method, settingsText(method) || undefined)) as number[][];
    forgetAll();
    const cells2 = (await F.values(vals, src, tgt, method, settingsText(method) || undefined)) as number[][];
    expect(sameBits(cells1.flat(), want)).toBe(true);
    expect(sameBits(cells2.flat(), want)).toBe(true);
    const c1 = (await F.cost(src, tgt, method, settingsText(method) || undefined)) as number;
    forgetAll();
    const c2 = (await F.cost(src, tgt, method, settingsText(method) || undefined)) as number;
    expect(Object.is(c1, c2)).toBe(true);
  });

  test('the command line (CSV in, CSV out) gives the same bits as REMAP.VALUES on the same data', async () => {
    const cols = ['a', 'b'].slice(0, d);
    const files: Record<string, string> = { 's.csv': toCSV(src, cols), 't.csv': toCSV(tgt, cols), 'x.csv': toCSV(vals, cols) };
    const st = settingsText(method);
    const fit = await cli(['fit', '--source', 's.csv', '--target', 't.csv', '--method', method, ...(st ? ['--settings', st] : []), '--out', 'm.json'], files);
    expect(fit.code).toBe(0);
    const applied = await cli(['apply', '--model', 'm.json', '--input', 'x.csv'], files);
    expect(applied.code).toBe(0);
    const fromCli = parseCSV(applied.out).slice(1).flat().map(Number);
    const cells = (await F.values(vals, src, tgt, method, st || undefined)) as number[][];
    expect(sameBits(fromCli, cells.flat())).toBe(true);
    const cost = await cli(['cost', '--source', 's.csv', '--target', 't.csv', '--method', method, ...(st ? ['--settings', st] : [])], files);
    expect(cost.code).toBe(0);
    const cellCost = (await F.cost(src, tgt, method, st || undefined)) as number;
    expect(Object.is(JSON.parse(cost.out).w2_squared, cellCost)).toBe(true);
  });
});
