import { sampleStandardDeviation } from 'simple-statistics';
import { fitMapSync } from '../../../src/engine/methods';
import { column } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';
import { bootstrapBounds } from '../../../src/engine/uncertainty/bootstrap-bounds';
import { normalCdf, normalQuantile } from '../../../src/engine/uncertainty/normal-quantile';
import { replicateBounds } from '../../../src/engine/uncertainty/replicate-bounds';
import { ReplicateFitter } from '../../../src/engine/uncertainty/replicate-fitter';
import { replicateMultiplier } from '../../../src/engine/uncertainty/replicate-variance';

const one = (data: Float64Array) => ({ n: data.length, d: 1, data, weights: null });

/**
 * Coverage by simulation. Source log-normal(0, 0.5^2) (or normal(3, 0.5^2) for the linear map), target
 * normal(10, 2^2): the population map is T(x) = 10 + 2 (ln x) / 0.5 (resp. 10 + 2 (x - 3) / 0.5), since
 * F_lognormal(x) = Phi(ln x / 0.5) and Phi^-1 cancels (Source: definition of the monotone map
 * G^-1 o F; Villani, "Topics in Optimal Transportation", Thm 2.18). Checked at the source's quantiles
 * z = -1, 0, 1, where T = 10 + 2 z.
 */
function coverage(method: 'quantile' | 'linear', n: number, replicates: number, runs: number): number[] {
  const r = new Random(2024);
  const zs = [-1, 0, 1];
  const hits = zs.map(() => 0);
  for (let k = 0; k < runs; k++) {
    const src = Float64Array.from({ length: n }, () => (method === 'linear' ? 3 + 0.5 * r.normal() : Math.exp(0.5 * r.normal())));
    const tgt = Float64Array.from({ length: n }, () => 10 + 2 * r.normal());
    const x = Float64Array.from(zs, (z) => (method === 'linear' ? 3 + 0.5 * z : Math.exp(0.5 * z)));
    const b = bootstrapBounds(method, one(src), one(tgt), column(x), { replicates, seed: k });
    zs.forEach((z, j) => {
      if (b.lower[j] <= 10 + 2 * z && 10 + 2 * z <= b.upper[j]) hits[j]++;
    });
  }
  return hits.map((h) => h / runs);
}

describe('bounds on mapped values', () => {
  test('normalCdf and normalQuantile agree with the handbook', () => {
    // Source: Abramowitz & Stegun (1964), Table 26.1: P(1) = 0.841344746068543, P(2) = 0.977249868051821, P(3) = 0.998650101968370.
    expect(normalCdf(1)).toBeCloseTo(0.841344746068543, 14);
    expect(normalCdf(2)).toBeCloseTo(0.977249868051821, 14);
    expect(normalCdf(-3)).toBeCloseTo(1 - 0.99865010196837, 15);
    // Source: A&S Table 26.5 (percentage points): x(0.025) = 1.959963985 upper tail, x(0.005) = 2.575829304.
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963985, 9);
    expect(normalQuantile(0.005)).toBeCloseTo(-2.575829304, 9);
  });

  test('the replicate multipliers follow the published formulas', () => {
    // Source: Wolter (2007) ch. 5 (bootstrap, 1/R), ch. 4 (JK1, (R-1)/R); Fay (1989) and Rust & Rao (1996): 1/(R (1-k)^2).
    expect(replicateMultiplier({ kind: 'bootstrap' }, 80)).toBe(1 / 80);
    expect(replicateMultiplier({ kind: 'jackknife' }, 50)).toBe(49 / 50);
    expect(replicateMultiplier({ kind: 'brr', fay: 0.5 }, 16)).toBe(1 / 4);
    expect(replicateMultiplier({ kind: 'brr' }, 16)).toBe(1 / 16);
    // Source: US Census Bureau, ACS design and methodology, successive-difference replication: 4/80.
    expect(replicateMultiplier({ kind: 'custom', multiplier: 4 / 80 }, 80)).toBe(0.05);
    expect(() => replicateMultiplier({ kind: 'brr', fay: 1 }, 4)).toThrow(/Fay's factor is 1/);
  });

  test('JK1 replicates of the target give the textbook standard error of a mean where the linear map reduces to one', () => {
    // At x = the source mean the linear map is the target mean m2 (T(x) = m2 + A (x - m1)); with the source
    // fixed, JK1 replicates of the target give v = ((m-1)/m) sum (mean_(i) - mean)^2 = s^2 / m.
    // Source: Wolter (2007), sec. 4.2 (the jackknife variance of the sample mean equals s^2 / n).
    const r = new Random(5);
    const m = 40;
    const tgt = Float64Array.from({ length: m }, () => 5 + r.normal());
    const src = Float64Array.from({ length: 30 }, () => r.normal());
    let mean1 = 0;
    for (const v of src) mean1 += v / src.length;
    const jk = new Float64Array(m * m).fill(m / (m - 1));
    for (let i = 0; i < m; i++) jk[i * m + i] = 0;
    const b = replicateBounds('linear', one(src), one(tgt), column([mean1]), { target: { kind: 'jackknife', weights: { n: m, d: m, data: jk } } });
    const expected = sampleStandardDeviation(Array.from(tgt)) / Math.sqrt(m);
    expect(b.standardError![0]).toBeCloseTo(expected, 10);
    expect(b.upper[0] - b.estimate[0]).toBeCloseTo(1.959963985 * expected, 8);
    expect(b.warnings.map((w) => w.message).join(' ')).toMatch(/No replicate weights were given for the source/);
  });

  test("a refit with the samples' own weights gives the fitted map's own numbers to rounding (1-D methods)", () => {
    const r = new Random(9);
    const src = {
      n: 50,
      d: 1,
      data: Float64Array.from({ length: 50 }, () => Math.floor(r.uniform() * 9)),
      weights: Float64Array.from({ length: 50 }, () => 0.5 + r.uniform()),
    };
    const tgt = { n: 40, d: 1, data: Float64Array.from({ length: 40 }, () => Math.floor(r.uniform() * 12)), weights: null };
    const x = column([0, 1.5, 3, 4.2, 8, 9.5]);
    for (const method of ['quantile', 'step', 'ordinal'] as const) {
      const map = fitMapSync(method, src, tgt, { tails: 'linear' });
      const f = new ReplicateFitter(method, src, tgt, x, map.diagnostics().settings);
      const out = new Float64Array(x.n);
      f.mapWith(f.fullWeights('source'), f.fullWeights('target'), out);
      // Equal to rounding: the weights of tied rows are added up in another order (design choice).
      const fitted = map.apply(x).data;
      out.forEach((v, j) => expect(v).toBeCloseTo(fitted[j], 12));
    }
  });

  test('the same seed gives the same bounds; another seed other bounds', () => {
    const r = new Random(1);
    const src = one(Float64Array.from({ length: 300 }, () => r.normal()));
    const tgt = one(Float64Array.from({ length: 200 }, () => 3 * r.normal()));
    const x = column([-1, 0, 1]);
    const a = bootstrapBounds('quantile', src, tgt, x, { seed: 7, replicates: 200 });
    const b = bootstrapBounds('quantile', src, tgt, x, { seed: 7, replicates: 200 });
    const c = bootstrapBounds('quantile', src, tgt, x, { seed: 8, replicates: 200 });
    expect(Array.from(a.lower)).toEqual(Array.from(b.lower));
    expect(Array.from(a.upper)).toEqual(Array.from(b.upper));
    expect(Array.from(c.lower)).not.toEqual(Array.from(a.lower));
    for (let j = 0; j < 3; j++) expect(a.lower[j]).toBeLessThan(a.upper[j]);
  });

  // 199 bootstrap replicates per interval: (199 + 1) x 0.025 = 5 is a whole number, so the percentile ends are exactly the 5th
  // and 195th of the 199 replicate values, and a further draw from the same bootstrap distribution falls between them with
  // probability (195 - 5) / (199 + 1) = 0.95 exactly, whatever that distribution (Source: the distribution-free coverage of
  // order statistics, e.g. David & Nagaraja, "Order Statistics", 3rd ed. 2003, sec. 7.2, from memory). Finite R then adds
  // spread to the ends but no bias to the coverage, which is why R with (R + 1) alpha whole is the usual choice (Source:
  // Davison & Hinkley 1997, sec. 2.5 and 5.2; Hall, Ann. Statist. 14, 1986, on the number of bootstrap simulations; from memory).
  test('coverage: the 95 % percentile bootstrap covers the population quantile map in 93-97 % of 400 runs', () => {
    const cov = coverage('quantile', 200, 199, 400);
    // Source: the nominal level 95 %; the 93-97 % band allows about 1.8 binomial standard errors for 400 runs (design choice).
    for (const c of cov) {
      expect(c).toBeGreaterThanOrEqual(0.93);
      expect(c).toBeLessThanOrEqual(0.97);
    }
  });

  test('coverage: the 95 % percentile bootstrap covers the population linear map in 93-97 % of 400 runs', () => {
    const cov = coverage('linear', 200, 199, 400);
    for (const c of cov) {
      expect(c).toBeGreaterThanOrEqual(0.93);
      expect(c).toBeLessThanOrEqual(0.97);
    }
  });

  test('bad options are refused with what to fix', () => {
    const s = one(Float64Array.of(1, 2, 3, 4));
    expect(() => bootstrapBounds('entropic', s, s, column([1]))).toThrow(/quantile, step, ordinal and linear methods, not entropic/);
    expect(() => bootstrapBounds('quantile', s, s, column([1]), { level: 95 })).toThrow(/level is 95; give a share between 0 and 1/);
    expect(() => bootstrapBounds('quantile', s, s, column([1]), { replicates: 5 })).toThrow(/replicates is 5/);
    expect(() => replicateBounds('quantile', s, s, column([1]), {})).toThrow(/no replicate weights were given/);
    expect(() =>
      replicateBounds('quantile', s, s, column([1]), { source: { kind: 'jackknife', weights: { n: 3, d: 2, data: new Float64Array(6).fill(1) } } }),
    ).toThrow(/3 rows but the source has 4/);
  });
});
