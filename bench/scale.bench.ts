/**
 * Scale benchmark (run: npx tsx bench/scale.bench.ts).
 * (a) A 1,048,576-row column (Excel's row limit) through each 1-D map (quantile, step, and
 *     ordinal on whole-number scores): fit, then apply to 1,048,576 FRESH values (a new
 *     seeded draw from the source's distribution, not the fitting rows, whose mapped copy
 *     the fit keeps and returns at once), by the engine; and quantile by the worksheet function
 *     path (calls.values with 1,048,576 x 1 arrays of numbers for values, source and target:
 *     coercion, fit, apply, cells, payload check; values = fresh draw).
 * (b) 200,000 x 5 through the linear map (fit, then apply to 200,000 fresh rows) by the engine.
 * Each scenario runs in its own child process (node --expose-gc with tsx), so that its peak
 * resident memory (process.resourceUsage().maxRSS) is its own; the child also reports
 * heapUsed and rss after a forced GC before and after the work, and the time to sort its
 * 1,048,576-value column (Float64Array.prototype.sort) in the same process, for the ratio.
 * Seeded data (src/engine/stats/random.ts). One timed run per scenario after a small warm-up.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';

const ROWS = 1_048_576;
const LINEAR_ROWS = 200_000;
const LINEAR_D = 5;

interface Result {
  scenario: string;
  ms: number;
  sortMs: number;
  baseRssMB: number;
  peakRssMB: number;
  heapBeforeMB: number;
  heapAfterMB: number;
  note: string;
}

const MB = 1024 * 1024;

async function child(scenario: string): Promise<void> {
  require('../src/engine/methods');
  const { Random } = require('../src/engine/stats/random') as typeof import('../src/engine/stats/random');
  const { fitMapSync } = require('../src/engine/methods') as typeof import('../src/engine/methods');
  const calls = require('../src/functions/calls') as typeof import('../src/functions/calls');

  const gc = (globalThis as { gc?: () => void }).gc ?? (() => undefined);
  const normals = (n: number, seed: number, mean: number, sd: number, log = false): Float64Array => {
    const r = new Random(seed);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const z = mean + sd * r.normal();
      out[i] = log ? Math.exp(z) : z;
    }
    return out;
  };
  const src = normals(ROWS, 11, 50, 10);
  const tgt = normals(ROWS, 12, 3, 0.5, true);
  const fresh = normals(ROWS, 13, 50, 10);
  const scores = (a: Float64Array, shift: number) => a.map((v) => Math.max(0, Math.min(100, Math.round(v + shift))));
  let work: () => string;
  const oneColumn = (method: string, s: Float64Array, t: Float64Array, x: Float64Array) => () => {
    const t0 = performance.now();
    const m = fitMapSync(method, { n: ROWS, d: 1, data: s, weights: null }, { n: ROWS, d: 1, data: t, weights: null });
    const t1 = performance.now();
    const out = m.apply({ n: ROWS, d: 1, data: x });
    return `fit ${(t1 - t0).toFixed(0)} ms, applied to ${out.n} fresh rows in ${(performance.now() - t1).toFixed(0)} ms (${out.outside} outside)`;
  };
  if (scenario === 'quantile-engine') work = oneColumn('quantile', src, tgt, fresh);
  else if (scenario === 'step-engine') work = oneColumn('step', src, tgt, fresh);
  else if (scenario === 'ordinal-engine') work = oneColumn('ordinal', scores(src, 0), scores(normals(ROWS, 14, 55, 15), 0), scores(fresh, 0));
  else if (scenario === 'quantile-cells') {
    const cells = (a: Float64Array) => Array.from(a, (v) => [v]);
    const s = cells(src);
    const t = cells(tgt);
    const x = cells(fresh);
    work = () => {
      try {
        const g = calls.values(x, s, t, 'quantile') as unknown[][];
        return `returned ${g.length} rows`;
      } catch (e) {
        return `refused: ${(e as Error).message.slice(0, 150)}...`;
      }
    };
  } else {
    const r = new Random(21);
    const a = new Float64Array(LINEAR_ROWS * LINEAR_D);
    const b = new Float64Array(LINEAR_ROWS * LINEAR_D);
    const x = new Float64Array(LINEAR_ROWS * LINEAR_D);
    for (let i = 0; i < a.length; i++) {
      a[i] = r.normal() * (1 + (i % LINEAR_D));
      b[i] = 2 * r.normal() + (i % LINEAR_D);
      x[i] = r.normal() * (1 + (i % LINEAR_D));
    }
    work = () => {
      const t0 = performance.now();
      const m = fitMapSync('linear', { n: LINEAR_ROWS, d: LINEAR_D, data: a, weights: null }, { n: LINEAR_ROWS, d: LINEAR_D, data: b, weights: null });
      const t1 = performance.now();
      const out = m.apply({ n: LINEAR_ROWS, d: LINEAR_D, data: x });
      return `fit ${(t1 - t0).toFixed(0)} ms, applied to ${out.n} fresh rows in ${(performance.now() - t1).toFixed(0)} ms`;
    };
  }
  // warm-up on a small slice so the JIT has compiled the hot loops
  fitMapSync('quantile', { n: 4096, d: 1, data: src.slice(0, 4096), weights: null }, { n: 4096, d: 1, data: tgt.slice(0, 4096), weights: null }).apply({
    n: 4096,
    d: 1,
    data: src.slice(0, 4096),
  });
  const sortCopy = src.slice();
  const t0 = performance.now();
  sortCopy.sort();
  const sortMs = performance.now() - t0;
  gc();
  const before = process.memoryUsage();
  const t1 = performance.now();
  const note = work();
  const ms = performance.now() - t1;
  const heapAfter = process.memoryUsage().heapUsed;
  const peak = process.resourceUsage().maxRSS * 1024;
  const result: Result = {
    scenario,
    ms,
    sortMs,
    baseRssMB: before.rss / MB,
    peakRssMB: peak / MB,
    heapBeforeMB: before.heapUsed / MB,
    heapAfterMB: heapAfter / MB,
    note,
  };
  process.stdout.write(JSON.stringify(result) + '\n');
}

function runChild(scenario: string): Result {
  const r = spawnSync(process.execPath, ['--expose-gc', '--max-old-space-size=4096', '--import', 'tsx', __filename, '--scenario', scenario], {
    cwd: path.resolve(__dirname, '..'),
    encoding: 'utf8',
    maxBuffer: 16 * MB,
  });
  const line = (r.stdout ?? '').trim().split('\n').pop() ?? '';
  try {
    return JSON.parse(line) as Result;
  } catch {
    throw new Error(`scenario ${scenario} failed (exit ${r.status}): ${r.stderr?.slice(-2000)}`);
  }
}

/** The 1, 5 and 15 minute load averages where the system reports them (Linux), else "unknown". */
function loadAverage(): string {
  try {
    return (require('fs') as typeof import('fs')).readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
  } catch {
    return 'unknown';
  }
}

function parent(): void {
  console.log(
    `Scale benchmark: ${ROWS.toLocaleString('en-US')}-row column (quantile, step, ordinal), ${LINEAR_ROWS.toLocaleString('en-US')} x ${LINEAR_D} (linear); maps applied to fresh values; each scenario in its own process; load ${loadAverage()}`,
  );
  const rows: string[][] = [['scenario', 'ms', 'sort ms', 'x sort', 'peak RSS MB', 'RSS before MB', 'heap before MB', 'heap after MB', 'outcome']];
  for (const s of ['quantile-engine', 'step-engine', 'ordinal-engine', 'quantile-cells', 'linear-engine']) {
    const r = runChild(s);
    rows.push([
      r.scenario,
      r.ms.toFixed(0),
      r.sortMs.toFixed(0),
      (r.ms / r.sortMs).toFixed(2),
      r.peakRssMB.toFixed(0),
      r.baseRssMB.toFixed(0),
      r.heapBeforeMB.toFixed(0),
      r.heapAfterMB.toFixed(0),
      r.note,
    ]);
  }
  const widths = rows[0].map((_, k) => Math.max(...rows.map((row) => (k === rows[0].length - 1 ? 0 : row[k].length))));
  for (const row of rows) console.log(row.map((c, k) => (k === row.length - 1 ? c : c.padStart(widths[k]))).join('  '));
  console.log(
    'x sort: the scenario time over the time to sort the 1,048,576-value column with Float64Array.prototype.sort, both measured in the ' + 'same process.',
  );
  console.log('peak RSS: the process high-water mark (includes the input arrays and the runtime, about 60-100 MB with tsx).');
}

const at = process.argv.indexOf('--scenario');
if (at >= 0) void child(process.argv[at + 1]);
else parent();
