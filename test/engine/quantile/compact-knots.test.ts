import { probit } from 'simple-statistics';
import { fitMap, restoreMap, parseMapJSON, sample } from '../../../src/engine';
import { compactIndices, largestDifference } from '../../../src/engine/quantile/compact-knots';
import { Random } from '../../../src/engine/stats/random';

/** Hazen positions (i - 0.5) / n, the shares the quantile map matches (Hazen 1914). */
function hazen(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => (i + 0.5) / n);
}

describe('compact quantile maps', () => {
  test('exponential target: the compact map stays within 1e-3 of the IQR of the closed-form quantile function', async () => {
    const n = 200_000;
    const p = hazen(n);
    // Source values are the shares themselves, target values the exponential quantiles at them, so the full map is x -> -ln(1 - x).
    const map = await fitMap('quantile', sample(p), sample(Array.from(p, (v) => -Math.log(1 - v))));
    const w = map.diagnostics().warnings.find((x) => x.code === 'compacted');
    expect(w).toBeDefined();
    const keptKnots = (map.toJSON().params as { columns: { xs: number[] }[] }).columns[0].xs.length;
    expect(keptKnots).toBeLessThan(n / 20);
    const out = map.apply({ n, d: 1, data: p }).data;
    let worst = 0;
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(out[i] - -Math.log(1 - p[i])));
    // Source: exponential(1) quartiles are ln(4/3) and ln 4, so its interquartile range is ln 3.
    expect(worst).toBeLessThan(1e-3 * Math.log(3));
  });

  test('normal target (probit from simple-statistics): within 1e-3 of the IQR', async () => {
    const n = 100_000;
    const p = hazen(n);
    const map = await fitMap('quantile', sample(p), sample(Array.from(p, (v) => probit(v))));
    const out = map.apply({ n, d: 1, data: p }).data;
    let worst = 0;
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(out[i] - probit(p[i])));
    // Source: standard normal quartiles are +-0.67449 (normal table), IQR 1.34898.
    expect(worst).toBeLessThan(1e-3 * 1.34898);
  });

  test('1,048,576 rows: at most 200 KB of JSON, error below 1e-3 of the target IQR as measured over the source rows', async () => {
    const n = 1_048_576;
    const r = new Random(7);
    const s = Float64Array.from({ length: n }, () => r.normal());
    const t = Float64Array.from({ length: n }, () => 3 + 2 * r.normal());
    const compact = await fitMap('quantile', { n, d: 1, data: s, weights: null }, { n, d: 1, data: t, weights: null });
    const full = await fitMap('quantile', { n, d: 1, data: s, weights: null }, { n, d: 1, data: t, weights: null }, { knots: 1e9 });
    const text = JSON.stringify(compact.toJSON());
    // Source: the size goal (design choice of the product: 200 KB).
    expect(text.length).toBeLessThan(200 * 1024);
    const a = restoreMap(parseMapJSON(text)).apply({ n, d: 1, data: s }).data;
    const b = full.apply({ n, d: 1, data: s }).data;
    let worst = 0;
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
    const sorted = Float64Array.from(t).sort();
    const iqr = sorted[Math.floor(0.75 * n)] - sorted[Math.floor(0.25 * n)];
    // Source: the error goal, 1e-3 of the target's interquartile range (design choice of the product).
    expect(worst).toBeLessThan(1e-3 * iqr);
    const stated = /largest difference ([0-9.e-]+)/.exec(compact.diagnostics().warnings.find((w) => w.code === 'compacted')!.message)![1];
    expect(worst).toBeLessThanOrEqual(Number(stated) * (1 + 1e-2));
  });

  test.each(['clamp', 'linear'])('knots=50 keeps at most 50 knots; beyond the fitted range (tails=%s) it equals the full map', async (tails) => {
    const r = new Random(11);
    const src = sample(Array.from({ length: 5000 }, () => r.normal()));
    const tgt = sample(Array.from({ length: 4000 }, () => Math.exp(r.normal())));
    const c = await fitMap('quantile', src, tgt, { knots: 50, tails });
    const f = await fitMap('quantile', src, tgt, { knots: 1e9, tails });
    expect((c.toJSON().params as { columns: { xs: number[] }[] }).columns[0].xs.length).toBeLessThanOrEqual(50);
    const far = { n: 4, d: 1, data: Float64Array.of(-50, -9, 9, 50) };
    // Source: design choice: the first and last segments are kept, so the tails are the full map's own.
    expect(Array.from(c.apply(far).data)).toEqual(Array.from(f.apply(far).data));
  });

  test('the greedy walk on a straight line keeps only the two end segments; largestDifference measures a bent line', () => {
    const xs = Float64Array.from({ length: 10 }, (_, i) => i);
    // Source: a straight line is its own chord (arithmetic).
    expect(Array.from(compactIndices(xs, xs, 0, 0))).toEqual([0, 1, 8, 9]);
    // Source: arithmetic: the chord from (0,0) to (2,2) passes 1 below (1,2).
    expect(largestDifference(Float64Array.of(0, 1, 2), Float64Array.of(0, 2, 2), Uint32Array.of(0, 2))).toBe(1);
  });

  test('a knots setting below 4 is refused', async () => {
    await expect(fitMap('quantile', sample([1, 2, 3, 4, 5, 6]), sample([1, 2, 3, 4, 5, 7]), { knots: 3 })).rejects.toThrow(/at least 4/);
  });
});
