/**
 * SQL export benchmark (run: npx tsx bench/sql-export.bench.ts).
 * Runs the exported SQL of quantile maps with K = 100, 2,000 and 20,000 knots
 (two small knot tables joined on a bucket number), a linear map and a gradient network on
 * 1,000,000 rows in DuckDB (embedded, in memory), summing each result column
 * so that reading rows back is not timed, against the same query with the
 * plain column (the cost of the scan itself). Prints seconds and the ratio to
 * the scan, with the load average; seeded data.
 */
import * as os from 'os';
import { DuckDBInstance } from '@duckdb/node-api';
import { fitMap, sample } from '../src/engine';
import { mapToSql } from '../src/engine/export/map-sql';
import { Random } from '../src/engine/stats/random';

async function main(): Promise<void> {
  const db = await DuckDBInstance.create(':memory:');
  const conn = await db.connect();
  await conn.run(`CREATE TABLE t AS SELECT i, -4E0 + 1.2E1 * ((i * 6.180339887498949E-1) - floor(i * 6.180339887498949E-1)) AS a,
    -1E1 + 3E1 * ((i * 4.142135623730951E-1) - floor(i * 4.142135623730951E-1)) AS b FROM range(1000000) r(i)`);
  const time = async (sql: string): Promise<number> => {
    let best = Infinity;
    for (let rep = 0; rep < 3; rep++) {
      const t0 = performance.now();
      await conn.runAndReadAll(sql);
      best = Math.min(best, performance.now() - t0);
    }
    return best / 1000;
  };
  const r = new Random(1);
  console.log(
    `load average before: ${os
      .loadavg()
      .map((v) => v.toFixed(2))
      .join(' ')}`,
  );
  const scan = await time('SELECT sum(a), sum(b) FROM t');
  console.log(`scan (sum of the plain columns)          ${scan.toFixed(3)} s`);
  for (const n of [50, 1000, 10000]) {
    const src = sample(Array.from({ length: 2 * n }, () => 4 + 2 * r.normal()));
    const tgt = sample(Array.from({ length: 2 * n + 1 }, () => -Math.log(1 - r.uniform())));
    const json = (await fitMap('quantile', src, tgt)).toJSON();
    const K = (json.params as { columns: { xs: number[] }[] }).columns[0].xs.length;
    const { select } = mapToSql(json, { table: 't', columns: ['a'] });
    const secs = await time(`SELECT sum(a_mapped) FROM (${select}) AS q`);
    console.log(
      `quantile, K = ${String(K).padEnd(6)} (${(select.length / 1024).toFixed(0).padStart(5)} KB SQL)  ${secs.toFixed(3)} s  ${(secs / scan).toFixed(1)}x the scan`,
    );
  }
  const lin = await fitMap(
    'linear',
    sample(Array.from({ length: 500 }, () => [r.normal(), r.normal() + r.uniform()])),
    sample(Array.from({ length: 500 }, () => [r.normal() * 3, r.uniform()])),
  );
  const le = mapToSql(lin.toJSON(), { table: 't', columns: ['a', 'b'] }).select;
  const ls = await time(`SELECT sum(a_mapped), sum(b_mapped) FROM (${le}) AS q`);
  console.log(`linear, 2 columns                        ${ls.toFixed(3)} s  ${(ls / scan).toFixed(1)}x the scan`);
  console.log(
    `load average after: ${os
      .loadavg()
      .map((v) => v.toFixed(2))
      .join(' ')}`,
  );
  conn.closeSync();
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
