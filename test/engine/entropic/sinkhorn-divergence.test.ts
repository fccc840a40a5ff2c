import { sinkhornDivergence } from '../../../src/engine/entropic/sinkhorn-divergence';
import type { Points } from '../../../src/engine/points';

function normal(n: number, d: number, seed: number, scale = 1, shift = 0): Points {
  let s = seed >>> 0;
  const u = (): number => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) data[i] = shift + scale * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return { n, d, data };
}
const uniformLog = (n: number): Float64Array => new Float64Array(n).fill(-Math.log(n));
const opts = { tolerance: 1e-10, maxIterations: 5000 };

describe('sinkhorn-divergence', () => {
  test('S_eps is about 0 for identical samples', () => {
    const x = normal(60, 2, 1);
    const r = sinkhornDivergence({ x, y: x, logA: uniformLog(60), logB: uniformLog(60) }, { eps: 0.1, ...opts });
    // Source: Feydy et al. 2019, Theorem 1 (S_eps(a, a) = 0).
    expect(Math.abs(r.divergence)).toBeLessThan(1e-9);
  });

  test('S_eps is symmetric in its two samples', () => {
    const x = normal(50, 2, 2);
    const y = normal(40, 2, 3, 1.5, 1);
    const ab = sinkhornDivergence({ x, y, logA: uniformLog(50), logB: uniformLog(40) }, { eps: 0.2, ...opts });
    const ba = sinkhornDivergence({ x: y, y: x, logA: uniformLog(40), logB: uniformLog(50) }, { eps: 0.2, ...opts });
    // Source: Feydy et al. 2019, eq. (4) is symmetric by construction.
    expect(Math.abs(ab.divergence - ba.divergence)).toBeLessThan(1e-9);
    expect(ab.divergence).toBeGreaterThan(0);
  });

  test('as eps shrinks, 2 S_eps approaches the exact 1-D W2^2 of equal-size samples', () => {
    const n = 60;
    const x = normal(n, 1, 4);
    const y = normal(n, 1, 5, 2, 3);
    const sx = Array.from(x.data).sort((p, q) => p - q);
    const sy = Array.from(y.data).sort((p, q) => p - q);
    // Source: fact of the trade, exact 1-D W2^2 of equal-size samples = mean squared difference of sorted values.
    const w2sq = sx.reduce((s, v, i) => s + (v - sy[i]) ** 2, 0) / n;
    const gaps = [1, 0.1, 0.01].map((eps) => {
      const r = sinkhornDivergence({ x, y, logA: uniformLog(n), logB: uniformLog(n) }, { eps, tolerance: 1e-9, maxIterations: 20000 });
      return Math.abs(2 * r.divergence - w2sq);
    });
    expect(gaps[1]).toBeLessThan(gaps[0]);
    expect(gaps[2]).toBeLessThan(gaps[1] + 1e-9);
    expect(gaps[2] / w2sq).toBeLessThan(0.01);
  });
});
