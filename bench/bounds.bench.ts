/**
 * Bootstrap bounds (run: npx tsx bench/bounds.bench.ts). Goal: 1,000
 * bootstrap replicates of a 1-D quantile map with n = m = 100,000 in <= 5 s,
 * bounding 1,000 values (the source's quantiles at 0.05 %, 0.15 %, ..., 99.95 %).
 * Printed beside it, in the same run: one fit of the map on the full samples
 * (the median of five; so the cost reads as "fits' time"), the general refit of a replicate (the
 * method's own column builder, as before the fast readers) timed on 20
 * replicates, and the load average. Seeded data.
 */
import * as os from 'os';
import { fitMapSync } from '../src/engine/methods';
import { Random } from '../src/engine/stats/random';
import { bootstrapBounds } from '../src/engine/uncertainty/bootstrap-bounds';
import { bootstrapReplicates } from '../src/engine/uncertainty/bootstrap-replicates';
import { ReplicateFitter } from '../src/engine/uncertainty/replicate-fitter';

const n = 100_000;
const v = 1000;
const r = new Random(11);
const src = Float64Array.from({ length: n }, () => Math.exp(0.5 * r.normal()));
const tgt = Float64Array.from({ length: n }, () => 10 + 2 * r.normal());
const sorted = Float64Array.from(src).sort();
const values = { n: v, d: 1, data: Float64Array.from({ length: v }, (_, k) => sorted[Math.floor(((k + 0.5) / v) * n)]) };
const S = { n, d: 1, data: src, weights: null };
const T = { n, d: 1, data: tgt, weights: null };
const load = () => os.loadavg()[0].toFixed(2);

for (const method of ['quantile', 'step'] as const) {
  // Warm up both paths once, then time.
  fitMapSync(method, S, T).apply(values);
  bootstrapBounds(method, S, T, values, { replicates: 20, seed: 2 });
  // One full fit (fit and map the values): the median of five, the machine being shared.
  const fits: number[] = [];
  for (let k = 0; k < 5; k++) {
    const f0 = performance.now();
    fitMapSync(method, S, T).apply(values);
    fits.push(performance.now() - f0);
  }
  const fit = fits.sort((a, b) => a - b)[2];
  const loadBefore = load();
  const t0 = performance.now();
  const b = bootstrapBounds(method, S, T, values, { replicates: 1000, seed: 1 });
  const secs = (performance.now() - t0) / 1000;
  const fitter = new ReplicateFitter(method, S, T, values, { tails: 'clamp' });
  const g0 = performance.now();
  bootstrapReplicates(fitter, S, T, 20, v, 1, 'refit');
  const general = (performance.now() - g0) / 20;
  console.log(
    `${method}: 1,000 bootstrap replicates, n = m = ${n}, ${v} values: ${secs.toFixed(2)} s (goal <= 5 s: ${secs <= 5 ? 'met' : 'NOT met'}), ` +
      `${secs.toFixed(2)} ms per replicate; one full fit ${fit.toFixed(0)} ms, so ${((secs * 1000) / fit).toFixed(1)} fits' time for 1,000 replicates; ` +
      `general refit ${general.toFixed(1)} ms per replicate (${((general * 1000) / (secs * 1000)).toFixed(1)} x the fast way); ` +
      `median bound width ${(b.upper[v / 2] - b.lower[v / 2]).toPrecision(3)}; load ${loadBefore} -> ${load()}`,
  );
}
