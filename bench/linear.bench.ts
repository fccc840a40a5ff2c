/**
 * Linear map: fit + apply on n = 100,000 rows, d = 10, against one covariance
 * pass over the source. Goal: fit + apply <= 3x one covariance pass.
 * Two references for "one covariance pass": ml-matrix `covariance` of the same
 * data (the Matrix is built before timing) and a plain Float64Array two-pass
 * loop (means, then centred products of the upper triangle).
 * Times are medians of REPEATS runs after one warm-up. Run: npx tsx bench/linear.bench.ts
 */
import { covariance, Matrix } from 'ml-matrix';
import { fitLinear } from '../src/engine/linear/fit';
import type { Sample } from '../src/engine/points';
import { weightedMoments } from '../src/engine/stats/moments';

const N = 100_000;
const D = 10;
const REPEATS = 5;

function makeSample(n: number, d: number, seed: number, shift: number, scale: number): Sample {
  let s = seed >>> 0;
  const u = (): number => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (((z ^ (z >>> 16)) >>> 0) + 0.5) / 4294967296;
  };
  const data = new Float64Array(n * d);
  const z = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < d; k++) z[k] = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    // Correlated columns: each mixes in its neighbour.
    for (let k = 0; k < d; k++) data[i * d + k] = shift + scale * (k + 1) * (z[k] + 0.5 * z[(k + 1) % d]);
  }
  return { n, d, data, weights: null };
}

function plainCovariance(data: Float64Array, n: number, d: number): Float64Array {
  const mean = new Float64Array(d);
  for (let i = 0, j = 0; i < n; i++) for (let k = 0; k < d; k++, j++) mean[k] += data[j];
  for (let k = 0; k < d; k++) mean[k] /= n;
  const acc = new Float64Array(d * d);
  const row = new Float64Array(d);
  for (let i = 0, j = 0; i < n; i++) {
    for (let k = 0; k < d; k++, j++) row[k] = data[j] - mean[k];
    for (let k = 0; k < d; k++) {
      const a = row[k];
      for (let l = k; l < d; l++) acc[k * d + l] += a * row[l];
    }
  }
  for (let k = 0; k < d; k++) for (let l = k; l < d; l++) acc[l * d + k] = acc[k * d + l] /= n;
  return acc;
}

function median(f: () => unknown): number {
  f();
  const times: number[] = [];
  for (let r = 0; r < REPEATS; r++) {
    const t = performance.now();
    f();
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(REPEATS / 2)];
}

const source = makeSample(N, D, 1, 0, 1);
const target = makeSample(N, D, 2, 3, 2);
const rows: number[][] = [];
for (let i = 0; i < N; i++) rows.push(Array.from(source.data.subarray(i * D, (i + 1) * D)));
const mlSource = new Matrix(rows);

const tMl = median(() => covariance(mlSource));
const tPlain = median(() => plainCovariance(source.data, N, D));
const tMoments = median(() => weightedMoments(source));
const tCore = median(() => fitLinear(source, target, { ridge: 0 }, {}, { compare: false }).apply(source));
const tFull = median(() => {
  const map = fitLinear(source, target, { ridge: 0 });
  map.apply(source);
  map.diagnostics(); // the energy distances and KS are computed on first read
});

const table = [
  { step: 'ml-matrix covariance (reference A)', ms: tMl },
  { step: 'plain two-pass covariance (reference B)', ms: tPlain },
  { step: 'weightedMoments (source)', ms: tMoments },
  { step: 'linear fit + apply (map only)', ms: tCore },
  { step: 'linear fit + apply + diagnostics (energy/KS)', ms: tFull },
].map((r) => ({
  step: r.step,
  ms: Number(r.ms.toFixed(1)),
  'x ref A (ml-matrix)': Number((r.ms / tMl).toFixed(2)),
  'x ref B (plain loop)': Number((r.ms / tPlain).toFixed(2)),
  'x weightedMoments': Number((r.ms / tMoments).toFixed(2)),
}));
console.log(`linear map, n = ${N}, d = ${D}, median of ${REPEATS} runs; goal: fit + apply (map only) <= 3x one covariance pass`);
console.table(table);
