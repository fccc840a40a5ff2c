import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { parseCSV } from '../../src/cli/csv';
import { fitGroupedMapSync } from '../../src/engine/groups/fit-grouped';
import { fitMapSync } from '../../src/engine/methods';
import { column, sample } from '../../src/engine/points';
import { fitFromTables } from '../../src/engine/tables/fit-from-tables';
import { quantileTable } from '../../src/engine/tables/quantile-table';
import { forgetAll } from '../../src/fits';
import { forgetAllGrouped } from '../../src/fits/grouped-store';
import { rangeNumbers } from '../../src/headless/range-values';
import { runWorkbook, type RunResult } from '../../src/headless/run-workbook';
import { AGENCY_DECILES, BOUND_INCOMES, makeDemoWorkbooks } from '../../scripts/make-demo-workbooks';

/*
 * The survey workbook's sheets for maps by region, bounds and the agency's
 * published deciles, generated into a temporary folder and calculated headless;
 * every number is compared with the engine called directly on the same data.
 */

const DATA = path.join(__dirname, '..', '..', 'demo-workbooks', 'data');
const read = (file: string) => parseCSV(fs.readFileSync(path.join(DATA, file), 'utf8')).slice(1);

let dir: string;
let result: RunResult;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-harmonise-'));
  const paths = await makeDemoWorkbooks(dir);
  result = await runWorkbook(paths[0]);
}, 120_000);
afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
  forgetAll();
  forgetAllGrouped();
});

describe('survey workbook: by region, bounds, agency deciles', () => {
  const w1 = read('survey-wave1.csv');
  const w2 = read('survey-wave2.csv');
  const num = (rows: string[][], k: number) => rows.map((r) => Number(r[k]));
  const s = sample(num(w2, 1), num(w2, 3));
  const t = sample(num(w1, 1), num(w1, 3));

  test('every formula of the survey workbook calculates without an error', () => {
    // Source: design choice (a demo formula that errs is a broken demo)
    const bad: string[] = [];
    for (const f of result.formulas) {
      for (const row of f.block) for (const v of row) if (v !== null && typeof v === 'object') bad.push(`${f.cell.sheet}!${f.cell.address}: ${v.message}`);
    }
    expect(result.formulas.some((f) => /REMAP\.BOUNDS/.test(f.cell.formula))).toBe(true);
    expect(bad.slice(0, 3)).toEqual([]);
  });

  test("Wave2!H (REMAP.BYGROUP) equals the engine's map by region applied to each household", () => {
    // Source: src/engine fitGroupedMapSync + apply called directly, with the survey weights and regions
    const map = fitGroupedMapSync(
      'quantile',
      s,
      w2.map((r) => r[4]),
      t,
      w1.map((r) => r[4]),
    );
    const want = map.apply(
      column(num(w2, 1)),
      w2.map((r) => r[4]),
    ).data;
    expect(Array.from(rangeNumbers(result.values, `Wave2!H2:H${w2.length + 1}`).data)).toEqual(Array.from(want));
  });

  test('Regions lists the four regions with their wave-2 and wave-1 row counts', () => {
    // Source: the demo data's own region column, counted here
    const count = (rows: string[][], g: string) => rows.filter((r) => r[4] === g).length;
    const sheet = result.values.Regions;
    expect(sheet[2][0]).toBe('group');
    const listed = sheet.slice(3, 7).map((r) => [r[0], r[1], r[2]]);
    const regions = listed.map((r) => r[0] as string);
    expect([...regions].sort()).toEqual(['Harbour', 'Hillside', 'Outskirts', 'Riverside']);
    for (const [g, ns, nt] of listed) expect([ns, nt]).toEqual([count(w2, g as string), count(w1, g as string)]);
  });

  test('Bounds: the middle column is the whole-sample map; each interval holds it', () => {
    // Source: src/engine fitMapSync('quantile') + apply called directly; a percentile interval of a bootstrap holds the
    // estimate in the middle of a smooth map (common practice; not guaranteed in general, so checked here on the demo data)
    const est = fitMapSync('quantile', s, t).apply(column(BOUND_INCOMES)).data;
    const got = rangeNumbers(result.values, `Bounds!B3:D${2 + BOUND_INCOMES.length}`);
    BOUND_INCOMES.forEach((_, i) => {
      expect(got.data[i * 3]).toBe(est[i]);
      expect(got.data[i * 3 + 1]).toBeLessThan(est[i]);
      expect(got.data[i * 3 + 2]).toBeGreaterThan(est[i]);
    });
  });

  test("Wave2!I (REMAP.TOTABLE) equals the engine's map onto the agency deciles; the median household lands near the published median", () => {
    // Source: src/engine fitFromTables called directly; the published median is exp(10.4) = 32,859.6 rounded to 32,900 (the curve's median)
    const table = quantileTable(
      AGENCY_DECILES.map((r) => r[0]),
      AGENCY_DECILES.map((r) => r[1]),
      'agency',
    );
    expect(AGENCY_DECILES[4]).toEqual([0.5, 32_900]);
    const map = fitFromTables('quantile', { kind: 'sample', sample: s }, { kind: 'quantiles', table });
    const want = map.apply(column(num(w2, 1))).data;
    expect(Array.from(rangeNumbers(result.values, `Wave2!I2:I${w2.length + 1}`).data)).toEqual(Array.from(want));
  });
});
