/* gradient-net on the bench zoo (bench/zoo.ts), beside the linear and entropic maps, for choosing
 * its defaults on the tune half and reporting on the report half.
 * Run: npx tsx bench/gradient-net-zoo.bench.ts [--half tune|report] [--d 8] [--n 4000] [--budget 20]
 *        [--settings '{"hidden":128}'] [--tuning '{"regressionLearningRate":0.02}'] [--no-reference]
 * Defaults: the tune half, d = 8, n = m = 4,000, time_budget 20 s (the goal: within 20 s, L2-UVP at most
 * 1.5 x entropic's and a third of linear's on every family). Prints L2-UVP on 2,000 fresh points, fit
 * seconds, the kept step and warnings, and the load average beside each figure. */
import * as os from 'os';
import { fitMap } from '../src/engine/methods';
import { DEFAULT_TUNING, fitGradientNet } from '../src/engine/gradient-net/method';
import { l2uvp, totalVariance } from './truth';
import { REPORT_FAMILIES, TUNE_FAMILIES, zooPair } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}
const half = arg('half', 'tune');
const families = half === 'report' ? REPORT_FAMILIES : TUNE_FAMILIES;
const dims = arg('d', '8').split(',').map(Number);
const n = Number(arg('n', '4000'));
const budget = Number(arg('budget', '20'));
const settings = JSON.parse(arg('settings', '{}')) as Record<string, unknown>;
const tuning = { ...DEFAULT_TUNING, ...(JSON.parse(arg('tuning', '{}')) as object) };
const reference = !process.argv.includes('--no-reference');
const load = () => os.loadavg()[0].toFixed(1);

async function main(): Promise<void> {
  console.log(`gradient-net on the zoo, ${half} half, n = m = ${n}, budget ${budget} s`);
  console.log(`settings ${JSON.stringify(settings)}, tuning ${JSON.stringify(tuning)}`);
  for (const d of dims) {
    console.log(`\nd = ${d}\nfamily     linear %  entropic %  (s)    gradient-net %  (s)   vs linear  vs entropic  load  kept / warnings`);
    for (const f of families) {
      const pair = zooPair(f, d, n, n, 1);
      const test = pair.fresh(2000, 1);
      const exact = pair.truth(test);
      const variance = totalVariance(pair.target);
      const src = { ...pair.source, weights: null };
      const tgt = { ...pair.target, weights: null };
      let lin = NaN;
      let ent = NaN;
      let entSecs = NaN;
      if (reference) {
        // A method that refuses the data (e.g. the raw-units linear map on columns of very different scales) prints NaN.
        try {
          const lm = await fitMap('linear', src, tgt, {});
          lin = l2uvp(lm.apply(test), exact, variance);
        } catch {
          lin = NaN;
        }
        try {
          const t0 = performance.now();
          const em = await fitMap('entropic', src, tgt, {});
          entSecs = (performance.now() - t0) / 1000;
          ent = l2uvp(em.apply(test), exact, variance);
        } catch {
          ent = NaN;
        }
      }
      const t0 = performance.now();
      const gm = await fitGradientNet(src, tgt, { seed: 7, time_budget: budget, ...settings }, {}, tuning);
      const secs = (performance.now() - t0) / 1000;
      const gn = l2uvp(gm.apply(test), exact, variance);
      const dg = gm.diagnostics();
      console.log(
        `${f.padEnd(11)}${lin.toFixed(2).padStart(7)}  ${ent.toFixed(2).padStart(9)}  ${entSecs.toFixed(1).padStart(5)}` +
          `  ${gn.toFixed(2).padStart(12)}  ${secs.toFixed(1).padStart(5)}  ${(lin / gn).toFixed(1).padStart(7)}x  ${(gn / ent).toFixed(2).padStart(9)}x` +
          `  ${load().padStart(5)}  step ${dg.convergence?.iterations} / ${dg.warnings.map((w) => w.code).join(', ')}`,
      );
    }
  }
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
