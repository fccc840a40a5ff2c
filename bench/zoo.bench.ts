/* The multivariate methods on the bench zoo (bench/zoo.ts): accuracy against each family's known
 * optimal map and fit time, with the worst and the median over the families of one half.
 * Run: npm run bench -- zoo [--half tune|report|all] [--d 2,5,8] [--methods linear,entropic,gradient-net] [--n 4000]
 * Defaults: the report half, d = 8, n = m = 4,000, all three methods. Choose defaults on the tune half;
 * the README's figures come from the report half. Each figure is one run; the load average is printed. */
import * as os from 'os';
import { fitMap } from '../src/engine/methods';
import { l2uvp, totalVariance } from './truth';
import { FAMILY_NOTES, REPORT_FAMILIES, TUNE_FAMILIES, zooPair, type FamilyName } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}

const half = arg('half', 'report');
const families: readonly FamilyName[] = half === 'tune' ? TUNE_FAMILIES : half === 'all' ? [...TUNE_FAMILIES, ...REPORT_FAMILIES] : REPORT_FAMILIES;
const dims = arg('d', '8').split(',').map(Number);
const methods = arg('methods', 'linear,entropic,gradient-net').split(',');
const n = Number(arg('n', '4000'));

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

async function main(): Promise<void> {
  console.log(
    `bench zoo, ${half} half (${families.join(', ')}), n = m = ${n}, 2,000 fresh test points; load average ${os
      .loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}`,
  );
  for (const f of families) console.log(`  ${f.padEnd(9)} ${FAMILY_NOTES[f]}`);
  for (const d of dims) {
    const summary = new Map<string, { uvp: number[]; secs: number[]; vsLinear: number[] }>();
    console.log(`\nd = ${d}\nfamily     method         L2-UVP %   fit s   linear / method   warnings`);
    for (const f of families) {
      const pair = zooPair(f, d, n, n, 1);
      const test = pair.fresh(2000, 1);
      const exact = pair.truth(test);
      const variance = totalVariance(pair.target);
      let linear = NaN;
      for (const m of methods) {
        const t0 = performance.now();
        let map;
        try {
          map = await fitMap(m, { ...pair.source, weights: null }, { ...pair.target, weights: null }, m === 'linear' ? {} : { seed: 7 });
        } catch (e) {
          console.log(`${f.padEnd(11)}${m.padEnd(15)}   refused: ${(e as Error).message.slice(0, 140)}`);
          continue;
        }
        const secs = (performance.now() - t0) / 1000;
        const uvp = l2uvp(map.apply(test), exact, variance);
        if (m === 'linear') linear = uvp;
        const warnings = map.diagnostics().warnings.map((w) => w.code);
        map.dispose();
        const s = summary.get(m) ?? { uvp: [], secs: [], vsLinear: [] };
        s.uvp.push(uvp);
        s.secs.push(secs);
        s.vsLinear.push(linear / uvp);
        summary.set(m, s);
        console.log(
          `${f.padEnd(11)}${m.padEnd(15)}${uvp.toFixed(2).padStart(8)}  ${secs.toFixed(1).padStart(6)}   ${(linear / uvp).toFixed(1).padStart(8)}x         ${warnings.join(', ')}`,
        );
      }
    }
    console.log(`worst and median over ${families.length} families at d = ${d}:`);
    for (const [m, s] of summary) {
      console.log(
        `  ${m.padEnd(13)} L2-UVP worst ${Math.max(...s.uvp).toFixed(2)} % median ${median(s.uvp).toFixed(2)} %;` +
          ` fit worst ${Math.max(...s.secs).toFixed(1)} s median ${median(s.secs).toFixed(1)} s; linear / method worst ${Math.min(...s.vsLinear).toFixed(1)}x`,
      );
    }
  }
  console.log(
    `load average at the end ${os
      .loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}`,
  );
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
