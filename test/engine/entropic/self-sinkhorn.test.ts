import { solveSelfSinkhorn } from '../../../src/engine/entropic/self-sinkhorn';
import { solveSinkhorn } from '../../../src/engine/entropic/sinkhorn';
import type { Points } from '../../../src/engine/points';

function uniformRows(n: number, d: number, seed: number): Points {
  let s = seed >>> 0;
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    data[i] = (4 * s) / 4294967296;
  }
  return { n, d, data };
}

describe('self-sinkhorn', () => {
  test('solveSelfSinkhorn(x) gives the same OT_eps(a, a) as the two-sided solve of x onto itself', () => {
    const x = uniformRows(40, 2, 1);
    const logA = Float64Array.from({ length: 40 }, (_, i) => Math.log((1 + (i % 3)) / 80));
    const eps = 0.05;
    const self = solveSelfSinkhorn(x, logA, { eps, tolerance: 1e-12, maxIterations: 5000 });
    // Source: the two-sided solver of sinkhorn.ts, itself checked against plain scaling Sinkhorn.
    const two = solveSinkhorn({ x, y: x, logA, logB: logA }, { eps, tolerance: 1e-12, maxIterations: 5000 });
    expect(self.converged).toBe(true);
    expect(Math.abs(self.value - two.value)).toBeLessThan(1e-10);
  });

  test('the symmetric potential makes the plan a_i a_j exp((f_i + f_j - C_ij) / eps) have marginal a', () => {
    const x = uniformRows(25, 3, 2);
    const logA = new Float64Array(25).fill(-Math.log(25));
    const eps = 0.2;
    const r = solveSelfSinkhorn(x, logA, { eps, tolerance: 1e-10, maxIterations: 2000 });
    let err = 0;
    for (let i = 0; i < 25; i++) {
      let row = 0;
      for (let j = 0; j < 25; j++) {
        let c = 0;
        for (let k = 0; k < 3; k++) c += (x.data[i * 3 + k] - x.data[j * 3 + k]) ** 2;
        row += Math.exp(2 * logA[0] + (r.f[i] + r.f[j] - c / 2) / eps);
      }
      err += Math.abs(row - 1 / 25);
    }
    // Source: Feydy et al. 2019, section 3.1 (symmetric fixed point).
    expect(err).toBeLessThan(1e-10);
    expect(r.marginalError).toBeLessThan(1e-10);
  });
});
