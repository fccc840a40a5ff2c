import * as ss from 'simple-statistics';
import { Random } from '../../../src/engine/stats/random';

describe('Random (seeded sfc32)', () => {
  test('the same seed gives the same stream; different seeds differ', () => {
    const a = new Random(7);
    const b = new Random(7);
    const c = new Random(8);
    const xa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xa);
  });

  test('uniform draws have mean 1/2 and variance 1/12 within sampling error', () => {
    // Source: moments of the uniform distribution (fact of the trade); tolerance 5 standard errors
    const r = new Random(1);
    const xs = Array.from({ length: 100_000 }, () => r.uniform());
    expect(Math.abs(ss.mean(xs) - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / 1e5));
    expect(Math.abs(ss.variance(xs) - 1 / 12)).toBeLessThan(0.002);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
  });

  test('normal draws have mean 0, variance 1 and kurtosis 3 within sampling error', () => {
    // Source: moments of the standard normal (fact of the trade); simple-statistics for the sample moments
    const r = new Random(2);
    const xs = Array.from({ length: 100_000 }, () => r.normal());
    expect(Math.abs(ss.mean(xs))).toBeLessThan(0.016);
    expect(Math.abs(ss.variance(xs) - 1)).toBeLessThan(0.02);
    expect(Math.abs(ss.sampleKurtosis(xs))).toBeLessThan(0.08); // excess kurtosis 0
  });

  test('permutation holds every index once', () => {
    const p = new Random(3).permutation(1000);
    expect(Array.from(p).sort((x, y) => x - y)).toEqual(Array.from({ length: 1000 }, (_, i) => i));
  });

  test('choose gives k distinct sorted indices in range, the same for the same seed', () => {
    const a = new Random(7).choose(1000, 50);
    expect(Array.from(new Random(7).choose(1000, 50))).toEqual(Array.from(a));
    expect(new Set(a).size).toBe(50);
    for (let i = 1; i < a.length; i++) expect(a[i]).toBeGreaterThan(a[i - 1]);
    expect(a[0]).toBeGreaterThanOrEqual(0);
    expect(a[49]).toBeLessThan(1000);
    expect(Array.from(new Random(8).choose(1000, 50))).not.toEqual(Array.from(a));
    expect(Array.from(new Random(1).choose(4, 10))).toEqual([0, 1, 2, 3]);
  });
});
