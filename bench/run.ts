/**
 * Runs every bench/*.bench.ts once, one after another, each in its own `tsx` process,
 * printing its output as it comes (npm run bench). An optional argument keeps only the
 * benchmarks whose file name contains it: `npm run bench -- quantile`.
 * Exit code: 0 when every benchmark ran, 1 when one failed (the others still run), 2 when
 * the filter matches nothing.
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as path from 'path';

const dir = __dirname;
const filter = (process.argv[2] ?? '').trim().toLowerCase();
/** Arguments after the filter go to every chosen benchmark (npm run bench -- zoo --half tune). */
const passOn = process.argv.slice(3);
const all = fs
  .readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .sort();
const chosen = all.filter((f) => f.toLowerCase().includes(filter));

if (chosen.length === 0) {
  console.error(`bench: no benchmark matches "${filter}"; the benchmarks are ${all.map((f) => f.replace(/\.bench\.ts$/, '')).join(', ')}.`);
  process.exit(2);
}

const tsxCli = require.resolve('tsx/cli');
const failed: string[] = [];
for (const file of chosen) {
  console.log(`\n=== ${file} ===`);
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [tsxCli, path.join(dir, file), ...passOn], { cwd: path.resolve(dir, '..'), stdio: 'inherit' });
  const secs = ((performance.now() - t0) / 1000).toFixed(1);
  if (r.status !== 0) {
    failed.push(file);
    console.log(`=== ${file}: failed (exit ${r.status ?? r.signal}) after ${secs} s ===`);
  } else console.log(`=== ${file}: done in ${secs} s ===`);
}
if (failed.length > 0) {
  console.error(`bench: ${failed.length} of ${chosen.length} failed: ${failed.join(', ')}`);
  process.exit(1);
}
