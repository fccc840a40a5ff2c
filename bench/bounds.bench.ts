/**
 * Bootstrap bounds (run: npx tsx bench/bounds.bench.ts). Goal: 1,000
 * bootstrap replicates of a 1-D quantile map with n = m = 100,000 in <= 5 s,
 * bounding the 99 percentiles of the source. Printed beside it, in the same
 * run: one fit of the map on the full samples (so the cost reads as
 * "replicates per fit"), and the load average. Seeded data.
 */
import * as os from 'os';
import { fitMapSync } from '../src/engine/methods';
import { Random } from '../src/engine/stats/random';
import { bootstrapBounds } from '../src/engine/uncertainty/bootstrap-bounds';

const n = 100_000;
const r = new Random(11);
const src = Float64Array.from({ length: n }, () => Math.exp(0.5 * r.normal()));
const tgt = Float64Array.from({ length: n }, () => 10 + 2 * r.normal());
const sorted = Float64Array.from(src).sort();
const values = Float64Array.from({ length: 99 }, (_, k) => sorted[Math.floor(((k + 1) / 100) * n)]);
const S = { n, d: 1, data: src, weights: null };
const T = { n, d: 1, data: tgt, weights: null };
const load = () => os.loadavg()[0].toFixed(2);

for (const method of ['quantile', 'step']) {
  const f0 = performance.now();
  fitMapSync(method, S, T).apply({ n: 99, d: 1, data: values });
  const fit = performance.now() - f0;
  const loadBefore = load();
  const t0 = performance.now();
  const b = bootstrapBounds(method, S, T, { n: 99, d: 1, data: values }, { replicates: 1000, seed: 1 });
  const secs = (performance.now() - t0) / 1000;
  console.log(
    `${method}: 1,000 bootstrap replicates, n = m = ${n}, 99 values: ${secs.toFixed(2)} s (goal <= 5 s: ${secs <= 5 ? 'met' : 'NOT met'}); ` +
      `one full fit ${fit.toFixed(0)} ms, so ${(secs * 1000 / fit).toFixed(0)} fits' time; median bound width ${(b.upper[49] - b.lower[49]).toPrecision(3)}; load ${loadBefore} -> ${load()}`,
  );
}
