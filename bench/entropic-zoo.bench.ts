/**
 * The entropic method on the bench zoo (bench/zoo.ts). Run: npm run bench -- entropic-zoo [--sweep] [--d 8] [--rows 200000]
 * 1. Report (default): on the report half, n = m = 4,000, d = 8: fit time (wall and CPU), Sinkhorn
 *    iterations (transport + the two self solves), L2-UVP against the family's known optimal map on
 *    2,000 fresh points, and the time to apply the map to `rows` fresh rows (default 200,000; apply
 *    is linear in the rows; the "1M rows s" column scales it to 1,000,000), with the worst and the median;
 *    beside it the CPU time of the apply kernel alone (TruncatedSoftmax.map on the rows already in fitted units, one
 *    thread) scaled to 1,000,000 rows, first with the kernel apply uses (its name is printed: wasm where WebAssembly
 *    SIMD compiles) and then with the plain TypeScript kernel, their ratio, and the CPU time of the untruncated map
 *    (barycentricMap) on the same rows, measured on a tenth of them (scaled to `rows`).
 *    With --compiled (after `npm run build:cli`), both kernels are timed again on the same rows in a plain node process
 *    that loads the compiled engine (build/cli/engine/methods.js) and restores the fitted map from its JSON, since
 *    the bench's tsx loader slows plain JavaScript code.
 * 2. --sweep [--factors 0.125,0.25]: on the tune half only, L2-UVP for smoothing = factor x n^(-2/(d+4)) (standardised units,
 *    where the mean column variance is 1): the sweep behind defaultEpsFactor.
 * One run per figure; the load average is printed beside each table (the machine is shared).
 */
import { execFileSync } from 'child_process';
import * as os from 'os';
import * as path from 'path';
import { barycentricMap } from '../src/engine/entropic/barycentric-map';
import { fitEntropic } from '../src/engine/entropic/fit';
import { TruncatedSoftmax } from '../src/engine/entropic/truncated-softmax';
import { defaultEpsFactor } from '../src/engine/entropic/default-eps';
import { l2uvp, totalVariance } from './truth';
import { REPORT_FAMILIES, TUNE_FAMILIES, zooPair, type FamilyName } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}
const load = (): string =>
  os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(' ');
const cpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const n = 4000;
const d = Number(arg('d', '8'));

/** Run by plain node on the compiled engine: restores the map, then times both kernels on the rows (stdin: JSON). */
const COMPILED_TIMING = `
const path = require('path');
const built = process.argv[1];
let input = '';
process.stdin.on('data', (c) => (input += c)).on('end', () => {
  const { json, rows, d } = JSON.parse(input);
  const { restoreMap } = require(path.join(built, 'methods.js'));
  const { TruncatedSoftmax } = require(path.join(built, 'entropic', 'truncated-softmax.js'));
  const p = restoreMap(json).parts;
  const x = { n: rows.length / d, d, data: Float64Array.from(rows, (v, t) => (v - p.sourceCentre[t % d]) / p.scales[t % d]) };
  const h = Float64Array.from(p.g, (v, j) => p.targetLogMass[j] + v / p.eps);
  const cpu = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
  const out = {};
  for (const kind of ['auto', 'typescript']) {
    const k = new TruncatedSoftmax(p.target, h, p.eps, kind);
    const c0 = cpu();
    k.map(x);
    out[kind] = { name: k.kernel, ms: cpu() - c0 };
  }
  process.stdout.write(JSON.stringify(out));
});`;

/** CPU ms of the compiled kernels (the default one and the TypeScript one) on the rows, in a plain node process. */
function compiledKernels(json: unknown, rows: Float64Array): { auto: { name: string; ms: number }; typescript: { name: string; ms: number } } {
  const built = path.join(__dirname, '..', 'build', 'cli', 'engine');
  const text = execFileSync(process.execPath, ['-e', COMPILED_TIMING, built], {
    input: JSON.stringify({ json, rows: Array.from(rows), d }),
    env: { ...process.env, NODE_OPTIONS: '' },
    maxBuffer: 1 << 20,
  }).toString();
  return JSON.parse(text);
}

function report(): void {
  const rows = Number(arg('rows', '200000'));
  console.log(`entropic on the zoo's report half, n = m = ${n}, d = ${d}, apply on ${rows} fresh rows; load average ${load()}`);
  console.log(
    'family     fit s  fit cpu s  iterations (transport+self)  L2-UVP %  apply s  apply cpu s  1M rows s  kernel      cpu s/1M  typescript cpu s/1M  ratio  untruncated cpu s  load',
  );
  const fits: number[] = [];
  const uvps: number[] = [];
  const applies: number[] = [];
  const kernels: number[] = [];
  const plains: number[] = [];
  const compiledFast: number[] = [];
  const compiledPlain: number[] = [];
  let kernelName = '';
  for (const f of REPORT_FAMILIES) {
    const pair = zooPair(f, d, n, n, 1);
    const t0 = performance.now();
    const c0 = cpuMs();
    const map = fitEntropic({ ...pair.source, weights: null }, { ...pair.target, weights: null }, { seed: 7 });
    const fitS = (performance.now() - t0) / 1000;
    const fitCpu = (cpuMs() - c0) / 1000;
    const crit = map.diagnostics().convergence?.criterion ?? '';
    const its = [...crit.matchAll(/(\d+) iterations/g)].map((m) => m[1]).join('+');
    const test = pair.fresh(2000, 1);
    const uvp = l2uvp(map.apply(test), pair.truth(test), totalVariance(pair.target));
    const many = pair.fresh(rows, 2);
    const t1 = performance.now();
    const c1 = cpuMs();
    map.apply(many);
    const applyS = (performance.now() - t1) / 1000;
    const applyCpu = (cpuMs() - c1) / 1000;
    // The untruncated map on the same fitted parts (every weight above e^-60 exponentiated), on a tenth of the rows, for the ratio.
    const p = map.parts;
    const tenth = pair.fresh(Math.max(1, Math.floor(rows / 10)), 2);
    const fitted = { ...tenth, data: tenth.data.map((v, t) => (v - p.sourceCentre[t % d]) / p.scales[t % d]) };
    const c2 = cpuMs();
    barycentricMap(fitted, p.target, p.targetLogMass, p.g, p.eps);
    const fullCpu = ((cpuMs() - c2) / 1000) * (rows / tenth.n);
    // The kernel alone, one thread, on all the rows in fitted units (the same arithmetic apply runs).
    const h = Float64Array.from(p.g, (v, j) => p.targetLogMass[j] + v / p.eps);
    const kernel = new TruncatedSoftmax(p.target, h, p.eps);
    const fittedMany = { ...many, data: many.data.map((v, t) => (v - p.sourceCentre[t % d]) / p.scales[t % d]) };
    const c3 = cpuMs();
    const fast = kernel.map(fittedMany);
    const kernelCpu = ((cpuMs() - c3) / 1000) * (1e6 / rows);
    kernels.push(kernelCpu);
    kernelName = kernel.kernel;
    const plainKernel = new TruncatedSoftmax(p.target, h, p.eps, 'typescript');
    const c4 = cpuMs();
    const plain = plainKernel.map(fittedMany);
    const plainCpu = ((cpuMs() - c4) / 1000) * (1e6 / rows);
    plains.push(plainCpu);
    let same = true;
    for (let t = 0; t < fast.length && same; t++) same = Object.is(fast[t], plain[t]);
    if (!same) console.log(`${f}: the ${kernel.kernel} and typescript kernels gave different bits`);
    const compiled = process.argv.includes('--compiled') ? compiledKernels(map.toJSON(), many.data) : null;
    fits.push(fitS);
    uvps.push(uvp);
    applies.push((applyS * 1e6) / rows);
    console.log(
      `${f.padEnd(10)} ${fitS.toFixed(1).padStart(5)}  ${fitCpu.toFixed(1).padStart(9)}  ${its.padStart(27)}  ${uvp.toFixed(2).padStart(8)}  ${applyS.toFixed(1).padStart(7)}  ${applyCpu.toFixed(1).padStart(11)}  ${((applyS * 1e6) / rows).toFixed(1).padStart(9)}  ${kernel.kernel.padEnd(10)}  ${kernelCpu.toFixed(1).padStart(8)}  ${plainCpu.toFixed(1).padStart(19)}  ${(plainCpu / kernelCpu).toFixed(2).padStart(5)}  ${fullCpu.toFixed(1).padStart(17)}  ${os.loadavg()[0].toFixed(2)}`,
    );
    if (compiled) {
      const fastC = (compiled.auto.ms / 1000) * (1e6 / rows);
      const plainC = (compiled.typescript.ms / 1000) * (1e6 / rows);
      compiledFast.push(fastC);
      compiledPlain.push(plainC);
      console.log(
        `  compiled (build/cli, plain node): ${compiled.auto.name} ${fastC.toFixed(1)} s/1M, ${compiled.typescript.name} ${plainC.toFixed(1)} s/1M, ratio ${(plainC / fastC).toFixed(2)}; load ${os.loadavg()[0].toFixed(2)}`,
      );
    }
  }
  console.log(
    `worst / median: fit ${Math.max(...fits).toFixed(1)} / ${median(fits).toFixed(1)} s; L2-UVP ${Math.max(...uvps).toFixed(2)} / ${median(uvps).toFixed(2)} %; 1M rows ${Math.max(...applies).toFixed(1)} / ${median(applies).toFixed(1)} s (kernel CPU, ${kernelName} ${Math.max(...kernels).toFixed(1)} / ${median(kernels).toFixed(1)} s, typescript ${Math.max(...plains).toFixed(1)} / ${median(plains).toFixed(1)} s); load average ${load()}`,
  );
  if (compiledFast.length) {
    console.log(
      `compiled kernels, worst / median s per 1M rows: ${kernelName} ${Math.max(...compiledFast).toFixed(1)} / ${median(compiledFast).toFixed(1)}, typescript ${Math.max(...compiledPlain).toFixed(1)} / ${median(compiledPlain).toFixed(1)}`,
    );
  }
}

function sweep(): void {
  const factors = arg('factors', '0.03125,0.0625,0.125,0.25').split(',').map(Number);
  console.log(`sweep of the default smoothing factor (now ${defaultEpsFactor(d)}) on the tune half, n = m = ${n}, d = ${d}: L2-UVP %; load average ${load()}`);
  console.log(`family     ${factors.map((c) => String(c).padStart(9)).join(' ')}`);
  const cols: number[][] = factors.map(() => []);
  for (const f of TUNE_FAMILIES as readonly FamilyName[]) {
    const pair = zooPair(f, d, n, n, 1);
    const test = pair.fresh(2000, 1);
    const exact = pair.truth(test);
    const variance = totalVariance(pair.target);
    const cells = factors.map((c, q) => {
      const map = fitEntropic({ ...pair.source, weights: null }, { ...pair.target, weights: null }, { smoothing: c * Math.pow(n, -2 / (d + 4)) });
      const u = l2uvp(map.apply(test), exact, variance);
      cols[q].push(u);
      return u.toFixed(2).padStart(9);
    });
    console.log(`${f.padEnd(10)} ${cells.join(' ')}   load ${os.loadavg()[0].toFixed(2)}`);
  }
  console.log(
    `worst      ${cols
      .map((c) =>
        Math.max(...c)
          .toFixed(2)
          .padStart(9),
      )
      .join(' ')}`,
  );
}

if (process.argv.includes('--sweep')) sweep();
else report();
