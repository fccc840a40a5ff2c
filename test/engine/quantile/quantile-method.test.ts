import { extrapolationWarning } from '../../../src/engine/outside';
import { quantileSorted } from 'simple-statistics';
import { prepareFit } from '../../../src/engine/methods';
import type { MethodSpec } from '../../../src/engine/method';
import { column, sample, type Sample } from '../../../src/engine/points';
import { quantileMethod } from '../../../src/engine/quantile/quantile-method';
import { stepMethod } from '../../../src/engine/quantile/step-method';
import { wasserstein1d } from '../../../src/engine/stats/wasserstein-1d';
import type { TransportMap } from '../../../src/engine/map';

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function fit(m: MethodSpec, s: Sample, t: Sample, raw: Record<string, unknown> = {}): TransportMap {
  return m.fit(s, t, prepareFit(m, s, t, raw), {}) as TransportMap;
}

const apply = (m: TransportMap, xs: number[]) => Array.from(m.apply(column(xs)).data);

describe('quantile method', () => {
  test('the spec: one-column, weights, 2 rows minimum', () => {
    expect(quantileMethod.name).toBe('quantile');
    expect(quantileMethod.shape).toBe('one-column');
    expect(quantileMethod.weights).toBe(true);
    expect(quantileMethod.minRows(1)).toBe(2);
  });

  test('equal sizes map the i-th smallest source value exactly to the i-th smallest target value', () => {
    const r = rng(1);
    const x = Object.freeze(Array.from({ length: 200 }, () => r() * 10));
    const y = Object.freeze(Array.from({ length: 200 }, () => Math.exp(r() * 3)));
    const m = fit(quantileMethod, sample(x), sample(y));
    const xs = [...x].sort((a, b) => a - b);
    const ys = [...y].sort((a, b) => a - b);
    expect(apply(m, xs)).toEqual(ys);
    expect(apply(m, [...x])).toEqual(x.map((v) => ys[xs.indexOf(v)]));
  });

  test('between order statistics it agrees with simple-statistics quantileSorted (R-7): index h maps to rank h + 1', () => {
    // Hazen positions (i - 0.5)/n and R-7 positions (i - 1)/(n - 1) both interpolate linearly between
    // the same order statistics, so R-7 at fractional index h is the Hazen value at rank h + 1.
    const r = rng(2);
    const x = Array.from({ length: 50 }, () => r() * 100).sort((a, b) => a - b);
    const ranks = x.map((_, i) => i + 1);
    const m = fit(quantileMethod, sample(x), sample(ranks));
    for (const h of [0, 0.3, 7.5, 21.25, 48.9, 49]) {
      const q = quantileSorted(x, h / 49); // Source: simple-statistics quantileSorted
      expect(apply(m, [q])[0]).toBeCloseTo(h + 1, 9);
    }
  });

  test('invert sends the target order statistics to the source Hazen quantiles at the same shares', () => {
    const r = rng(3);
    const x = Array.from({ length: 73 }, () => r() * 5 - 2);
    const y = Array.from({ length: 41 }, () => r() ** 2 * 100);
    const m = fit(quantileMethod, sample(x), sample(y));
    const xs = [...x].sort((a, b) => a - b);
    const ys = [...y].sort((a, b) => a - b);
    const n = xs.length;
    const got = Array.from(m.invert(column(ys)).data);
    ys.forEach((_, j) => {
      // Source: Hyndman & Fan 1996 ("Sample quantiles in statistical packages", Am. Stat. 50), definition 5 (Hazen):
      // the j-th of m target values sits at share p = (j - 0.5) / m; the source quantile there is read at position h = n p + 0.5
      const p = (j + 0.5) / ys.length;
      const h = n * p + 0.5;
      const k = Math.floor(h);
      const want = xs[k - 1] + (h - k) * (xs[k] - xs[k - 1]);
      expect(got[j]).toBeCloseTo(want, 10);
    });
  });

  test('tails: clamp holds the end values, linear continues the end slopes; both count rows outside', () => {
    const clamp = fit(quantileMethod, sample([0, 1, 2, 3]), sample([0, 10, 20, 30]));
    const linear = fit(quantileMethod, sample([0, 1, 2, 3]), sample([0, 10, 20, 30]), { tails: 'linear' });
    expect(clamp.apply(column([-1, 1.5, 5]))).toMatchObject({ outside: 2 });
    expect(apply(clamp, [-1, 1.5, 5])).toEqual([0, 15, 30]);
    expect(apply(linear, [-1, 1.5, 5])).toEqual([-10, 15, 50]); // Source: by hand, slope 10 at both ends
    expect(Array.from(linear.invert(column([-10, 50])).data)).toEqual([-1, 5]);
    expect(linear.invert(column([-10, 50, 5])).outside).toBe(2);
    // Source: design choice (counts belong to each call; the map's report has no call history)
    expect(clamp.diagnostics()).not.toHaveProperty('applied');
    expect(extrapolationWarning(clamp, clamp.apply(column([-1, 1.5, 5])))?.message).toMatch(/^2 of 3 rows .*clamped.*\(tails=clamp\)/);
    expect(extrapolationWarning(linear, linear.apply(column([-1, 1.5, 5])))?.message).toMatch(/continue linearly .*tails=linear/);
  });

  test('ties merge into one knot at the middle of their block', () => {
    const m = fit(quantileMethod, sample([1, 2, 2, 2, 3]), sample([10, 20, 30, 40, 50]));
    // Source: by hand, the 2s sit at share 0.5, where the target's Hazen curve reads 30
    expect(apply(m, [1, 2, 3])).toEqual([10, 30, 50]);
    expect(m.diagnostics().warnings.map((w) => w.code)).toContain('ties');
  });

  test('cost is the exact W2^2 and W1 between the two samples', () => {
    const x = [0, 1, 3];
    const y = [5, 6, 8];
    const c = fit(quantileMethod, sample(x), sample(y)).cost();
    expect(c.kind).toBe('exact-1d');
    expect(c.w2Squared).toBe(25); // Source: by hand, a shift by 5
    expect(c.w1).toBeCloseTo(wasserstein1d(x, y, null, null, 1), 14);
  });

  test('several columns: each matched on its own, with a marginals-only warning and per-column costs', () => {
    const s = sample([
      [0, 100],
      [1, 300],
      [2, 200],
    ]);
    const t = sample([
      [10, 1],
      [30, 3],
      [20, 2],
    ]);
    const m = fit(quantileMethod, s, t);
    expect(Array.from(m.apply(s).data)).toEqual([10, 1, 20, 3, 30, 2]);
    const d = m.diagnostics();
    expect(d.warnings.map((w) => w.code)).toContain('marginals-only');
    expect(d.cost.kind).toBe('per-column-1d');
    expect(d.cost.perColumn?.length).toBe(2);
    expect(d.cost.w2Squared).toBeCloseTo((d.cost.perColumn ?? [])[0] + (d.cost.perColumn ?? [])[1], 12);
    expect(d.cost.w1).toBeUndefined();
  });

  test('minJacobianEigenvalue is the smallest slope and is positive', () => {
    const m = fit(quantileMethod, sample([0, 1, 3]), sample([0, 10, 12]));
    expect(m.diagnostics().minJacobianEigenvalue).toBe(1); // Source: by hand, slopes 10 and 1
    expect(m.diagnostics().convergence).toBeUndefined();
  });

  test('toJSON / fromJSON restores a map whose apply and invert are bit-identical', () => {
    const r = rng(4);
    const x = Array.from({ length: 300 }, () => r() * 7);
    const y = Array.from({ length: 190 }, () => r() ** 3);
    const m = fit(quantileMethod, sample(x), sample(y), { tails: 'linear' });
    const json = JSON.parse(JSON.stringify(m.toJSON()));
    const back = quantileMethod.fromJSON(json);
    const probe = column(Array.from({ length: 5000 }, () => r() * 9 - 1));
    expect(Array.from(back.apply(probe).data)).toEqual(Array.from(m.apply(probe).data));
    expect(Array.from(back.invert(probe).data)).toEqual(Array.from(m.invert(probe).data));
    expect(back.diagnostics().cost).toEqual(m.diagnostics().cost);
    expect(JSON.stringify(back.toJSON())).toBe(JSON.stringify(m.toJSON()));
  });

  test('mapping the fitted source gives the same bits as mapping a copy of it by search', () => {
    const r = rng(5);
    const x = Array.from({ length: 5000 }, () => r() * 3);
    const y = Array.from({ length: 3001 }, () => r() * 50);
    const s = sample(x);
    const m = fit(quantileMethod, s, sample(y));
    const fast = Array.from(m.apply(s).data);
    const bumped = [...x, 0.5];
    const slow = Array.from(m.apply(column(bumped)).data).slice(0, x.length);
    expect(fast).toEqual(slow);
  });

  test('the fitted-source shortcut matches search bit for bit above the radix-sort size, with weights, negative ties and signed zeros', () => {
    const r = rng(6);
    const n = 6000;
    const x = Array.from({ length: n }, (_, i) => (i % 10 === 0 ? (i % 20 === 0 ? -0 : 0) : -Math.floor(r() * 300) / 8));
    const w = Array.from({ length: n }, () => (r() < 0.05 ? 0 : r() * 0.3));
    const y = Array.from({ length: 4500 }, () => r() * 20 - 5);
    for (const method of [quantileMethod, stepMethod]) {
      const s = sample(x, w);
      const m = fit(method, s, sample(y), { tails: 'linear' });
      const fast = m.apply(s);
      const slow = m.apply(column([...x, 0.5]));
      const a = Array.from(fast.data);
      const b = Array.from(slow.data).slice(0, n);
      expect(a.every((v, i) => Object.is(v, b[i]))).toBe(true);
      expect(fast.outside).toBe(0);
    }
  });

  test('inputs are not mutated', () => {
    const data = Float64Array.of(3, 1, 2, 5);
    const weights = Float64Array.of(1, 2, 0, 1);
    const s: Sample = { n: 4, d: 1, data, weights };
    const t = sample([9, 7, 8]);
    const m = fit(quantileMethod, s, t);
    const q = column([4, 2, 0]);
    m.apply(q);
    m.invert(q);
    expect(Array.from(data)).toEqual([3, 1, 2, 5]);
    expect(Array.from(weights)).toEqual([1, 2, 0, 1]);
    expect(Array.from(q.data)).toEqual([4, 2, 0]);
  });

  test('a column with a single distinct value is refused with a #NUM!-kind error', () => {
    expect(() => fit(quantileMethod, sample([2, 2, 2]), sample([1, 2, 3]))).toThrow(/same value \(2\)/);
    expect(() => fit(quantileMethod, sample([1, 2, 3]), sample([4, 4]))).toThrow(expect.objectContaining({ kind: 'num' }));
  });
});
