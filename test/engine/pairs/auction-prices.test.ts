import { solveAssignment } from '../../../src/engine/pairs/assignment';
import { auctionPrices } from '../../../src/engine/pairs/auction-prices';
import { Random } from '../../../src/engine/stats/random';

/** The least total over all n! permutations, by enumeration (Heap's algorithm). */
function bruteForce(c: Float64Array, n: number): number {
  const p = Array.from({ length: n }, (_, i) => i);
  const total = (): number => p.reduce((s, j, i) => s + c[i * n + j], 0);
  let best = total();
  const k = new Array(n).fill(0);
  for (let i = 1; i < n;) {
    if (k[i] < i) {
      const a = i % 2 === 0 ? 0 : k[i];
      [p[a], p[i]] = [p[i], p[a]];
      best = Math.min(best, total());
      k[i]++;
      i = 1;
    } else k[i++] = 0;
  }
  return best;
}

describe('auctionPrices as a warm start for the exact assignment', () => {
  test('from auction prices the solver reaches the optimum found by enumerating every permutation (n = 7, 30 seeded tables)', () => {
    // Source: enumeration of all 5,040 permutations is the definition of the optimum.
    for (let seed = 1; seed <= 30; seed++) {
      const r = new Random(seed);
      const n = 7;
      const c = Float64Array.from({ length: n * n }, () => (seed % 3 === 0 ? Math.round(4 * r.uniform()) : Math.exp(3 * r.normal())));
      const warm = solveAssignment(c, n, { prices: auctionPrices(c, n) });
      expect(warm.total).toBeCloseTo(bruteForce(c, n), 9);
    }
  });

  test('on 400 rows of squared distances the warm and the cold solver find the same total, and the warm duals certify it', () => {
    // Source: linear-programming duality: u_i + v_j <= c_ij everywhere with sum u + sum v = total proves optimality.
    const r = new Random(5);
    const n = 400;
    const x = Array.from({ length: n }, () => [r.normal(), r.normal()]);
    const y = Array.from({ length: n }, () => [Math.exp(r.normal()), 3 * r.normal() ** 3]);
    const c = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) c[i * n + j] = (x[i][0] - y[j][0]) ** 2 + (x[i][1] - y[j][1]) ** 2;
    const cold = solveAssignment(c, n);
    const warm = solveAssignment(c, n, { prices: auctionPrices(c, n) });
    expect(Math.abs(warm.total - cold.total)).toBeLessThan(1e-9 * cold.total);
    let dual = 0;
    let worst = 0;
    for (let i = 0; i < n; i++) dual += warm.rowPotential[i] + warm.colPotential[i];
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) worst = Math.max(worst, warm.rowPotential[i] + warm.colPotential[j] - c[i * n + j]);
    expect(Math.abs(dual - warm.total)).toBeLessThan(1e-9 * warm.total);
    expect(worst).toBeLessThan(1e-9 * warm.total);
  });

  test('starting prices of the wrong length are refused', () => {
    expect(() => solveAssignment(Float64Array.of(1, 2, 3, 4), 2, { prices: Float64Array.of(0) })).toThrow(/2 finite numbers/);
  });
});
