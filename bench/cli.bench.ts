/**
 * Command-line benchmark (run: npx tsx bench/cli.bench.ts; needs `npm run build:cli` first).
 * Whole processes of the compiled `remap`: `methods` (goal <= 0.3 s), and fit and apply of a
 * 1,048,576-row quantile map from CSV, against the engine on the same rows plus reading the
 * file once (fs.readFileSync), measured in this run (goal: each <= 3x). Prints the load average.
 * Seeded data, written to a temporary folder.
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { fitMap } from '../src/engine';
import { Random } from '../src/engine/stats/random';

const N = 1_048_576;
const bin = path.resolve(__dirname, '..', 'bin', 'remap.js');

function run(args: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8', maxBuffer: 1 << 30 });
  if (r.status !== 0) throw new Error(`remap ${args.join(' ')} failed: ${r.stderr}`);
  return (performance.now() - t0) / 1000;
}

async function main(): Promise<void> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-bench-'));
  const r = new Random(5);
  const s = Float64Array.from({ length: N }, () => r.normal());
  const t = Float64Array.from({ length: N }, () => Math.exp(r.normal()));
  fs.writeFileSync(path.join(dir, 's.csv'), 'x\n' + Array.from(s, String).join('\n') + '\n');
  fs.writeFileSync(path.join(dir, 't.csv'), 'x\n' + Array.from(t, String).join('\n') + '\n');
  console.log(`load average before: ${os.loadavg().map((v) => v.toFixed(2)).join(' ')}`);
  const methods = Math.min(run(['methods']), run(['methods']), run(['methods']));
  console.log(`remap methods                 ${methods.toFixed(2)} s  (goal <= 0.3 s)`);
  const t0 = performance.now();
  fs.readFileSync(path.join(dir, 's.csv'), 'utf8');
  fs.readFileSync(path.join(dir, 't.csv'), 'utf8');
  const read = (performance.now() - t0) / 1000;
  const t1 = performance.now();
  const map = await fitMap('quantile', { n: N, d: 1, data: s, weights: null }, { n: N, d: 1, data: t, weights: null });
  const fitE = (performance.now() - t1) / 1000;
  const t2 = performance.now();
  map.apply({ n: N, d: 1, data: Float64Array.from(s).reverse() });
  const applyE = (performance.now() - t2) / 1000;
  const fit = run(['fit', '--source', path.join(dir, 's.csv'), '--target', path.join(dir, 't.csv'), '--out', path.join(dir, 'm.json')]);
  const apply = run(['apply', '--model', path.join(dir, 'm.json'), '--input', path.join(dir, 's.csv'), '--out', path.join(dir, 'y.csv')]);
  console.log(`reading both files once       ${read.toFixed(2)} s`);
  console.log(`engine fit / apply            ${fitE.toFixed(2)} s / ${applyE.toFixed(2)} s`);
  console.log(`remap fit (whole process)     ${fit.toFixed(2)} s  ${(fit / (fitE + read)).toFixed(1)}x engine + read (goal <= 3x)`);
  console.log(`remap apply (whole process)   ${apply.toFixed(2)} s  ${(apply / (applyE + read / 2)).toFixed(1)}x engine + read (goal <= 3x)`);
  console.log(`load average after: ${os.loadavg().map((v) => v.toFixed(2)).join(' ')}`);
  fs.rmSync(dir, { recursive: true, force: true });
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
