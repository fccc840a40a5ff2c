/**
 * gradient-net benchmarks. Run: npx tsx bench/gradient-net.bench.ts [--quick]
 *  1. Time per training step of the network (forward + backward + Adam on the
 *     surrogate <F(x), G>), n = 4,096, d = 5, 64 hidden units, full batch, on the
 *     wasm and cpu backends, for the closed-form network and for the same model
 *     written with an 8-node Gauss-Legendre quadrature of its defining integral.
 *  2. Time of the Sinkhorn part of a step (potentials + gradient) at the default
 *     batch sizes: plain float64 JavaScript (what training uses) against tfjs.
 *  3. Accuracy on the known-truth pair of bench/truth.ts (n = 4,000 per sample,
 *     default settings, wasm backend, CPU only): L2-UVP and the cosine metric of
 *     Korotin et al. 2021 on 4,000 fresh source rows, with wall time.
 *  4. The scenario demo data (demo-workbooks/data/scenarios-model.csv ->
 *     scenarios-reference.csv, 5,000 x 5,000 rows, d = 3, heavy-tailed target): energy
 *     distance after mapping (the shared compareFit figure) for the linear method and
 *     gradient-net at steps = 0, "seed=7; steps=150" and the defaults, with wall time.
 * Prints absolute ms and the ratios asked for; the machine's load average is
 * printed because it has 2 cores shared with other jobs.
 */
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import * as tf from '@tensorflow/tfjs';
import '@tensorflow/tfjs-backend-wasm';
import { batchSinkhorn } from '../src/engine/gradient-net/batch-sinkhorn';
import { gaussLegendre01 } from '../src/engine/gradient-net/gauss-legendre';
import { initialParams } from '../src/engine/gradient-net/initial-params';
import { gradientNetMethod } from '../src/engine/gradient-net/method';
import { Random } from '../src/engine/stats/random';
import { sinkhornDivergenceAt, sinkhornPotentials } from '../src/engine/gradient-net/sinkhorn-divergence';
import { TensorNetwork } from '../src/engine/gradient-net/tensor-network';
import { resolveSettings } from '../src/engine/settings';
import type { Points } from '../src/engine/points';
import { knownTruth, totalVariance, l2uvp } from './truth';

const quick = process.argv.includes('--quick');
const load = () => os.loadavg()[0].toFixed(1);

/** The same model as TensorNetwork (layers = 1) with F's integral over t done by quadrature instead of the closed form. */
function quadratureApply(net: TensorNetwork, x: tf.Tensor2D, nodes: Float64Array, weights: Float64Array): tf.Tensor2D {
  const { d, hidden } = net;
  const [wtFlat, bFlat, cRaw, vFlat, aRaw, beta] = tf.split(net.theta, [d * hidden, hidden, hidden, d * d, 1, d]);
  const wt = tf.reshape(wtFlat, [d, hidden]) as tf.Tensor2D;
  const u = tf.matMul(x, wt);
  let acc: tf.Tensor = tf.zerosLike(u);
  for (let i = 0; i < nodes.length; i++) {
    const s = tf.sigmoid(tf.add(tf.mul(u, nodes[i]), bFlat));
    acc = tf.add(acc, tf.mul(tf.square(tf.mul(s, tf.sub(1, s))), weights[i]));
  }
  const act = tf.mul(tf.mul(acc, u), tf.softplus(cRaw)) as tf.Tensor2D;
  const v = tf.reshape(vFlat, [d, d]) as tf.Tensor2D;
  const lin = tf.add(tf.matMul(tf.transpose(v), v), tf.mul(tf.eye(d), tf.softplus(aRaw))) as tf.Tensor2D;
  return tf.add(tf.add(tf.matMul(act, tf.transpose(wt)), tf.matMul(x, lin)), beta) as tf.Tensor2D;
}

async function stepTimes(): Promise<void> {
  const n = 4096;
  const d = 5;
  const r = new Random(1);
  const xData = Float32Array.from({ length: n * d }, () => r.normal());
  const gData = Float32Array.from({ length: n * d }, () => r.normal() / n);
  const { nodes, weights } = gaussLegendre01(8);
  console.log(`\n1. Network step (forward + backward + Adam), n = ${n}, d = ${d}, 64 hidden, full batch   [load ${load()}]`);
  console.log('backend | closed form ms/step | 8-node quadrature ms/step | quadrature / closed');
  const rows: Record<string, number> = {};
  for (const be of ['wasm', 'cpu']) {
    await tf.setBackend(be);
    await tf.ready();
    const net = new TensorNetwork(
      initialParams(
        d,
        64,
        1,
        Float64Array.from({ length: 25 }, (_, i) => (i % 6 === 0 ? 1 : 0)),
        new Random(2),
      ),
    );
    const x = tf.tensor2d(xData, [n, d]);
    const g = tf.tensor2d(gData, [n, d]);
    const opt = tf.train.adam(0.001);
    const time = (f: (x: tf.Tensor2D) => tf.Tensor2D, reps: number) => {
      const step = () =>
        tf.tidy(() => {
          opt.minimize(() => tf.sum(tf.mul(f(x), g)) as tf.Scalar, false, [net.theta]);
          net.theta.dataSync();
        });
      step();
      const t0 = performance.now();
      for (let i = 0; i < reps; i++) step();
      return (performance.now() - t0) / reps;
    };
    const reps = be === 'wasm' ? (quick ? 3 : 10) : quick ? 1 : 3;
    const closed = time((z) => net.apply(z), reps);
    const quad = time((z) => quadratureApply(net, z, nodes, weights), reps);
    rows[be] = closed;
    console.log(`${be.padEnd(7)} | ${closed.toFixed(1).padStart(19)} | ${quad.toFixed(1).padStart(25)} | ${(quad / closed).toFixed(2)}`);
    opt.dispose();
    net.dispose();
    x.dispose();
    g.dispose();
  }
  console.log(`cpu / wasm (closed form): ${(rows.cpu / rows.wasm).toFixed(2)}`);
}

async function sinkhornTimes(): Promise<void> {
  console.log(`\n2. Sinkhorn part of one step (8 iterations, value + gradient), d = 5   [load ${load()}]`);
  console.log('batch | float64 JS ms | tfjs wasm ms | tfjs cpu ms | wasm / JS');
  for (const B of quick ? [256] : [256, 512]) {
    const r = new Random(B);
    const x = Float64Array.from({ length: B * 5 }, () => r.normal());
    const y = Float64Array.from({ length: B * 5 }, () => r.normal() + 0.3);
    const setup = { blur: 2.5, diameter2: 100, iterations: 8 };
    const reps = quick ? 2 : 5;
    const t0 = performance.now();
    for (let i = 0; i < reps; i++) batchSinkhorn(x, B, y, B, 5, setup);
    const js = (performance.now() - t0) / reps;
    const tfTime = async (be: string, k: number) => {
      await tf.setBackend(be);
      const xt = tf.tensor2d(Float32Array.from(x), [B, 5]);
      const yt = tf.tensor2d(Float32Array.from(y), [B, 5]);
      const run = () =>
        tf.tidy(() => {
          const pot = sinkhornPotentials(xt, yt, setup);
          tf.grad((z: tf.Tensor) => sinkhornDivergenceAt(z as tf.Tensor2D, yt, pot))(xt).dataSync();
        });
      run();
      const s = performance.now();
      for (let i = 0; i < k; i++) run();
      xt.dispose();
      yt.dispose();
      return (performance.now() - s) / k;
    };
    const wasm = await tfTime('wasm', reps);
    const cpu = B <= 256 ? await tfTime('cpu', 1) : NaN;
    console.log(
      `${String(B).padStart(5)} | ${js.toFixed(1).padStart(13)} | ${wasm.toFixed(1).padStart(12)} | ` +
        `${(Number.isNaN(cpu) ? '-' : cpu.toFixed(1)).padStart(11)} | ${(wasm / js).toFixed(2)}`,
    );
  }
}

function cosine(pred: Points, truth: Points, x: Points): number {
  let dot = 0;
  let a = 0;
  let b = 0;
  for (let i = 0; i < x.data.length; i++) {
    const u = pred.data[i] - x.data[i];
    const v = truth.data[i] - x.data[i];
    dot += u * v;
    a += u * u;
    b += v * v;
  }
  return dot / Math.sqrt(a * b);
}

async function accuracy(): Promise<void> {
  console.log(`\n3. Accuracy on bench/truth.ts, n = 4,000 per sample, defaults (wasm), 4,000 fresh test rows`);
  console.log('d | warm start L2-UVP % | trained L2-UVP % | cos | steps | stop | wall s | load');
  const settingsOf = (raw: Record<string, unknown>) => resolveSettings('gradient-net', gradientNetMethod.settings, { tails: 'linear', ...raw });
  for (const d of quick ? [2] : [2, 4, 8]) {
    const truth = knownTruth(d, 1);
    const n = 4000;
    const src = { ...truth.source(n, 11), weights: null };
    const tgt = { ...truth.target(n, 12), weights: null };
    const test = truth.source(4000, 13);
    const exact = truth.gradPhi(test);
    const v = totalVariance(tgt);
    const warm = await gradientNetMethod.fit(src, tgt, settingsOf({ steps: 0 }), {});
    const warmUvp = l2uvp(warm.apply(test), exact, v);
    const t0 = Date.now();
    const map = await gradientNetMethod.fit(src, tgt, settingsOf(quick ? { time_budget: 15 } : {}), {});
    const wall = (Date.now() - t0) / 1000;
    const pred = map.apply(test);
    const c = map.diagnostics().convergence!;
    const stop = c.converged ? 'plateau' : map.diagnostics().warnings.some((w) => w.code === 'time-budget') ? 'budget' : 'steps';
    console.log(
      `${d} | ${warmUvp.toFixed(2).padStart(19)} | ${l2uvp(pred, exact, v).toFixed(2).padStart(16)} | ` +
        `${cosine(pred, exact, test).toFixed(4)} | ${String(c.iterations).padStart(5)} | ${stop.padEnd(7)} | ${wall.toFixed(1).padStart(6)} | ${load()}`,
    );
  }
}

function readCsv(name: string) {
  const lines = fs
    .readFileSync(path.join(__dirname, '..', 'demo-workbooks', 'data', name), 'utf8')
    .trim()
    .split('\n')
    .slice(1);
  const d = lines[0].split(',').length;
  const data = new Float64Array(lines.length * d);
  lines.forEach((l, i) => l.split(',').forEach((v, k) => (data[i * d + k] = Number(v))));
  return { n: lines.length, d, data, weights: null };
}

async function scenarios(): Promise<void> {
  console.log(`\n4. Scenario demo data, 5,000 x 5,000 rows, d = 3: energy distance after mapping (compareFit)`);
  console.log('fit                       | energy before | energy after | after / linear | steps | wall s | load');
  const src = readCsv('scenarios-model.csv');
  const tgt = readCsv('scenarios-reference.csv');
  const { fitMap } = await import('../src/engine/methods');
  await import('../src/engine/methods');
  let linearAfter = NaN;
  const runs: [string, string, Record<string, unknown>][] = [
    ['linear', 'linear', {}],
    ['gradient-net steps=0', 'gradient-net', { seed: 7, steps: 0 }],
    ['gradient-net seed=7;150', 'gradient-net', { seed: 7, steps: 150 }],
    ['gradient-net defaults', 'gradient-net', {}],
  ];
  for (const [label, method, settings] of quick ? runs.slice(0, 3) : runs) {
    const t0 = Date.now();
    const map = await fitMap(method, src, tgt, settings);
    const wall = (Date.now() - t0) / 1000;
    const dg = map.diagnostics();
    if (method === 'linear') linearAfter = dg.energyAfter!;
    console.log(
      `${label.padEnd(25)} | ${dg.energyBefore!.toFixed(3).padStart(13)} | ${dg.energyAfter!.toFixed(3).padStart(12)} | ` +
        `${(dg.energyAfter! / linearAfter).toFixed(2).padStart(14)} | ${String(dg.convergence?.iterations ?? '-').padStart(5)} | ` +
        `${wall.toFixed(1).padStart(6)} | ${load()}`,
    );
    map.dispose();
  }
}

(async () => {
  console.log(`gradient-net bench, ${os.cpus().length} cores, load average at start ${load()}`);
  await stepTimes();
  await sinkhornTimes();
  await accuracy();
  await scenarios();
})();
