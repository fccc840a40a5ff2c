import { DuckDBInstance, type DuckDBConnection } from '@duckdb/node-api';
import { fitGroupedMapSync, sample, type GroupedMap, type GroupLabel } from '../../../src/engine';
import { groupedMapToSql } from '../../../src/engine/export/grouped-sql';
import { readDoubleColumns } from '../../../src/cli/duckdb-columns';
import { Random } from '../../../src/engine/stats/random';

/**
 * A map by group exported as SQL and run in a real engine (DuckDB, embedded) on 300,000 rows, compared with the
 * engine's own apply by group. The reference is DuckDB's evaluation of the text, independent of our code.
 */

const ROWS = 300_000;
let db: DuckDBInstance;
let conn: DuckDBConnection;
let a: Float64Array;
let b: Float64Array;
let region: string[];
let code: number[];

// The group of row i, in the table's text column (with stray spaces, which the map's group names do not have) and as an
// integer code. Design choice: a fixed pattern, every group in every stretch of rows, and a group the maps never saw.
const REGIONS = ['North', ' South', 'East ', 'West', 'Isle', 'Tiny'];
const regionOf = (i: number): string => REGIONS[(i * 7) % REGIONS.length];
const codeOf = (i: number): number => 10 + ((i * 5) % 4);

beforeAll(async () => {
  db = await DuckDBInstance.create(':memory:');
  conn = await db.connect();
  // Weyl sequences (golden-ratio steps) over and beyond the fitted ranges; every 50,021st value of a is NULL.
  await conn.run(`CREATE TABLE t AS SELECT i,
      CASE WHEN i % 50021 = 9 THEN NULL ELSE -6E0 + 1.6E1 * ((i * 6.180339887498949E-1) - floor(i * 6.180339887498949E-1)) END AS a,
      -4E0 + 1.2E1 * ((i * 4.142135623730951E-1) - floor(i * 4.142135623730951E-1)) AS b,
      list_extract(['North', ' South', 'East ', 'West', 'Isle', 'Tiny'], CAST((i * 7) % 6 AS INTEGER) + 1) AS region,
      CAST(10 + (i * 5) % 4 AS INTEGER) AS code
    FROM range(${ROWS}) r(i)`);
  const cols = await readDoubleColumns(conn, 'SELECT a, b FROM t ORDER BY i');
  [a, b] = cols.columns;
  region = Array.from({ length: ROWS }, (_, i) => regionOf(i));
  code = Array.from({ length: ROWS }, (_, i) => codeOf(i));
}, 60000);

afterAll(() => {
  conn?.closeSync();
});

/** Seeded samples by group: each group its own shape, so that the groups' maps differ. */
function grouped(
  seed: number,
  d: number,
  names: readonly GroupLabel[],
  sizes: readonly number[],
  shift: number,
): { s: ReturnType<typeof sample>; g: GroupLabel[] } {
  const r = new Random(seed);
  const rows: number[][] = [];
  const g: GroupLabel[] = [];
  names.forEach((name, k) => {
    for (let i = 0; i < sizes[k]; i++) {
      rows.push(Array.from({ length: d }, (_, j) => (k + 1) * (j === 0 ? r.normal() : r.uniform() * 2 - 1) + shift * k + (j === 1 ? Math.exp(r.normal()) : 0)));
      g.push(name);
    }
  });
  return { s: sample(rows), g };
}

/** Largest |sql - engine| / max(|engine|, 1) over rows whose group the map knows (or all rows, with a pooled map). */
async function compare(
  map: GroupedMap,
  options: { groupColumn: string; columns: string[]; direction?: 'apply' | 'invert' },
  groupsOf: GroupLabel[],
): Promise<number> {
  const { select, outputs } = groupedMapToSql(map.toJSON(), { table: 't', ...options });
  const sql = (await readDoubleColumns(conn, `SELECT ${outputs.join(', ')} FROM (${select}) AS q ORDER BY i`)).columns;
  const inputs = options.columns.map((c) => (c === 'a' ? a : b));
  const d = inputs.length;
  const known = new Set(map.entries.map((e) => e.group));
  const keep: number[] = [];
  for (let i = 0; i < ROWS; i++) {
    const g = String(groupsOf[i]).trim();
    const isNull = inputs.some((c) => Number.isNaN(c[i]));
    if (isNull || (!map.pooled && !known.has(g))) {
      // Source: design choice: a NULL value, or a group the map does not know and no pooled map, gives NULL.
      for (let k = 0; k < d; k++) expect(sql[k][i]).toBeNaN();
    } else keep.push(i);
  }
  const data = new Float64Array(keep.length * d);
  keep.forEach((i, r) => inputs.forEach((c, k) => (data[r * d + k] = c[i])));
  const labels = keep.map((i) => groupsOf[i]);
  const x = { n: keep.length, d, data };
  const mapped = options.direction === 'invert' ? map.invert(x, labels) : map.apply(x, labels);
  let worst = 0;
  keep.forEach((i, r) => {
    for (let k = 0; k < d; k++) {
      const e = mapped.data[r * d + k];
      const rel = Math.abs(sql[k][i] - e) / Math.max(Math.abs(e), 1);
      if (!(rel <= worst)) worst = rel;
    }
  });
  return worst;
}

// Source: design choice (the bound single maps meet too): within 1e-9 relative to max(|value|, 1).
const TOL = 1e-9;

describe("a map by group as SQL, run in DuckDB, equals the engine's apply by group", () => {
  test('quantile, tails=linear, pooled fallback (an unseen group, a group too small for its own map); and its inverse', async () => {
    const names = ['North', 'South', 'East', 'West', 'Tiny'];
    const src = grouped(1, 1, names, [800, 500, 300, 1200, 1], 2);
    const tgt = grouped(2, 1, names, [600, 900, 400, 700, 1], -1);
    const map = fitGroupedMapSync('quantile', src.s, src.g, tgt.s, tgt.g, { tails: 'linear' }, { fallback: 'pooled' });
    // Source: design choice: a group with one row on a side gets the pooled map, with its reason.
    expect(map.entries.find((e) => e.group === 'Tiny')!.map).toBeNull();
    expect(await compare(map, { groupColumn: 'region', columns: ['a'] }, region)).toBeLessThan(TOL);
    expect(await compare(map, { groupColumn: 'region', columns: ['b'], direction: 'invert' }, region)).toBeLessThan(TOL);
  }, 120000);

  test('step on integer group codes, no fallback: rows of unknown groups are NULL', async () => {
    const names = [10, 11, 12];
    const src = grouped(3, 1, names, [400, 300, 500], 1);
    const tgt = grouped(4, 1, names, [300, 600, 200], 3);
    const map = fitGroupedMapSync('step', src.s, src.g, tgt.s, tgt.g);
    expect(await compare(map, { groupColumn: 'code', columns: ['a'] }, code)).toBeLessThan(TOL);
  }, 120000);

  test('linear on two columns with a pooled fallback; apply and invert', async () => {
    const names = ['North', 'South', 'East', 'West'];
    const src = grouped(5, 2, names, [700, 800, 900, 1000], 2);
    const tgt = grouped(6, 2, names, [900, 700, 800, 600], -3);
    const map = fitGroupedMapSync('linear', src.s, src.g, tgt.s, tgt.g, {}, { fallback: 'pooled' });
    expect(await compare(map, { groupColumn: 'region', columns: ['a', 'b'] }, region)).toBeLessThan(TOL);
    expect(await compare(map, { groupColumn: 'region', columns: ['a', 'b'], direction: 'invert' }, region)).toBeLessThan(TOL);
  }, 120000);

  test('refuses entropic maps by group, and a missing group column', async () => {
    const names = ['North', 'South'];
    const src = grouped(7, 1, names, [100, 100], 1);
    const tgt = grouped(8, 1, names, [100, 100], 2);
    const map = fitGroupedMapSync('quantile', src.s, src.g, tgt.s, tgt.g);
    expect(() => groupedMapToSql(map.toJSON(), { table: 't', columns: ['a'], groupColumn: ' ' })).toThrow(/name the table's column holding each row's group/);
    const json = { ...map.toJSON(), method: 'entropic' as const };
    expect(() => groupedMapToSql(json, { table: 't', columns: ['a'], groupColumn: 'region' })).toThrow(/cannot be written as SQL.*fit a gradient-net map/);
  });
});
