import { checkedCdf, ecdfGap, ksStatistic } from '../../../src/engine/stats/ks';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

/** sup over every data point t of |F_a(t) - G_b(t)|, by direct counting: O((n + m)^2). */
function bruteKs(a: number[], b: number[], wa?: number[], wb?: number[]): number {
  const ua = wa ?? a.map(() => 1);
  const ub = wb ?? b.map(() => 1);
  const ta = ua.reduce((x, y) => x + y, 0);
  const tb = ub.reduce((x, y) => x + y, 0);
  let sup = 0;
  for (const t of [...a, ...b]) {
    let f = 0;
    let g = 0;
    a.forEach((x, i) => (f += x <= t ? ua[i] : 0));
    b.forEach((x, i) => (g += x <= t ? ub[i] : 0));
    sup = Math.max(sup, Math.abs(f / ta - g / tb));
  }
  return sup;
}

describe('ksStatistic(a, b, wa, wb) is the two-sample sup |F_a - G_b|', () => {
  test('[1, 2, 3, 4] against [3, 4, 5, 6] gives 0.5', () => {
    // Source: hand computation (at t = 2: F = 0.5, G = 0)
    expect(ksStatistic([1, 2, 3, 4], [3, 4, 5, 6])).toBe(0.5);
  });

  test('ties within and across samples jump together: [1, 1, 2] against [1, 2, 2] gives 1/3', () => {
    // Source: hand computation (at t = 1: F = 2/3, G = 1/3; at t = 2 both are 1)
    expect(ksStatistic([1, 1, 2], [1, 2, 2])).toBeCloseTo(1 / 3, 15);
  });

  test('identical samples give 0 and disjoint ranges give 1', () => {
    // Source: definition
    expect(ksStatistic([3, 1, 2], [2, 3, 1])).toBe(0);
    expect(ksStatistic([1, 2], [5, 6, 7])).toBe(1);
  });

  test('agrees with direct counting on seeded random samples, weighted and not', () => {
    const u = rng(4);
    for (let trial = 0; trial < 5; trial++) {
      const a = Array.from({ length: 40 + trial }, () => Math.round(20 * u()) / 4);
      const b = Array.from({ length: 31 + 2 * trial }, () => Math.round(22 * u()) / 4 - 0.5);
      const wa = a.map(() => u());
      const wb = b.map(() => (u() < 0.2 ? 0 : u()));
      // Source: brute-force counting of the definition
      expect(ksStatistic(a, b)).toBeCloseTo(bruteKs(a, b), 14);
      expect(ksStatistic(a, b, wa, wb)).toBeCloseTo(bruteKs(a, b, wa, wb), 14);
    }
  });

  test('integer weights act as repeated values', () => {
    // Source: common practice (frequency weights)
    expect(ksStatistic([1, 2, 3], [2, 4], [2, 1, 1], [1, 3])).toBeCloseTo(ksStatistic([1, 1, 2, 3], [2, 4, 4, 4]), 15);
  });

  test('inputs are not mutated', () => {
    const a = Object.freeze([3, 1, 2]);
    const b = Float64Array.from([9, 0, 4]);
    ksStatistic(a, b, Object.freeze([1, 2, 3]), null);
    expect([...a]).toEqual([3, 1, 2]);
    expect(Array.from(b)).toEqual([9, 0, 4]);
  });

  test('bad input throws RemapError naming the argument', () => {
    expect(() => ksStatistic([], [1])).toThrow(/a is empty/);
    expect(() => ksStatistic([1], [NaN])).toThrow(/b holds NaN at position 1/);
    expect(() => ksStatistic([1, 2], [1], [1, -2])).toThrow(/weight 2 of a is -2/);
    expect(() => ksStatistic([1, 2], [1], [0, 0])).toThrow(/add up to 0/);
    expect(() => ksStatistic([1, 2], [1], [1])).toThrow(/1 weights for the 2 values of a/);
  });
});

describe('checkedCdf and ecdfGap', () => {
  test('weights are carried along, equal values merged, and scaled to sum to one', () => {
    const s = checkedCdf([3, 1, 2, 1], [1, 1, 2, 4], 'a', 'f');
    expect(Array.from(s.values)).toEqual([1, 2, 3]);
    const shares = Array.from(s.cumulative, (c, k) => (c - (k > 0 ? s.cumulative[k - 1] : 0)) / s.total);
    expect(shares).toEqual([0.625, 0.25, 0.125]);
  });

  test('ecdfGap integrates (F - G)^2 exactly: point masses at 0 and 1 give 1', () => {
    // Source: hand computation
    const g = ecdfGap(checkedCdf([0], null, 'a', 'f'), checkedCdf([1], null, 'b', 'f'));
    expect(g).toEqual({ sup: 1, squaredIntegral: 1 });
  });
});
