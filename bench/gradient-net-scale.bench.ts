/* gradient-net at a million rows: fit from n = m = 1,000,000 rows (d = 5, a zoo family), apply the map
 * to 1,000,000 fresh rows, and invert 20,000 mapped rows.
 * Run: npx tsx bench/gradient-net-scale.bench.ts [--family gauss] [--n 1000000] [--d 5] [--settings '{"hidden":64}']
 * Goals: fit <= 60 s (the default time_budget; training works from minibatches and a teacher subsample),
 * apply <= 2 s, inverse accurate to 1e-8 relative (max over rows of |T^-1(T(x)) - x| / (1 + |x|)).
 * L2-UVP against the family's known map on 20,000 fresh rows is printed too; the load average beside each figure. */
import * as os from 'os';
import { gradientNetMethod } from '../src/engine/gradient-net/method';
import { resolveSettings } from '../src/engine/settings';
import { settingSpecs } from '../src/engine/methods';
import { l2uvp, totalVariance } from './truth';
import { zooPair, type FamilyName } from './zoo';

function arg(name: string, fallback: string): string {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 && process.argv[at + 1] ? process.argv[at + 1] : fallback;
}
const family = arg('family', 'gauss') as FamilyName;
const n = Number(arg('n', '1000000'));
const d = Number(arg('d', '5'));
const extra = JSON.parse(arg('settings', '{}')) as Record<string, unknown>;
const load = () =>
  os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(' ');

async function main(): Promise<void> {
  let t0 = performance.now();
  const pair = zooPair(family, d, n, n, 1);
  const drawn = ((performance.now() - t0) / 1000).toFixed(1);
  console.log(`gradient-net at scale: family ${family}, n = m = ${n}, d = ${d}; data drawn in ${drawn} s   [load ${load()}]`);
  const settings = resolveSettings('gradient-net', settingSpecs(gradientNetMethod), { seed: 7, ...extra });
  t0 = performance.now();
  const map = await gradientNetMethod.fit({ ...pair.source, weights: null }, { ...pair.target, weights: null }, settings, {});
  const fitSecs = (performance.now() - t0) / 1000;
  const dg = map.diagnostics();
  console.log(`fit ${fitSecs.toFixed(1)} s (goal 60 s)   [load ${load()}]`);
  console.log(`  ${dg.convergence?.criterion}`);
  console.log(`  warnings: ${dg.warnings.map((w) => w.code).join(', ') || 'none'}`);
  const fresh = pair.fresh(n, 2);
  t0 = performance.now();
  const mapped = map.apply(fresh);
  const applySecs = (performance.now() - t0) / 1000;
  console.log(`apply to ${n} fresh rows ${applySecs.toFixed(2)} s (goal 2 s)   [load ${load()}]`);
  const k = Math.min(20000, n);
  const sub = { n: k, d, data: fresh.data.slice(0, k * d) };
  const exact = pair.truth(sub);
  console.log(`L2-UVP on ${k} fresh rows ${l2uvp({ n: k, d, data: mapped.data.slice(0, k * d) }, exact, totalVariance(pair.target)).toFixed(2)} %`);
  t0 = performance.now();
  const back = map.invert({ n: k, d, data: mapped.data.slice(0, k * d) });
  const invSecs = (performance.now() - t0) / 1000;
  // With tails=clamp (the default) apply clamps rows outside the fitted source range and invert clamps values outside
  // the fitted target range, so such rows cannot map back to themselves: the round trip is measured on the rows inside
  // both ranges (all rows with tails=linear).
  const range = (p: { n: number; data: Float64Array }) => {
    const lo = new Float64Array(d).fill(Infinity);
    const hi = new Float64Array(d).fill(-Infinity);
    for (let i = 0; i < p.n; i++) {
      for (let j = 0; j < d; j++) {
        const v = p.data[i * d + j];
        if (v < lo[j]) lo[j] = v;
        if (v > hi[j]) hi[j] = v;
      }
    }
    return { lo, hi };
  };
  const src = range(pair.source);
  const tgt = range(pair.target);
  const clamps = settings.tails !== 'linear';
  let worst = 0;
  let measured = 0;
  for (let i = 0; i < k; i++) {
    let inside = true;
    for (let j = 0; j < d; j++) {
      const x = sub.data[i * d + j];
      const y = mapped.data[i * d + j];
      inside &&= x >= src.lo[j] && x <= src.hi[j] && y >= tgt.lo[j] && y <= tgt.hi[j];
    }
    if (clamps && !inside) continue;
    measured++;
    let e = 0;
    let x = 0;
    for (let j = 0; j < d; j++) {
      e += (back.data[i * d + j] - sub.data[i * d + j]) ** 2;
      x += sub.data[i * d + j] ** 2;
    }
    worst = Math.max(worst, Math.sqrt(e) / (1 + Math.sqrt(x)));
  }
  console.log(
    `invert ${k} mapped rows ${invSecs.toFixed(2)} s; largest relative round-trip error ${worst.toExponential(2)} over the ${measured} rows ` +
      `${clamps ? 'inside both fitted ranges (tails=clamp)' : '(tails=linear)'} (goal 1e-8)   [load ${load()}]`,
  );
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
