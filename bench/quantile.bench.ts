/**
 * Quantile map benchmarks (run: npx tsx bench/quantile.bench.ts).
 * (a) fit + apply of the 1-D quantile map with n = m = 1,000,000, applied to
 *     the source values in their original (unsorted) order, against sorting both
 *     samples with Float64Array.prototype.sort in the same run. Goal: <= 1.5x.
 * (b) n = m = 100,000: the same map against the spreadsheet route of today:
 *     for each value its percent rank in the source (PERCENTRANK.INC: count of
 *     source values below it, by a linear scan, over n - 1) and then that
 *     percentile of the target (PERCENTILE.INC, R-7 interpolation, by a fresh
 *     selection in an unsorted copy of the target, as each cell recomputes it).
 *     That route is timed on the first 500 values and scaled linearly to n.
 *     Goal: the map >= 100x faster.
 * Seeded data; times are the median of a few runs. The machine may be shared:
 * each table prints the load average (os.loadavg) before and after it, and
 * (a) also gives the process CPU time (process.cpuUsage), which time spent
 * waiting for a core does not inflate; compare ratios within one run.
 */
import * as os from 'os';
import { prepareFit } from '../src/engine/methods';
import type { Sample } from '../src/engine/points';
import { quantileMethod } from '../src/engine/quantile/quantile-method';
import { Random } from '../src/engine/stats/random';

function normals(n: number, seed: number, mean: number, sd: number, lognormal = false): Float64Array {
  const random = new Random(seed);
  const r = () => random.uniform();
  const out = new Float64Array(n);
  for (let i = 0; i < n; i += 2) {
    const u = Math.max(r(), 1e-300);
    const v = r();
    const rad = Math.sqrt(-2 * Math.log(u));
    const z0 = rad * Math.cos(2 * Math.PI * v);
    const z1 = rad * Math.sin(2 * Math.PI * v);
    out[i] = lognormal ? Math.exp(mean + sd * z0) : mean + sd * z0;
    if (i + 1 < n) out[i + 1] = lognormal ? Math.exp(mean + sd * z1) : mean + sd * z1;
  }
  return out;
}

function asSample(data: Float64Array): Sample {
  return { n: data.length, d: 1, data, weights: null };
}

function time(f: () => void): number {
  const t0 = performance.now();
  f();
  return performance.now() - t0;
}

/** Wall-clock and CPU milliseconds of one call. */
function times(f: () => void): { wall: number; cpu: number } {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  f();
  const wall = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { wall, cpu: (c.user + c.system) / 1000 };
}

function load(): string {
  return os
    .loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function fitApply(src: Float64Array, tgt: Float64Array): Float64Array {
  const s = asSample(src);
  const t = asSample(tgt);
  const settings = prepareFit(quantileMethod, s, t, {});
  const map = quantileMethod.fit(s, t, settings, {}) as ReturnType<typeof quantileMethod.fromJSON>;
  return map.apply(s).data;
}

/** Fit, then apply to the source values in another order: the general lookup path (no fitted-source shortcut). */
function fitApplyOther(src: Float64Array, tgt: Float64Array, other: Float64Array): Float64Array {
  const s = asSample(src);
  const t = asSample(tgt);
  const settings = prepareFit(quantileMethod, s, t, {});
  const map = quantileMethod.fit(s, t, settings, {}) as ReturnType<typeof quantileMethod.fromJSON>;
  return map.apply({ n: other.length, d: 1, data: other }).data;
}

function sortBoth(src: Float64Array, tgt: Float64Array): void {
  Float64Array.from(src).sort();
  Float64Array.from(tgt).sort();
}

/** PERCENTRANK.INC(source, x) by one linear scan (x is a source value). */
function percentRankInc(source: Float64Array, x: number): number {
  let below = 0;
  for (let i = 0; i < source.length; i++) if (source[i] < x) below++;
  return below / (source.length - 1);
}

/** k-th smallest (0-based) of a by Hoare selection; rearranges a. */
function select(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (hi > lo) {
    const pivot = a[(lo + hi) >>> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** PERCENTILE.INC(target, p): R-7, by a fresh selection in an unsorted copy. */
function percentileInc(target: Float64Array, p: number): number {
  const a = Float64Array.from(target);
  const h = (a.length - 1) * p;
  const k = Math.floor(h);
  const lower = select(a, k);
  if (k + 1 >= a.length || h === k) return lower;
  let upper = Infinity;
  for (let i = k + 1; i < a.length; i++) if (a[i] < upper) upper = a[i];
  return lower + (h - k) * (upper - lower);
}

function workbookRoute(src: Float64Array, tgt: Float64Array, count: number): number {
  let check = 0;
  for (let i = 0; i < count; i++) check += percentileInc(tgt, percentRankInc(src, src[i]));
  return check;
}

function benchA(): void {
  const n = 1_000_000;
  const src = normals(n, 11, 50, 10);
  const tgt = normals(n, 12, 3, 0.5, true);
  for (let w = 0; w < 3; w++) {
    fitApply(src.subarray(0, 50_000).slice(), tgt.subarray(0, 50_000).slice()); // warm-up
    sortBoth(src.subarray(0, 50_000), tgt.subarray(0, 50_000));
  }
  const reversed = src.slice().reverse();
  const sorts: { wall: number; cpu: number }[] = [];
  const maps: { wall: number; cpu: number }[] = [];
  const others: { wall: number; cpu: number }[] = [];
  const before = load();
  for (let r = 0; r < 5; r++) {
    sorts.push(times(() => sortBoth(src, tgt)));
    maps.push(times(() => fitApply(src, tgt)));
    others.push(times(() => fitApplyOther(src, tgt, reversed)));
  }
  const after = load();
  const s = median(sorts.map((t) => t.wall));
  const m = median(maps.map((t) => t.wall));
  const o = median(others.map((t) => t.wall));
  const sc = median(sorts.map((t) => t.cpu));
  const mc = median(maps.map((t) => t.cpu));
  const oc = median(others.map((t) => t.cpu));
  console.log(`(a) n = m = 1,000,000, apply to the source values (unsorted); median of 5; load average ${before} before, ${after} after`);
  console.table([
    { step: 'sort both samples (Float64Array sort)', ms: +s.toFixed(1), ratio: 1, 'cpu ms': +sc.toFixed(1), 'cpu ratio': 1 },
    { step: 'quantile fit + apply to the source', ms: +m.toFixed(1), ratio: +(m / s).toFixed(2), 'cpu ms': +mc.toFixed(1), 'cpu ratio': +(mc / sc).toFixed(2) },
    {
      step: '(for reference) fit + apply to the source reversed (bucket lookups)',
      ms: +o.toFixed(1),
      ratio: +(o / s).toFixed(2),
      'cpu ms': +oc.toFixed(1),
      'cpu ratio': +(oc / sc).toFixed(2),
    },
  ]);
  console.log(`    fit + apply / sort both = ${(m / s).toFixed(2)}x wall, ${(mc / sc).toFixed(2)}x CPU (goal <= 1.5x)`);
}

function benchB(): void {
  const n = 100_000;
  const timed = 500;
  const src = normals(n, 21, 50, 10);
  const tgt = normals(n, 22, 3, 0.5, true);
  workbookRoute(src, tgt, 20); // warm-up
  fitApply(src, tgt);
  const before = load();
  const wb = time(() => workbookRoute(src, tgt, timed));
  const scaled = (wb * n) / timed;
  const maps: number[] = [];
  for (let r = 0; r < 3; r++) maps.push(time(() => fitApply(src, tgt)));
  const m = median(maps);
  console.log(
    `(b) n = m = 100,000; workbook route timed on the first ${timed} values and scaled linearly to ${n} (x${n / timed}); load average ` +
      `${before} before, ${load()} after`,
  );
  console.table([
    { step: `workbook route, ${timed} values (measured)`, ms: +wb.toFixed(1) },
    { step: `workbook route, ${n} values (scaled)`, ms: +scaled.toFixed(0) },
    { step: 'quantile fit + apply, all values', ms: +m.toFixed(1) },
  ]);
  console.log(`    workbook route (scaled) / quantile map = ${(scaled / m).toFixed(0)}x faster (goal >= 100x)`);
}

benchA();
benchB();
