/* Accuracy against a known optimal map, for the multivariate methods side by side.
 * Run: npx tsx bench/accuracy.bench.ts [d ...] [--methods linear,entropic]
 *      (default d = 2 4 8; n = 4,000; all three methods; the linear map is the yardstick of the
 *      last column, so leaving it out prints NaN there)
 *
 * Source X ~ N(0, I_d); target grad phi(X') for an independent draw, with phi convex and
 * not quadratic (bench/truth.ts). By Brenier's theorem grad phi is the optimal map, so each
 * fitted map is scored on 2,000 fresh source points by L2-UVP and the cosine metric of
 * Korotin et al. (2021). Goals: best of entropic and gradient-net <= 2 % at d = 2 and <= 5 % at
 * d = 8, and at least 3x below the linear map. Prints wall time per fit next to each figure. */
import { fitMap } from '../src/engine/methods';
import type { Points } from '../src/engine/points';
import { cosineMetric, knownTruth, l2uvp, totalVariance } from './truth';

const n = 4000;
const ALL_METHODS = ['linear', 'entropic', 'gradient-net'] as const;
const args = process.argv.slice(2);
const at = args.indexOf('--methods');
const chosen = at >= 0 ? (args[at + 1] ?? '').split(',').filter(Boolean) : [...ALL_METHODS];
const unknown = chosen.filter((m) => !(ALL_METHODS as readonly string[]).includes(m));
if (unknown.length || !chosen.length) {
  console.error(`accuracy.bench: --methods takes a comma-separated list of ${ALL_METHODS.join(', ')}; got "${args[at + 1] ?? ''}".`);
  process.exit(2);
}
const methods = ALL_METHODS.filter((m) => chosen.includes(m));
const dims = args
  .filter((_, i) => at < 0 || (i !== at && i !== at + 1))
  .map(Number)
  .filter((d) => d > 0);

async function main(): Promise<void> {
  console.log(`accuracy against a known optimal map, n = ${n}, 2,000 fresh test points (one run)`);
  console.log('d   method         L2-UVP %   cosine    fit s    ratio to linear');
  for (const d of dims.length ? dims : [2, 4, 8]) {
    const truth = knownTruth(d, 1);
    const source = truth.source(n, 11);
    const target = truth.target(n, 12);
    const test: Points = truth.source(2000, 13);
    const exact = truth.gradPhi(test);
    const variance = totalVariance(target);
    let linearUvp = NaN;
    for (const m of methods) {
      const t0 = Date.now();
      const map = await fitMap(m, { ...source, weights: null }, { ...target, weights: null }, m === 'linear' ? {} : { seed: 7 });
      const secs = (Date.now() - t0) / 1000;
      const predicted = map.apply(test);
      const uvp = l2uvp(predicted, exact, variance);
      if (m === 'linear') linearUvp = uvp;
      const warn = map
        .diagnostics()
        .warnings.map((w) => w.code)
        .filter((c) => c !== 'extrapolation');
      console.log(
        `${String(d).padEnd(4)}${m.padEnd(15)}${uvp.toFixed(2).padStart(8)}   ${cosineMetric(test, predicted, exact).toFixed(4)}  ` +
          `${secs.toFixed(1).padStart(6)}    ` +
          `${m === 'linear' ? '1' : (linearUvp / uvp).toFixed(1) + 'x better'}${warn.length ? '   warnings: ' + warn.join(', ') : ''}`,
      );
      map.dispose();
    }
  }
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
