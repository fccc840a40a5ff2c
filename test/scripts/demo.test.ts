import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { ValueType, Workbook } from 'exceljs';
import { parseCSV } from '../../src/cli/csv';
import { fitMap } from '../../src/engine/methods';
import { sample, type Points } from '../../src/engine/points';
import { forgetAll } from '../../src/fits';
import { runWorkbook, type RunResult } from '../../src/headless/run-workbook';
import { rangeNumbers } from '../../src/headless/range-values';
import { DEMO_ENTROPIC_ROWS, DEMO_GRADIENT_NET_SETTINGS, DEMO_WORKBOOKS, makeDemoWorkbooks } from '../../scripts/make-demo-workbooks';

/*
 * The demo workbooks, generated into a temporary folder and calculated headless.
 * survey-waves and what-if run in full. scenario-alignment runs reduced to keep
 * this test short: every range covers the first 1,000 scenarios instead of
 * 5,000, the gradient-net fit uses "seed=7; steps=0" (its Gaussian warm start, no
 * training: training under jest is slow) instead of the demo's
 * "seed=7; steps=150", and the entropic fit uses the first 300 rows of each
 * set instead of 1,500. Every mapped value is
 * compared with the engine called directly (fitMap + apply) on the same data.
 */

const DATA = path.join(__dirname, '..', '..', 'demo-workbooks', 'data');
const rows = (file: string): number[][] =>
  parseCSV(fs.readFileSync(path.join(DATA, file), 'utf8'))
    .slice(1)
    .map((r) => r.map(Number));
const col = (m: number[][], k: number) => m.map((r) => r[k]);
const pts = (m: number[][]): Points => ({ n: m.length, d: m[0].length, data: Float64Array.from(m.flat()) });

let dir: string;
let paths: string[];

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-demo-'));
  paths = await makeDemoWorkbooks(dir);
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
afterEach(() => forgetAll());

/** Expects `block` (a computed column or block) to equal `want` (row-major) exactly. */
function expectSame(result: RunResult, ref: string, want: ArrayLike<number>): void {
  const got = rangeNumbers(result.values, ref).data;
  expect(got.length).toBe(want.length);
  let worst = 0;
  for (let i = 0; i < want.length; i++) worst = Math.max(worst, Math.abs(got[i] - want[i]) / Math.max(1, Math.abs(want[i])));
  expect(worst).toBe(0);
}

describe('demo workbooks', () => {
  test(
    'are valid xlsx files: a zip holding [Content_Types].xml and one part per sheet, that exceljs reads back with the REMAP formulas and an ' + 'About sheet',
    async () => {
      // Source: ECMA-376 Part 2 (Open Packaging Conventions): [Content_Types].xml; xl/worksheets/sheetN.xml
      expect(paths.map((p) => path.basename(p))).toEqual(DEMO_WORKBOOKS.map((d) => d.file));
      for (const p of paths) {
        const bytes = fs.readFileSync(p);
        expect(bytes.subarray(0, 4).toString('latin1')).toBe('PK\u0003\u0004');
        const text = bytes.toString('latin1');
        expect(text).toContain('[Content_Types].xml');
        const wb = new Workbook();
        await wb.xlsx.readFile(p);
        expect(wb.worksheets[0].name).toBe('About');
        for (let i = 1; i <= wb.worksheets.length; i++) expect(text).toContain(`xl/worksheets/sheet${i}.xml`);
        let remap = 0;
        wb.eachSheet((ws) => ws.eachRow((row) => row.eachCell((c) => (c.type === ValueType.Formula && /REMAP\./.test(c.formula) ? remap++ : undefined))));
        expect(remap).toBeGreaterThanOrEqual(5);
      }
    },
  );

  test("survey-waves: income and satisfaction of wave 2 on wave 1's scale equal the engine's weighted quantile and ordinal maps", async () => {
    // Source: src/engine fitMap('quantile' | 'ordinal') + apply called directly, with the survey weights
    const r = await runWorkbook(paths[0]);
    const w1 = rows('survey-wave1.csv');
    const w2 = rows('survey-wave2.csv');
    const e2 = w2.length + 1;
    for (const [k, method, column] of [
      [1, 'quantile', 'F'],
      [2, 'ordinal', 'G'],
    ] as const) {
      const map = await fitMap(method, sample(col(w2, k), col(w2, 3)), sample(col(w1, k), col(w1, 3)));
      expectSame(r, `Wave2!${column}2:${column}${e2}`, map.apply(pts(w2.map((x) => [x[k]]))).data);
    }
    // the harmonised weighted mean income is close to wave 1's (within 1 %)
    const [b, , d] = rangeNumbers(r.values, 'Check!B2:D2').data;
    expect(Math.abs(d - b) / b).toBeLessThan(0.01);
    expect(r.formulas.every((f) => f.block.every((row) => row.every((v) => v === null || typeof v !== 'object')))).toBe(true);
  });

  test("what-if: North re-shaped equals the engine's quantile map, and mapping back gives the original sales", async () => {
    // Source: src/engine fitMap('quantile') + apply/invert called directly
    const r = await runWorkbook(paths[2]);
    const north = rows('sales-north.csv');
    const south = rows('sales-south.csv');
    const map = await fitMap('quantile', sample(col(north, 1)), sample(col(south, 1)));
    const e = north.length + 1;
    expectSame(r, `North!C2:C${e}`, map.apply(pts(north.map((x) => [x[1]]))).data);
    const back = rangeNumbers(r.values, `North!D2:D${e}`).data;
    for (let i = 0; i < north.length; i++) expect(back[i]).toBeCloseTo(north[i][1], 6);
    expect(rangeNumbers(r.values, 'WhatIf!D6').data[0]).toBe(map.apply(pts([[62000]])).data[0]);
    expect(rangeNumbers(r.values, 'WhatIf!D7').data[0]).toBe(map.invert(pts([[100000]])).data[0]);
  });

  test(
    "scenario-alignment (reduced: 1,000 scenarios, gradient-net steps=0, entropic on 300 rows): each aligned block equals the engine's map " +
      'applied to the model scenarios',
    async () => {
      // Source: src/engine fitMap('linear' | 'entropic' | 'gradient-net') + apply called directly, same settings
      const wb = new Workbook();
      await wb.xlsx.readFile(paths[1]);
      const small = 'seed=7; steps=0';
      const N = 1000;
      wb.eachSheet((ws) =>
        ws.eachRow((row) =>
          row.eachCell((c) => {
            if (c.type !== ValueType.Formula) return;
            const v = c.value as { formula: string; ref?: string };
            const f = v.formula
              .split(DEMO_GRADIENT_NET_SETTINGS)
              .join(small)
              .split(`C${DEMO_ENTROPIC_ROWS + 1}`)
              .join('C301')
              .split('5001')
              .join(String(N + 1));
            c.value = { ...v, formula: f, ...(v.ref ? { ref: v.ref.replace('5001', String(N + 1)) } : {}) } as never;
          }),
        ),
      );
      const r = await runWorkbook(wb);
      expect(r.passes).toBe(2);
      const model = rows('scenarios-model.csv').slice(0, N);
      const ref = rows('scenarios-reference.csv').slice(0, N);
      const e = N + 1;
      const fits: [string, number[][], number[][], Record<string, unknown>, string][] = [
        ['linear', model, ref, {}, `Aligned!A2:C${e}`],
        ['entropic', model.slice(0, 300), ref.slice(0, 300), { seed: 7 }, `Aligned!E2:G${e}`],
        ['gradient-net', model, ref, { seed: 7, steps: 0 }, `Aligned!I2:K${e}`],
      ];
      for (const [method, s, t, settings, block] of fits) {
        const map = await fitMap(method, sample(s), sample(t), settings);
        expectSame(r, block, map.apply(pts(model)).data);
        map.dispose();
      }
      const costs = rangeNumbers(r.values, 'Fits!C2:C4').data;
      for (const c of costs) expect(c).toBeGreaterThan(0);
      expect(r.values.Reports[1][0]).toBe('Method');
    },
  );
});
