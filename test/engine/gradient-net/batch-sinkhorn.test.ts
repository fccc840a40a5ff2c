import { batchSinkhorn, epsSchedule, softminRows, squaredDistanceMatrix } from '../../../src/engine/gradient-net/batch-sinkhorn';
import { Random } from '../../../src/engine/stats/random';

const cloud = (n: number, d: number, seed: number, shift = 0) => {
  const r = new Random(seed);
  return Float64Array.from({ length: n * d }, () => r.normal() + shift);
};

describe('batchSinkhorn', () => {
  test('the divergence of a cloud with itself is about 0 and with a shifted copy about |shift|^2', () => {
    const x = cloud(60, 2, 1);
    const setup = { blur: 0.05, diameter2: 50, iterations: 40 };
    expect(Math.abs(batchSinkhorn(x, 60, x, 60, 2, setup).value)).toBeLessThan(1e-6);
    const y = x.map((v) => v + 0.5);
    // Source: Feydy et al. arXiv 1810.08278 -- a translation by t costs |t|^2 in W2^2 (here 2 * 0.25), the debiased entropic cost is close for a small blur.
    expect(batchSinkhorn(x, 60, y, 60, 2, setup).value).toBeCloseTo(0.5, 2);
  });

  test('the envelope gradient matches central differences of the value', () => {
    const n = 20;
    const d = 2;
    const x = cloud(n, d, 2);
    const y = cloud(25, d, 3, 0.7);
    const setup = { blur: 1, diameter2: 50, iterations: 600 }; // converged potentials, so the envelope theorem applies
    const { gradient } = batchSinkhorn(x, n, y, 25, d, setup);
    for (const j of [0, 7, 13, 39]) {
      const e = 1e-5;
      const xp = Float64Array.from(x);
      const xm = Float64Array.from(x);
      xp[j] += e;
      xm[j] -= e;
      const fd = (batchSinkhorn(xp, n, y, 25, d, setup).value - batchSinkhorn(xm, n, y, 25, d, setup).value) / (2 * e);
      expect(Math.abs(fd - gradient[j])).toBeLessThan(1e-6 + 1e-4 * Math.abs(fd)); // Source: common practice, central differences
    }
  });

  test('softminRows with h = 0 on a 1 x 2 cost matrix is -eps log((e^-c1/eps + e^-c2/eps) / 2)', () => {
    const out = new Float64Array(1);
    softminRows(Float64Array.of(1, 2), 1, 2, null, 1, out);
    expect(out[0]).toBeCloseTo(-Math.log((Math.exp(-1) + Math.exp(-2)) / 2), 14); // Source: definition
    expect(squaredDistanceMatrix(Float64Array.of(0, 0), 1, Float64Array.of(3, 4), 1, 2)[0]).toBe(25);
  });

  test('the eps schedule falls geometrically to blur^2 and stays there', () => {
    const s = epsSchedule({ blur: 0.1, diameter2: 100, iterations: 9 });
    expect(s[0]).toBe(100);
    expect(s[8]).toBeCloseTo(0.01, 15);
    for (let k = 1; k < 9; k++) expect(s[k]).toBeLessThanOrEqual(s[k - 1]);
  });

  test('with a tolerance it iterates until the potentials settle, which fixes the gradient a short fixed count gets wrong', () => {
    // A heavy-tailed target (10 % of rows spread 6 times wider), as in the scenario demo data.
    const r = new Random(4);
    const n = 50;
    const x = Float64Array.from({ length: n * 2 }, () => r.normal());
    const y = new Float64Array(n * 2);
    for (let i = 0; i < n; i++) {
      const s = i % 10 === 0 ? 6 : 1;
      y[2 * i] = s * r.normal();
      y[2 * i + 1] = s * r.normal();
    }
    const base = { blur: 1.5, diameter2: 4000, iterations: 8 };
    const ref = batchSinkhorn(x, n, y, n, 2, { ...base, iterations: 1500 }).gradient;
    const err = (g: Float64Array) => {
      let e = 0;
      let s = 0;
      for (let i = 0; i < g.length; i++) {
        e += (g[i] - ref[i]) ** 2;
        s += ref[i] ** 2;
      }
      return Math.sqrt(e / s);
    };
    const fixed = batchSinkhorn(x, n, y, n, 2, base);
    const settled = batchSinkhorn(x, n, y, n, 2, { ...base, tolerance: 1e-3, maxIterations: 500 });
    expect(fixed.iterations).toBe(8);
    expect(settled.iterations).toBeGreaterThan(8);
    expect(settled.iterations).toBeLessThan(500);
    expect(err(fixed.gradient)).toBeGreaterThan(0.2); // measured 0.63: 8 iterations are far from converged here
    expect(err(settled.gradient)).toBeLessThan(0.01); // Source: common practice, relative gradient error of a converged solver
  });
});
