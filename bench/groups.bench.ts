/**
 * Maps by group (run: npx tsx bench/groups.bench.ts). Goal: 200 groups of 50
 * rows per side fitted (and applied to the source rows) within a second for
 * each 1-D method. Also prints, in the same run, one fit on all 10,000 rows,
 * so the cost of grouping reads as a ratio. Seeded data; median of 5 runs;
 * the load average beside each figure (the machine may be shared).
 */
import * as os from 'os';
import { fitGroupedMapSync } from '../src/engine/groups/fit-grouped';
import { fitMapSync } from '../src/engine/methods';
import { Random } from '../src/engine/stats/random';

const GROUPS = 200;
const ROWS = 50;
const r = new Random(7);
const n = GROUPS * ROWS;
const make = (whole: boolean, shift: number) => {
  const data = new Float64Array(n);
  const weights = new Float64Array(n);
  const groups: string[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const g = i % GROUPS;
    data[i] = whole ? Math.floor(r.uniform() * 11) : g + shift + r.normal();
    weights[i] = 0.5 + r.uniform();
    groups[i] = `g${g}`;
  }
  return { sample: { n, d: 1, data, weights }, groups };
};

function median(f: () => void): number {
  const t: number[] = [];
  for (let k = 0; k < 5; k++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  return t.sort((a, b) => a - b)[2];
}

const load = () => os.loadavg()[0].toFixed(2);
console.log(`${GROUPS} groups x ${ROWS} rows per side, weighted; fit + apply to the ${n} source rows`);
for (const method of ['quantile', 'step', 'ordinal']) {
  const whole = method === 'ordinal';
  const s = make(whole, 0);
  const t = make(whole, 3);
  const values = { n, d: 1, data: s.sample.data };
  const grouped = median(() => {
    const m = fitGroupedMapSync(method, s.sample, s.groups, t.sample, t.groups);
    m.apply(values, s.groups);
  });
  const pooled = median(() => {
    const m = fitMapSync(method, s.sample, t.sample);
    m.apply(values);
  });
  console.log(
    `  ${method.padEnd(9)} by group ${grouped.toFixed(1)} ms (goal <= 1000 ms: ${grouped <= 1000 ? 'met' : 'NOT met'}); one fit on all rows ${pooled.toFixed(1)} ms; ratio ${(grouped / pooled).toFixed(1)}x; load ${load()}`,
  );
}
