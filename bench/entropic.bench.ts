/**
 * Entropic method benchmark (run: npx tsx bench/entropic.bench.ts; SWEEP=1 adds
 * the eps-factor sweep behind the default-eps rule).
 * 1. Speed, n = m = 4,000, d = 8: total fit time (three Sinkhorn solves, the
 *    Jacobian check) and ms per Sinkhorn iteration of the stabilised kernel form
 *    next to a plain typed-array log-domain iteration doing the same arithmetic
 *    with Math.exp on every entry (the naive reference).
 * 2. Accuracy on the known-truth pair of bench/truth.ts: L2-UVP of the entropic
 *    map against the Brenier map grad phi on 2,000 fresh points, d = 2, 4, 8, n = 4,000.
 * Figures are measured in one run; ratios matter more than absolute times.
 */
import { fitEntropic } from '../src/engine/entropic/fit';
import { buildKernelRecentred } from '../src/engine/entropic/kernel';
import { fusedScalingPass } from '../src/engine/entropic/kernel-products';
import { solveSinkhorn } from '../src/engine/entropic/sinkhorn';
import { barycentricMap } from '../src/engine/entropic/barycentric-map';
import { defaultEps, DEFAULT_EPS_FACTOR } from '../src/engine/entropic/default-eps';
import type { Points, Sample } from '../src/engine/points';
import { squaredDistancesRow } from '../src/engine/stats/sq-distances';
import { knownTruth, l2uvp, totalVariance } from './truth';

const asSample = (p: Points): Sample => ({ ...p, weights: null });
const row = (cells: (string | number)[]): string => cells.map((c) => String(c).padStart(14)).join(' ');

function speed(): void {
  const n = 4000;
  const d = 8;
  const truth = knownTruth(d, 1);
  const x = truth.source(n, 11);
  const y = truth.target(n, 12);
  const t0 = performance.now();
  const map = fitEntropic(asSample(x), asSample(y), {});
  const fitMs = performance.now() - t0;
  const diag = map.diagnostics();

  // Per-iteration cost of the kernel form: one fused pass (u = 1 / K(b v), t = K^T(a u)).
  const logA = new Float64Array(n).fill(-Math.log(n));
  const a = logA.map(Math.exp);
  const K = new Float64Array(n * n);
  const f = new Float64Array(n);
  const g = new Float64Array(n);
  const eps = map.parts.eps;
  let t = performance.now();
  buildKernelRecentred(x, y, a, f, g, eps, K);
  const buildMs = performance.now() - t;
  const u = new Float64Array(n).fill(1);
  const uNew = new Float64Array(n);
  const tt = new Float64Array(n);
  const stats = new Float64Array(2);
  const reps = 10;
  t = performance.now();
  for (let r = 0; r < reps; r++) fusedScalingPass(K, n, n, a, a, u, 1, uNew, tt, stats);
  const kernelIterMs = (performance.now() - t) / reps;

  // The naive reference: the cost matrix stored, f and g updated by log-sum-exp with Math.exp per entry.
  const C = K; // reuse the buffer for the cost
  for (let i = 0; i < n; i++) squaredDistancesRow(x, i, y, C, i * n, 0.5);
  const lse = new Float64Array(n);
  const naiveReps = 2;
  t = performance.now();
  for (let r = 0; r < naiveReps; r++) {
    for (let i = 0; i < n; i++) {
      const o = i * n;
      let max = -Infinity;
      for (let j = 0; j < n; j++) {
        const z = logA[j] + (g[j] - C[o + j]) / eps;
        if (z > max) max = z;
      }
      let s = 0;
      for (let j = 0; j < n; j++) s += Math.exp(logA[j] + (g[j] - C[o + j]) / eps - max);
      f[i] = -eps * (max + Math.log(s));
    }
    lse.fill(-Infinity);
    const acc = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const o = i * n;
      for (let j = 0; j < n; j++) {
        const z = logA[i] + (f[i] - C[o + j]) / eps;
        if (z > lse[j]) lse[j] = z;
      }
    }
    for (let i = 0; i < n; i++) {
      const o = i * n;
      for (let j = 0; j < n; j++) acc[j] += Math.exp(logA[i] + (f[i] - C[o + j]) / eps - lse[j]);
    }
    for (let j = 0; j < n; j++) g[j] = -eps * (lse[j] + Math.log(acc[j]));
  }
  const naiveIterMs = (performance.now() - t) / naiveReps;

  console.log(`\nSpeed: n = m = ${n}, d = ${d}, eps = ${eps.toPrecision(3)} (default rule), tolerance 1e-6`);
  console.log(row(['measure', 'ms', 'ratio']));
  console.log(row(['fit total', fitMs.toFixed(0), (fitMs / 5000).toFixed(2) + ' x goal']));
  console.log(row(['kernel build', buildMs.toFixed(0), '']));
  console.log(row(['iter kernel', kernelIterMs.toFixed(1), '1.00']));
  console.log(row(['iter naive', naiveIterMs.toFixed(1), (naiveIterMs / kernelIterMs).toFixed(1)]));
  console.log(`  ${diag.convergence?.criterion}`);
  console.log(`  minJacobianEigenvalue ${diag.minJacobianEigenvalue?.toExponential(3)}, w2Squared ${diag.cost.w2Squared.toFixed(4)}, warnings: ${diag.warnings.map((w) => w.code).join(', ') || 'none'}`);
}

function accuracy(): void {
  console.log(`\nAccuracy: L2-UVP (%) of the entropic map vs the Brenier map grad phi, 2,000 fresh points, default eps`);
  console.log(row(['d', 'n', 'eps', 'L2-UVP %', 'goal %', 'fit ms']));
  for (const d of [2, 4, 8]) {
    const n = 4000;
    const truth = knownTruth(d, 1);
    const x = truth.source(n, 11);
    const y = truth.target(n, 12);
    const xt = truth.source(2000, 13);
    const exact = truth.gradPhi(xt);
    const t0 = performance.now();
    const map = fitEntropic(asSample(x), asSample(y), {});
    const ms = performance.now() - t0;
    const uvp = l2uvp(map.apply(xt), exact, totalVariance(exact));
    console.log(row([d, n, map.parts.eps.toPrecision(3), uvp.toFixed(2), d === 2 ? 2 : d === 8 ? 5 : '-', ms.toFixed(0)]));
  }
}

/** The sweep behind DEFAULT_EPS_FACTOR: L2-UVP for eps = factor * V * n^(-2/(d+4)) (transport solve only). */
function sweep(): void {
  console.log(`\nSweep of the default-eps factor (current ${DEFAULT_EPS_FACTOR}): L2-UVP %`);
  const factors = [0.03125, 0.0625, 0.125, 0.25, 0.5];
  console.log(row(['d', 'n', ...factors.map(String)]));
  for (const d of [2, 4, 8]) {
    for (const n of [2000, 4000]) {
      const truth = knownTruth(d, 1);
      const x = truth.source(n, 11);
      const y = truth.target(n, 12);
      const xt = truth.source(2000, 13);
      const exact = truth.gradPhi(xt);
      const logA = new Float64Array(n).fill(-Math.log(n));
      const base = defaultEps(x, logA, y, logA) / DEFAULT_EPS_FACTOR;
      const cells: string[] = [];
      for (const c of factors) {
        const eps = c * base;
        const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps, tolerance: 1e-6, maxIterations: 2000 });
        const pred = { n: xt.n, d, data: barycentricMap(xt, y, logA, r.g, eps) };
        cells.push(l2uvp(pred, exact, totalVariance(exact)).toFixed(2));
      }
      console.log(row([d, n, ...cells]));
    }
  }
}

speed();
accuracy();
if (process.env.SWEEP) sweep();
