import { DuckDBInstance, type DuckDBConnection } from '@duckdb/node-api';
import { fitMap, restoreMap, sample, type MapJSON, type TransportMap } from '../../../src/engine';
import { mapToSql } from '../../../src/engine/export/map-sql';
import { readDoubleColumns } from '../../../src/cli/duckdb-columns';
import { Random } from '../../../src/engine/stats/random';

/**
 * The exported SQL run in a real engine (DuckDB, embedded) on 1,000,000 rows,
 * compared with the engine's own apply. The reference is DuckDB's evaluation of
 * the text, independent of our code.
 */

const ROWS = 1_000_000;
let db: DuckDBInstance;
let conn: DuckDBConnection;
let a: Float64Array;
let b: Float64Array;
let s: Float64Array; // whole-number scores (and some values between them)

beforeAll(async () => {
  db = await DuckDBInstance.create(':memory:');
  conn = await db.connect();
  // Weyl sequences (golden-ratio steps) spread over the fitted ranges and beyond them on both sides;
  // every 100,003rd row is NULL. Design choice: deterministic data with no generator to seed.
  await conn.run(`CREATE TABLE t AS SELECT i,
      CASE WHEN i % 100003 = 7 THEN NULL ELSE -6E0 + 1.6E1 * ((i * 6.180339887498949E-1) - floor(i * 6.180339887498949E-1)) END AS a,
      -5E1 + 2.5E2 * ((i * 4.142135623730951E-1) - floor(i * 4.142135623730951E-1)) AS b,
      CASE WHEN i % 3 = 0 THEN -3E0 + 1.6E1 * ((i * 7.320508075688772E-1) - floor(i * 7.320508075688772E-1)) ELSE CAST(i % 14 AS DOUBLE) - 2E0 END AS s
    FROM range(${ROWS}) r(i)`);
  const cols = await readDoubleColumns(conn, 'SELECT a, b, s FROM t ORDER BY i');
  [a, b, s] = cols.columns;
}, 60000);

afterAll(() => {
  conn?.closeSync();
});

/** Runs the map's exported SQL over t and returns its result columns in row order. */
async function runSql(json: MapJSON, columns: string[], direction: 'apply' | 'invert' = 'apply'): Promise<Float64Array[]> {
  const { select, outputs } = mapToSql(json, { table: 't', columns, direction });
  const r = await readDoubleColumns(conn, `SELECT ${outputs.join(', ')} FROM (${select}) AS q ORDER BY i`);
  return r.columns;
}

/**
 * Largest |sql - engine| / max(|engine|, 1) over rows where no input is NULL. A NULL input must give
 * NULL (NaN here): in its own column for the column-by-column methods, in every column for joint ones.
 */
function worstRelative(map: TransportMap, inputs: Float64Array[], sql: Float64Array[], direction: 'apply' | 'invert' = 'apply'): number {
  const d = inputs.length;
  const joint = map.method === 'linear' || map.method === 'gradient-net';
  const keep: number[] = [];
  for (let i = 0; i < ROWS; i++) {
    const nulls = inputs.map((c) => Number.isNaN(c[i]));
    if (nulls.some((v) => v)) {
      sql.forEach((c, k) => {
        if (joint || nulls[k]) expect(c[i]).toBeNaN();
        else expect(c[i]).not.toBeNaN();
      });
    } else keep.push(i);
  }
  const data = new Float64Array(keep.length * d);
  keep.forEach((i, r) => {
    for (let k = 0; k < d; k++) data[r * d + k] = inputs[k][i];
  });
  const mapped = direction === 'apply' ? map.apply({ n: keep.length, d, data }) : map.invert({ n: keep.length, d, data });
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

function draws(seed: number, n: number, f: (r: Random) => number): number[] {
  const r = new Random(seed);
  return Array.from({ length: n }, () => f(r));
}

// Source: design choice: within 1e-9 relative to max(|value|, 1).
const TOL = 1e-9;

describe("SQL export run in DuckDB on 1,000,000 rows equals the engine's apply", () => {
  test('quantile, weighted, unequal sizes, tails=linear; and its inverse', async () => {
    const src = sample(
      draws(1, 3000, (r) => 2 + r.normal()),
      draws(2, 3000, (r) => 0.5 + r.uniform()),
    );
    const tgt = sample(draws(3, 2000, (r) => -Math.log(1 - r.uniform()) * 10));
    const map = await fitMap('quantile', src, tgt, { tails: 'linear' }, { columns: ['a'] });
    const json = map.toJSON();
    expect(worstRelative(map, [a], await runSql(json, ['a']))).toBeLessThan(TOL);
    expect(worstRelative(map, [b], await runSql(json, ['b'], 'invert'), 'invert')).toBeLessThan(TOL);
  });

  test('quantile on two columns, tails=clamp', async () => {
    const src = sample(draws(4, 1500, (r) => r.normal()).map((v, i) => [v, 40 * Math.sin(i) + 10]));
    const tgt = sample(draws(5, 1700, (r) => 3 * r.normal()).map((v, i) => [v * v, 100 * Math.cos(i)]));
    const map = await fitMap('quantile', src, tgt, { tails: 'clamp' });
    const out = await runSql(map.toJSON(), ['a', 'b']);
    expect(worstRelative(map, [a, b], out)).toBeLessThan(TOL);
  });

  test.each(['clamp', 'linear'])('step, weighted, tails=%s', async (tails) => {
    const src = sample(
      draws(6, 800, (r) => 4 * r.uniform()),
      draws(7, 800, (r) => 1 + r.int(3)),
    );
    const tgt = sample(draws(8, 500, (r) => Math.round(10 * r.normal()) / 10));
    const map = await fitMap('step', src, tgt, { tails });
    expect(worstRelative(map, [a], await runSql(map.toJSON(), ['a']))).toBeLessThan(TOL);
    expect(worstRelative(map, [a], await runSql(map.toJSON(), ['a'], 'invert'), 'invert')).toBeLessThan(TOL);
  });

  test.each(['clamp', 'linear'])('ordinal, weighted, tails=%s (scores with gaps)', async (tails) => {
    const src = sample(
      draws(9, 600, (r) => r.int(11)),
      draws(10, 600, (r) => 0.2 + r.uniform()),
    );
    const tgt = sample(draws(11, 700, (r) => (r.int(6) === 2 ? 0 : 2 * r.int(5))));
    const map = await fitMap('ordinal', src, tgt, { tails });
    expect(worstRelative(map, [s], await runSql(map.toJSON(), ['s']))).toBeLessThan(TOL);
    expect(worstRelative(map, [s], await runSql(map.toJSON(), ['s'], 'invert'), 'invert')).toBeLessThan(TOL);
  });

  test('linear on two columns, weighted; apply and invert', async () => {
    const src = sample(
      draws(12, 900, (r) => r.normal()).map((v, i) => [v, v * 5 + 20 * Math.sin(i)]),
      draws(13, 900, (r) => r.uniform()),
    );
    const tgt = sample(draws(14, 700, (r) => r.normal()).map((v, i) => [3 * v - 1, 50 * Math.cos(3 * i) - v]));
    const map = await fitMap('linear', src, tgt);
    expect(worstRelative(map, [a, b], await runSql(map.toJSON(), ['a', 'b']))).toBeLessThan(TOL);
    expect(worstRelative(map, [a, b], await runSql(map.toJSON(), ['a', 'b'], 'invert'), 'invert')).toBeLessThan(TOL);
  });

  /** A gradient-net map's JSON with chosen parameters (design choice), wrapped in a real map's envelope. */
  async function netJson(layers: number, tails: string): Promise<MapJSON> {
    const base = (
      await fitMap(
        'linear',
        sample([
          [0, 0],
          [1, 2],
          [3, 1],
          [2, 5],
        ]),
        sample([
          [1, 1],
          [2, 0],
          [0, 3],
          [4, 4],
        ]),
      )
    ).toJSON();
    const hidden = 5;
    const r = new Random(20 + layers);
    const w = Array.from({ length: hidden * 2 }, () => 1.5 * r.normal());
    return {
      ...base,
      method: 'gradient-net',
      settings: { ...base.settings, tails },
      params: {
        network: {
          hidden,
          layers,
          w,
          b: Array.from({ length: layers * hidden }, () => 2 * r.normal()),
          c: Array.from({ length: hidden }, () => 0.5 + r.uniform()),
          v: [0.7, 0.2, -0.1, 0.9],
          alpha: 0.05,
          beta: [0.3, -0.4],
        },
        source: { mean: [1.5, 20], scale: 40, lo: [-3, -20], hi: [7, 150] },
        target: { mean: [-2, 5], scale: 3, lo: [-9, -4], hi: [6, 14] },
      },
    };
  }

  test.each([
    [1, 'clamp'],
    [1, 'linear'],
    [3, 'clamp'],
    [3, 'linear'],
  ])('gradient-net with %i layer(s), tails=%s', async (layers, tails) => {
    const json = await netJson(layers, tails);
    const map = restoreMap(json);
    expect(worstRelative(map, [a, b], await runSql(json, ['a', 'b']))).toBeLessThan(TOL);
  });
});

describe('what SQL export refuses', () => {
  test('entropic and pairs maps: an error saying what to do instead', async () => {
    const pairs = await fitMap(
      'pairs',
      sample([
        [0, 1],
        [1, 0],
        [2, 2],
      ]),
      sample([
        [5, 1],
        [6, 0],
        [7, 3],
      ]),
    );
    expect(() => mapToSql(pairs.toJSON(), { table: 't', columns: ['a', 'b'] })).toThrow(/cannot be written as SQL.*gradient-net/);
  });

  test("a column list of the wrong length names the map's columns", async () => {
    const map = await fitMap('quantile', sample([1, 2, 3]), sample([4, 5, 7]), {}, { columns: ['income'] });
    expect(() => mapToSql(map.toJSON(), { table: 't', columns: ['a', 'b'] })).toThrow(/map takes 1.*income/);
  });

  test('the inverse of a gradient-net map', async () => {
    const json = await (async () => {
      const base = (
        await fitMap(
          'linear',
          sample([
            [0, 0],
            [1, 2],
            [3, 1],
            [2, 5],
          ]),
          sample([
            [1, 1],
            [2, 0],
            [0, 3],
            [4, 4],
          ]),
        )
      ).toJSON();
      return {
        ...base,
        method: 'gradient-net' as const,
        params: {
          network: { hidden: 1, layers: 1, w: [1, 1], b: [0], c: [1], v: [1, 0, 0, 1], alpha: 0.1, beta: [0, 0] },
          source: { mean: [0, 0], scale: 1, lo: [0, 0], hi: [1, 1] },
          target: { mean: [0, 0], scale: 1, lo: [0, 0], hi: [1, 1] },
        },
      };
    })();
    expect(() => mapToSql(json, { table: 't', columns: ['a', 'b'], direction: 'invert' })).toThrow(/no closed form/);
  });
});

describe('SQL text', () => {
  test('numbers are written as DOUBLE literals that read back to the same double', async () => {
    const { sqlNumber } = await import('../../../src/engine/export/sql-text');
    const values = [0.1, -2.5, 1e-300, 123456789.12345679, 2 ** 52 + 1, -0];
    const r = await conn.runAndReadAll(`SELECT ${values.map((v, k) => `typeof(${sqlNumber(v)}) AS t${k}, ${sqlNumber(v)} AS v${k}`).join(', ')}`);
    const row = r.getRowsJS()[0];
    values.forEach((v, k) => {
      // Source: DuckDB documentation, "Numeric literals": scientific notation gives a DOUBLE.
      expect(row[2 * k]).toBe('DOUBLE');
      expect(row[2 * k + 1]).toBe(v === 0 ? 0 : v);
    });
  });
});
