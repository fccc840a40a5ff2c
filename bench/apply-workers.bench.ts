/**
 * Applying a heavy map from the command line with one thread and with several: the entropic map fitted on a report-half
 * family of the zoo (bench/zoo.ts; n = m = 4,000, d = 8) applied by `remap apply` to fresh rows (default 1,000,000;
 * goal <= 10 s), with --workers 1, 2, ... up to the processor count. Prints wall and CPU time per run, the speed-up
 * over one thread, the load average, and whether every run wrote the same bytes (it must: rows are mapped one by one).
 * First it measures the machine itself: a fixed arithmetic loop on one thread, then the same loop on as many threads at
 * once, so the speed-up of `remap apply` can be read against what the processors give to any code (on a virtual machine
 * whose processors share a physical core, two threads may do much less than twice the work of one).
 * Run: npm run bench -- apply-workers [--rows 1000000] [--family skew] [--method entropic]. Needs `npm run build:cli`.
 */
import { spawnSync } from 'child_process';
import { Worker } from 'worker_threads';
import { createHash } from 'crypto';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { fitMap } from '../src/engine';
import { REPORT_FAMILIES, zooPair, type FamilyName } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}
const load = (): string =>
  os
    .loadavg()
    .map((v) => v.toFixed(2))
    .join(' ');
const bin = path.resolve(__dirname, '..', 'bin', 'remap.js');

/** A loop of multiply-adds over a small table (about a second), as JavaScript source for a worker thread or this one. */
const LOOP = `(() => { const a = new Float64Array(4096).map((_, i) => Math.sin(i)); let s = 0;
  for (let r = 0; r < 250000; r++) for (let j = 0; j < 4096; j++) s += a[j] * a[(j * 7) & 4095]; return s; })()`;

/** Seconds for `threads` copies of LOOP run at once, each on its own worker thread. */
async function loopOn(threads: number): Promise<number> {
  const t = performance.now();
  await Promise.all(
    Array.from(
      { length: threads },
      () => new Promise<void>((done) => new Worker(`require('worker_threads').parentPort.postMessage(${LOOP})`, { eval: true }).once('message', () => done())),
    ),
  );
  return (performance.now() - t) / 1000;
}

async function main(): Promise<void> {
  const rows = Number(arg('rows', '1000000'));
  const cores = Math.max(2, os.availableParallelism());
  const alone = await loopOn(1);
  const together = await loopOn(cores);
  console.log(
    `the machine: one arithmetic loop ${alone.toFixed(2)} s on one thread; ${cores} copies at once ${together.toFixed(2)} s, ` +
      `so ${cores} threads do ${((cores * alone) / together).toFixed(2)}x the work of one (load ${load()})`,
  );
  const family = arg('family', 'skew') as FamilyName;
  const method = arg('method', 'entropic');
  if (!REPORT_FAMILIES.includes(family)) throw new Error(`--family must be one of the report half: ${REPORT_FAMILIES.join(', ')}`);
  const d = 8;
  const pair = zooPair(family, d, 4000, 4000, 1);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'remap-workers-'));
  try {
    const t0 = performance.now();
    const map = await fitMap(method, { ...pair.source, weights: null }, { ...pair.target, weights: null }, { seed: 7 });
    console.log(`${method} on ${family}, n = m = 4000, d = ${d}: fitted in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    fs.writeFileSync(path.join(dir, 'm.json'), JSON.stringify(map.toJSON()));
    const x = pair.fresh(rows, 5);
    const names = Array.from({ length: d }, (_, k) => `c${k + 1}`);
    const lines: string[] = [names.join(',')];
    for (let i = 0; i < rows; i++) lines.push(Array.from(x.data.subarray(i * d, (i + 1) * d), String).join(','));
    fs.writeFileSync(path.join(dir, 'x.csv'), lines.join('\n') + '\n');
    console.log(`${rows} fresh rows, ${(fs.statSync(path.join(dir, 'x.csv')).size / 1e6).toFixed(0)} MB of CSV; processors ${os.availableParallelism()}`);
    console.log('workers  wall s  cpu s  speed-up  same bytes  load');
    let one = NaN;
    let first = '';
    for (let w = 1; w <= cores; w++) {
      const t = performance.now();
      const out = path.join(dir, `y${w}.csv`);
      const r = spawnSync(
        process.execPath,
        [
          '-r',
          path.join(__dirname, 'peak-rss.js'),
          bin,
          'apply',
          '--model',
          path.join(dir, 'm.json'),
          '--input',
          path.join(dir, 'x.csv'),
          '--out',
          out,
          '--workers',
          String(w),
        ],
        {
          encoding: 'utf8',
        },
      );
      const s = (performance.now() - t) / 1000;
      if (r.status !== 0) throw new Error(`remap apply failed: ${r.stderr}`);
      const cpu = Number(/cpu-ms (\d+)/.exec(r.stderr)?.[1] ?? NaN) / 1000;
      const hash = createHash('sha256').update(fs.readFileSync(out)).digest('hex');
      fs.rmSync(out);
      if (w === 1) {
        one = s;
        first = hash;
      }
      console.log(
        `${String(w).padStart(7)}  ${s.toFixed(1).padStart(6)}  ${cpu.toFixed(1).padStart(5)}  ${(one / s).toFixed(2).padStart(8)}  ${String(hash === first).padStart(10)}  ${load()}`,
      );
    }
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
