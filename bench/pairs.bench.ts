/**
 * Pairs method: time to find the exact optimal one-to-one matching of n source rows to n target
 * rows, d = 3, on the bench zoo's report half (bench/zoo.ts: skew, shift, clusters, ties) and on the
 * bell-shaped/skewed pair used before the zoo; and, in the same run, the exact solver started cold
 * (findPairs with coldStart: column reduction, as before the auction warm start), for the ratio.
 * Run: npm run bench -- pairs [--n 500,2000,5000] [--cold]   (--cold adds the cold solver, which takes
 * tens of seconds at 5,000 rows). Goals: n = 2,000 in <= 3 s; n = 5,000 inside the default 120 s budget.
 * Wall and CPU time are both printed, with the load average: the machine may be shared.
 */
import * as os from 'os';
import { findPairs } from '../src/engine/pairs/match-rows';
import type { Points } from '../src/engine/points';
import { REPORT_FAMILIES, zooPair } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}
const cpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}
function bellAndSkew(n: number, d: number, seed: number): [Points, Points] {
  const r = rng(seed);
  const x = new Float64Array(n * d).map(() => r() + r() + r() - 1.5);
  const y = new Float64Array(n * d).map((_, t) => 2 * r() ** 2 + (t % d) + 1);
  return [
    { n, d, data: x },
    { n, d, data: y },
  ];
}

const d = 3;
const sizes = arg('n', '500,2000,5000').split(',').map(Number);
const cold = process.argv.includes('--cold');
{
  const [x, y] = bellAndSkew(200, d, 1);
  findPairs(x, y); // warm up the JIT
}
console.log(
  `pairs, d = ${d}; load average ${os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
console.log('data          n    wall s   cpu s   augmenting paths   W2^2          cold wall s   cold / warm   load');
const walls = new Map<number, number[]>();
for (const n of sizes) {
  const sets: [string, Points, Points][] = [['bell/skew', ...bellAndSkew(n, d, 42 + n)]];
  for (const f of REPORT_FAMILIES) {
    const p = zooPair(f, d, n, n, 1);
    sets.push([f, p.source, p.target]);
  }
  for (const [name, x, y] of sets) {
    const t0 = performance.now();
    const c0 = cpuMs();
    const found = findPairs(x, y);
    const wall = (performance.now() - t0) / 1000;
    const cpu = (cpuMs() - c0) / 1000;
    walls.set(n, [...(walls.get(n) ?? []), wall]);
    let coldCells = '-'.padStart(11) + '   ' + '-'.padStart(11);
    if (cold) {
      const t1 = performance.now();
      const same = findPairs(x, y, { coldStart: true });
      const c = (performance.now() - t1) / 1000;
      if (Math.abs(same.meanSquaredDistance - found.meanSquaredDistance) > 1e-9 * found.meanSquaredDistance) console.log('  (cold and warm totals differ!)');
      coldCells = `${c.toFixed(2).padStart(11)}   ${(c / wall).toFixed(1).padStart(11)}`;
    }
    console.log(
      `${name.padEnd(10)} ${String(n).padStart(5)}  ${wall.toFixed(2).padStart(7)}  ${cpu.toFixed(2).padStart(6)}  ${String(found.augmentations).padStart(17)}   ${found.meanSquaredDistance.toPrecision(6).padEnd(12)}  ${coldCells}   ${os.loadavg()[0].toFixed(2)}`,
    );
  }
}
for (const [n, w] of walls) console.log(`n = ${n}: worst ${Math.max(...w).toFixed(2)} s wall over ${w.length} data sets`);
console.log(
  'wall s, cpu s: findPairs (standardise, table, auction prices, exact Jonker-Volgenant); cold: findPairs with coldStart (no auction prices), the same optimum.',
);
