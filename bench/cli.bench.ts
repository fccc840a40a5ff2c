/**
 * Command-line benchmark (run: npm run bench -- cli; needs `npm run build:cli` first).
 * Whole processes of the compiled `remap`: `methods` (goal <= 0.3 s), and fit and apply of
 * 1,048,576 rows from CSV, one column (quantile) and five columns (linear), on one thread
 * (--workers 1) and with the automatic thread count (one per processor from 32 MB), each against
 * the engine on the same rows plus reading the file(s) once (fs.readFileSync), measured in this run
 * (goal: each <= 3x). The engine's fit is timed twice: the fit alone, and the fit with the map's
 * saved JSON (toJSON computes the report the command saves: the comparisons after fitting, a
 * KS statistic over every row); the command's fit is compared with both. Prints the load average,
 * the processor count, the CPU time of each process and its peak memory (maxRSS).
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
const load = (): string =>
  os
    .loadavg()
    .map((v) => v.toFixed(2))
    .join(' ');

/** Seconds, CPU seconds (all threads) and peak resident memory (MB) of one whole `remap` process. */
function run(args: string[]): { s: number; cpu: number; mb: number } {
  const t0 = performance.now();
  // /usr/bin/time is not everywhere: the process reports its own peak and CPU time through an exit hook.
  const r = spawnSync(process.execPath, ['-r', path.join(__dirname, 'peak-rss.js'), bin, ...args], { encoding: 'utf8', maxBuffer: 1 << 30 });
  const s = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`remap ${args.join(' ')} failed: ${r.stderr}`);
  const m = /peak-rss (\d+)/.exec(r.stderr);
  const c = /cpu-ms (\d+)/.exec(r.stderr);
  return { s, cpu: c ? Number(c[1]) / 1000 : NaN, mb: m ? Number(m[1]) / 1024 : NaN };
}

function writeColumns(file: string, cols: Float64Array[], names: string[]): void {
  const lines: string[] = [names.join(',')];
  for (let i = 0; i < N; i++) lines.push(cols.map((c) => String(c[i])).join(','));
  fs.writeFileSync(file, lines.join('\n') + '\n');
}

function readOnce(...files: string[]): number {
  const t0 = performance.now();
  for (const f of files) fs.readFileSync(f, 'utf8');
  return (performance.now() - t0) / 1000;
}

async function main(): Promise<void> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-bench-'));
  const f = (name: string) => path.join(dir, name);
  const r = new Random(5);
  const s = Float64Array.from({ length: N }, () => r.normal());
  const t = Float64Array.from({ length: N }, () => Math.exp(r.normal()));
  writeColumns(f('s.csv'), [s], ['x']);
  writeColumns(f('t.csv'), [t], ['x']);
  const D = 5;
  const s5 = Array.from({ length: D }, () => Float64Array.from({ length: N }, () => r.normal()));
  const t5 = Array.from({ length: D }, (_, k) => Float64Array.from({ length: N }, () => 2 * r.normal() + k));
  const names5 = Array.from({ length: D }, (_, k) => `c${k + 1}`);
  writeColumns(f('s5.csv'), s5, names5);
  writeColumns(f('t5.csv'), t5, names5);
  console.log(`load average before: ${load()}`);
  const methods = Math.min(run(['methods']).s, run(['methods']).s, run(['methods']).s);
  console.log(`remap methods                 ${methods.toFixed(2)} s  (goal <= 0.3 s)`);

  const cases = [
    { label: '1 column, quantile', method: 'quantile', d: 1, src: s, tgt: t, files: ['s.csv', 't.csv'] },
    { label: '5 columns, linear', method: 'linear', d: D, src: interleave(s5), tgt: interleave(t5), files: ['s5.csv', 't5.csv'] },
  ];
  console.log(`processors: ${os.availableParallelism()}`);
  for (const c of cases) {
    const read2 = readOnce(f(c.files[0]), f(c.files[1]));
    const read1 = readOnce(f(c.files[0]));
    const t1 = performance.now();
    const map = await fitMap(c.method, { n: N, d: c.d, data: c.src, weights: null }, { n: N, d: c.d, data: c.tgt, weights: null });
    const fitE = (performance.now() - t1) / 1000;
    JSON.stringify(map.toJSON());
    const fitJ = (performance.now() - t1) / 1000;
    const t2 = performance.now();
    // The rows in another order than fitted: the engine then does the full work of an unseen input.
    map.apply({ n: N, d: c.d, data: reverseRows(c.src, c.d) });
    const applyE = (performance.now() - t2) / 1000;
    map.dispose();
    console.log(`${c.label}: file ${(fs.statSync(f(c.files[0])).size / 1e6).toFixed(0)} MB; load ${load()}`);
    console.log(`  reading the file(s) once    ${read2.toFixed(2)} s (both) / ${read1.toFixed(2)} s (one)`);
    console.log(`  engine fit / fit + saved JSON / apply   ${fitE.toFixed(2)} s / ${fitJ.toFixed(2)} s / ${applyE.toFixed(2)} s`);
    for (const workers of ['1', 'auto']) {
      const more = workers === 'auto' ? [] : ['--workers', workers];
      const fit = run(['fit', '--method', c.method, '--source', f(c.files[0]), '--target', f(c.files[1]), '--out', f('m.json'), ...more]);
      const apply = run(['apply', '--model', f('m.json'), '--input', f(c.files[0]), '--out', f('y.csv'), ...more]);
      const label = workers === '1' ? 'one thread' : 'threads (auto)';
      console.log(
        `  remap fit, ${label.padEnd(14)} ${fit.s.toFixed(2)} s (cpu ${fit.cpu.toFixed(2)} s)  ${(fit.s / (fitJ + read2)).toFixed(1)}x engine fit + JSON + read, ` +
          `${(fit.s / (fitE + read2)).toFixed(1)}x engine fit alone + read (goal <= 3x), peak ${fit.mb.toFixed(0)} MB`,
      );
      console.log(
        `  remap apply, ${label.padEnd(14)} ${apply.s.toFixed(2)} s (cpu ${apply.cpu.toFixed(2)} s)  ${(apply.s / (applyE + read1)).toFixed(1)}x engine + read (goal <= 3x), peak ${apply.mb.toFixed(0)} MB`,
      );
    }
  }
  console.log(`load average after: ${load()}`);
  fs.rmSync(dir, { recursive: true, force: true });
}

function interleave(cols: Float64Array[]): Float64Array {
  const d = cols.length;
  const out = new Float64Array(N * d);
  for (let i = 0; i < N; i++) for (let k = 0; k < d; k++) out[i * d + k] = cols[k][i];
  return out;
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});

function reverseRows(x: Float64Array, d: number): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < N; i++) for (let k = 0; k < d; k++) out[(N - 1 - i) * d + k] = x[i * d + k];
  return out;
}
