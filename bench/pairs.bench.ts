/**
 * Pairs method: time to find the exact optimal one-to-one matching of n source
 * rows to n target rows (d = 3), and its ratio to building the n x n table of
 * squared distances alone. Run: npx tsx bench/pairs.bench.ts
 * Data (seeded): source rows are sums of three uniforms (bell-shaped); target
 * rows are a skewed cloud, stretched and shifted, so the clouds barely overlap.
 */
import { squaredDistanceTable } from '../src/engine/pairs/cost-matrix';
import { findPairs } from '../src/engine/pairs/match-rows';
import type { Points } from '../src/engine/points';

function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

function samples(n: number, d: number, seed: number): [Points, Points] {
  const r = rng(seed);
  const x = new Float64Array(n * d).map(() => r() + r() + r() - 1.5);
  const y = new Float64Array(n * d).map((_, t) => 2 * r() ** 2 + (t % d) + 1);
  return [
    { n, d, data: x },
    { n, d, data: y },
  ];
}

const d = 3;
// Warm up the JIT on a small problem first.
{
  const [x, y] = samples(200, d, 1);
  squaredDistanceTable(x, y);
  findPairs(x, y);
}

const rows: string[][] = [['n', 'd', 'table ms', 'solve ms', 'solve / table', 'solve cpu ms', 'augmenting paths', 'W2^2']];
for (const n of [500, 1000, 2000]) {
  const [x, y] = samples(n, d, 42 + n);
  const t0 = performance.now();
  squaredDistanceTable(x, y);
  const t1 = performance.now();
  const cpu0 = process.cpuUsage();
  const found = findPairs(x, y);
  const cpu = process.cpuUsage(cpu0);
  const t2 = performance.now();
  const table = t1 - t0;
  const solve = t2 - t1;
  const cpuMs = ((cpu.user + cpu.system) / 1000).toFixed(0);
  const ratio = (solve / table).toFixed(1);
  rows.push([String(n), String(d), table.toFixed(1), solve.toFixed(0), ratio, cpuMs, String(found.augmentations), found.meanSquaredDistance.toFixed(4)]);
}
const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
for (const r of rows) console.log(r.map((v, c) => v.padStart(widths[c])).join('  '));
console.log('solve = findPairs (standardise, build the table, Jonker-Volgenant); table = squaredDistanceTable alone; cpu = this process only (the ' +
  'wall figures include waiting for a shared core).');
