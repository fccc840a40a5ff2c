import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { DuckDBInstance } from '@duckdb/node-api';
import { fitMap, sample } from '../../src/engine';
import { Random } from '../../src/engine/stats/random';
import { formatCSV } from '../../src/cli/csv';
import { readDoubleColumns } from '../../src/cli/duckdb-columns';
import { detectDialect, toStandardCSV } from '../../src/cli/dialect';
import { runCli } from '../helpers/run-cli';

function rowsOf(seed: number, n: number, f: (r: Random) => number[]): number[][] {
  const r = new Random(seed);
  return Array.from({ length: n }, () => f(r));
}

describe('fit from summaries computed by SQL', () => {
  test('the linear map from DuckDB means and covariances equals the one fitted from the rows, to 1e-12', async () => {
    const S = rowsOf(1, 5000, (r) => {
      const z = r.normal();
      return [2 + z, 10 * r.normal() + 3 * z, r.uniform()];
    });
    const T = rowsOf(2, 4000, (r) => {
      const z = r.normal();
      return [-1 + 2 * z, 5 * r.normal() - z, 4 * r.uniform() + z];
    });
    const db = await DuckDBInstance.create(':memory:');
    const conn = await db.connect();
    const summary = async (rows: number[][]): Promise<string> => {
      await conn.run('CREATE OR REPLACE TABLE x (a DOUBLE, b DOUBLE, c DOUBLE)');
      const app = await conn.createAppender('x');
      for (const r of rows) {
        for (const v of r) app.appendDouble(v);
        app.endRow();
      }
      app.closeSync();
      // The README's summary query (covar_pop divides by n, as the linear fit does).
      const cols = ['a', 'b', 'c'];
      const sql = [
        `SELECT 'n' AS stat, CAST(count(*) AS DOUBLE) AS a, CAST(NULL AS DOUBLE) AS b, CAST(NULL AS DOUBLE) AS c, 0 AS k FROM x`,
        `SELECT 'mean', avg(a), avg(b), avg(c), 1 FROM x`,
        ...cols.map((r, i) => `SELECT 'cov', ${cols.map((c) => `covar_pop(${r}, ${c})`).join(', ')}, ${2 + i} FROM x`),
      ].join(' UNION ALL ');
      const out = await conn.runAndReadAll(`SELECT stat, a, b, c FROM (${sql}) ORDER BY k`);
      return formatCSV([['stat', ...cols], ...out.getRowsJS().map((r) => r.map((v) => (v === null ? null : (v as string | number))))]);
    };
    const files: Record<string, string> = { 'S.csv': await summary(S), 'T.csv': await summary(T) };
    conn.closeSync();
    const r = await runCli(['fit', '--method', 'linear', '--source-moments', 'S.csv', '--target-moments', 'T.csv', '--out', 'm.json'], files);
    expect(r.err).toMatch(/fitted linear from summaries/);
    expect(r.code).toBe(0);
    const fromSummary = JSON.parse(files['m.json']).params;
    const fromRows = (await fitMap('linear', sample(S), sample(T))).toJSON().params as Record<string, number[]>;
    for (const f of ['matrix', 'mean1', 'mean2'] as const) {
      const scale = Math.max(...fromRows[f].map(Math.abs));
      // Source: design choice: within 1e-12, relative to the largest entry.
      fromRows[f].forEach((v, i) => expect(Math.abs(fromSummary[f][i] - v)).toBeLessThan(1e-12 * scale));
    }
  });

  test('a summary without a covariance row says what is missing', async () => {
    const files = { 'S.csv': 'stat,a\nn,10\nmean,1\n', 'T.csv': 'stat,a\nn,10\nmean,1\ncov,2\n' };
    const r = await runCli(['fit', '--source-moments', 'S.csv', '--target-moments', 'T.csv', '--out', 'm.json'], files);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/0 rows labelled cov/);
  });
});

describe('CSV dialects', () => {
  test('semicolons with decimal commas and quoted fields are detected, said, and read as numbers', async () => {
    const files: Record<string, string> = {
      's.csv': 'id;x\n"a;1";1,5\nb;2,5\nc;3,5\n',
      't.csv': 'id\tx\na\t10.5\nb\t20.5\nc\t30.5\n',
    };
    const r = await runCli(['fit', '--source', 's.csv', '--target', 't.csv', '--columns', 'x', '--out', 'm.json'], files);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/read s.csv as semicolon-separated, decimal comma/);
    expect(r.err).toMatch(/read t.csv as tab-separated, decimal point/);
    const a = await runCli(['apply', '--model', 'm.json', '--input', 's.csv'], files);
    // Source: equal sizes map the i-th smallest to the i-th smallest (fact of the trade).
    expect(a.out).toBe('id,x\na;1,10.5\nb,20.5\nc,30.5\n');
  });

  test('detection and conversion', () => {
    // Source: a semicolon-separated file as European spreadsheet locales save it (common practice).
    expect(detectDialect('a;b\n1,5;2\n')).toEqual({ delimiter: ';', decimal: ',' });
    expect(detectDialect('a,b\n1.5,2\n')).toEqual({ delimiter: ',', decimal: '.' });
    expect(toStandardCSV('a;b\n1,5;"x,y"\n', { delimiter: ';', decimal: ',' }, 'f')).toBe('a,b\n1.5,"x,y"\n');
  });

  test('a bad --delimiter is refused with the choices', async () => {
    const r = await runCli(['fit', '--source', 's.csv', '--target', 's.csv', '--delimiter', 'pipe', '--out', 'm.json'], { 's.csv': 'x\n1\n2\n3\n' });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/comma, semicolon, tab or auto/);
  });
});

describe('Parquet and the sql command', () => {
  test('fit from Parquet written by DuckDB, export SQL, run it in DuckDB: same numbers as remap apply', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-'));
    const db = await DuckDBInstance.create(':memory:');
    const conn = await db.connect();
    const src = path.join(dir, 's.parquet');
    const tgt = path.join(dir, 't.parquet');
    await conn.run(`COPY (SELECT 'r' || i AS id, sqrt(CAST(i AS DOUBLE)) AS x FROM range(1, 2001) r(i)) TO '${src}' (FORMAT parquet)`);
    await conn.run(`COPY (SELECT CAST(i AS DOUBLE) * 1.5E0 - 3E2 AS x FROM range(1, 1501) r(i)) TO '${tgt}' (FORMAT parquet)`);
    const files: Record<string, string> = {};
    const fit = await runCli(['fit', '--source', src, '--target', tgt, '--out', 'm.json', '--tails', 'linear'], files);
    expect(fit.err).toMatch(/as Parquet/);
    expect(fit.code).toBe(0);
    const sql = await runCli(['sql', '--model', 'm.json', '--table', 'v'], files);
    expect(sql.code).toBe(0);
    await conn.run(`CREATE TABLE v AS SELECT CAST(i AS DOUBLE) / 4E0 - 5E0 AS x FROM range(0, 300) r(i)`);
    const got = await readDoubleColumns(conn, `SELECT x_mapped FROM (${sql.out.replace(/;\s*$/, '')}) ORDER BY x`);
    conn.closeSync();
    const input = 'x\n' + Array.from({ length: 300 }, (_, i) => String(i / 4 - 5)).join('\n') + '\n';
    files['in.csv'] = input;
    const applied = await runCli(['apply', '--model', 'm.json', '--input', 'in.csv'], files);
    const want = applied.out.trim().split('\n').slice(1).map(Number);
    want.forEach((v, i) => expect(Math.abs(got.columns[0][i] - v)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(v))));
  });
  test('remap sql writes a map by group (with --group-column) that DuckDB runs to the values apply-groups gives', async () => {
    // Design choice: rows from a fixed formula; three regions, with a fourth in the values that only the pooled map covers.
    const regions = ['North', 'South', 'East'];
    const rows = (n: number, f: (i: number) => number) => 'region,x\n' + Array.from({ length: n }, (_, i) => `${regions[i % 3]},${f(i)}`).join('\n') + '\n';
    const files: Record<string, string> = {
      's.csv': rows(600, (i) => Math.sin(i) * (1 + (i % 3))),
      't.csv': rows(450, (i) => Math.cos(i * 1.3) * 5 + (i % 3) * 10),
    };
    const fit = await runCli(
      [
        'fit-groups',
        '--source',
        's.csv',
        '--target',
        't.csv',
        '--source-group-column',
        'region',
        '--target-group-column',
        'region',
        '--columns',
        'x',
        '--fallback',
        'pooled',
        '--out',
        'g.json',
      ],
      files,
    );
    expect(fit.code).toBe(0);
    expect((await runCli(['sql', '--model', 'g.json', '--table', 'v'], files)).err).toMatch(
      /map by group: give the table's column holding each row's group with --group-column/,
    );
    const sql = await runCli(['sql', '--model', 'g.json', '--table', 'v', '--group-column', 'region'], files);
    expect(sql.code).toBe(0);
    expect(sql.out).toMatch(/^-- remap: quantile map by group \(3 groups, the pooled map for others\)/);
    const values = Array.from({ length: 200 }, (_, i) => ({ region: i % 7 === 0 ? 'Isle' : regions[i % 3], x: i / 20 - 5 }));
    files['in.csv'] = 'region,x\n' + values.map((v) => `${v.region},${v.x}`).join('\n') + '\n';
    const applied = await runCli(['apply-groups', '--model', 'g.json', '--input', 'in.csv', '--group-column', 'region'], files);
    expect(applied.code).toBe(0);
    const db = await DuckDBInstance.create(':memory:');
    const conn = await db.connect();
    await conn.run(
      `CREATE TABLE v AS SELECT * FROM (VALUES ${values.map((v, i) => `(${i}, '${v.region}', ${v.x.toExponential()})`).join(', ')}) AS w(i, region, x)`,
    );
    const got = await readDoubleColumns(conn, `SELECT x_mapped FROM (${sql.out.replace(/;\s*$/, '')}) ORDER BY i`);
    conn.closeSync();
    const header = applied.out.split('\n')[0].split(',');
    const want = applied.out
      .trim()
      .split('\n')
      .slice(1)
      .map((l) => Number(l.split(',')[header.indexOf('x')]));
    // Source: DuckDB's evaluation of the exported text against the engine's apply by group (within 1e-12 relative).
    want.forEach((v, i) => expect(Math.abs(got.columns[0][i] - v)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(v))));
  });
});
