/**
 * Outside checks of the pairs method's exact assignment against answers found
 * without it: brute force over all n! permutations, the 1-D sorted matching,
 * and a worked 3x3 example.
 */
import { mean, quantileSorted } from 'simple-statistics';
import { solveAssignment } from '../../src/engine/pairs/assignment';
import { findPairs, matchRows } from '../../src/engine/pairs/match-rows';
import { fitPairs } from '../../src/engine/pairs/method';
import { column, type Points } from '../../src/engine/points';

function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

/** The smallest sum_i cost[i][p(i)] over all permutations p (Heap's algorithm), n <= 8. */
function bruteForce(cost: ArrayLike<number>, n: number): number {
  const p = Array.from({ length: n }, (_, i) => i);
  const c = new Array<number>(n).fill(0);
  const total = (): number => p.reduce((s, j, i) => s + cost[i * n + j], 0);
  let best = total();
  let i = 0;
  while (i < n) {
    if (c[i] < i) {
      const k = i % 2 === 0 ? 0 : c[i];
      [p[k], p[i]] = [p[i], p[k]];
      best = Math.min(best, total());
      c[i]++;
      i = 0;
    } else {
      c[i] = 0;
      i++;
    }
  }
  return best;
}

function table(x: Points, y: Points): number[] {
  const out: number[] = [];
  for (let i = 0; i < x.n; i++) {
    for (let j = 0; j < y.n; j++) {
      let s = 0;
      for (let k = 0; k < x.d; k++) s += (x.data[i * x.d + k] - y.data[j * x.d + k]) ** 2;
      out.push(s);
    }
  }
  return out;
}

describe('exact assignment against outside answers', () => {
  test('a three-worker, three-job table worked by hand over all 6 permutations (total 9,500)', () => {
    // Source: worked by hand (an invented table of three workers and three jobs, costs in dollars), every permutation:
    // (0,1,2)=11000, (0,2,1)=10000, (1,0,2)=10500, (1,2,0)=9500, (2,0,1)=11500, (2,1,0)=11500.
    const cost = [2500, 4000, 3500, 4000, 6000, 3500, 2000, 4000, 2500];
    expect(bruteForce(cost, 3)).toBe(9500);
    const a = solveAssignment(Float64Array.from(cost), 3);
    expect(a.total).toBe(9500);
    expect(Array.from(a.rowToCol)).toEqual([1, 2, 0]);
  });

  test('solveAssignment total equals brute force for every n from 1 to 7 on seeded random tables', () => {
    const r = rng(123);
    for (let n = 1; n <= 7; n++) {
      for (let rep = 0; rep < 6; rep++) {
        const cost = Array.from({ length: n * n }, () => 100 * r() - 20);
        // Source: brute force over all n! permutations.
        expect(solveAssignment(Float64Array.from(cost), n).total).toBeCloseTo(bruteForce(cost, n), 9);
      }
    }
  });

  test('solveAssignment total equals brute force with heavy ties (costs 0, 1 or 2) and duplicated rows', () => {
    const r = rng(77);
    for (let n = 2; n <= 7; n++) {
      for (let rep = 0; rep < 8; rep++) {
        const cost = Array.from({ length: n * n }, () => Math.floor(3 * r()));
        for (let j = 0; j < n; j++) cost[(n - 1) * n + j] = cost[j]; // last row repeats the first
        // Source: brute force over all n! permutations.
        expect(solveAssignment(Float64Array.from(cost), n).total).toBe(bruteForce(cost, n));
      }
    }
  });

  test('findPairs mean squared distance equals the brute-force optimum for point samples (d = 1..3, n <= 7, with repeated points)', () => {
    const r = rng(2024);
    for (let n = 1; n <= 7; n++) {
      for (const d of [1, 2, 3]) {
        const x: Points = { n, d, data: new Float64Array(n * d).map(() => Math.round(8 * r()) / 2) };
        const y: Points = { n, d, data: new Float64Array(n * d).map(() => 3 * r() - 1) };
        if (n >= 3) x.data.copyWithin(0, d, 2 * d); // row 0 repeats row 1
        if (n >= 4) y.data.copyWithin(2 * d, 3 * d, 4 * d); // target row 2 repeats row 3
        const f = findPairs(x, y);
        // Source: brute force over all n! permutations of the squared-distance table.
        expect(f.meanSquaredDistance).toBeCloseTo(bruteForce(table(x, y), n) / n, 10);
        expect(fitPairs({ ...x, weights: null }, { ...y, weights: null }, { units: 'raw' }).cost().w2Squared).toBe(f.meanSquaredDistance);
      }
    }
  });

  test('in one column the pairs cost equals the sorted matching, (1/n) sum (x_(k) - y_(k))^2, also with ties', () => {
    const r = rng(5);
    for (const n of [10, 101, 400]) {
      const xs = Array.from({ length: n }, () => Math.floor(20 * r())); // many ties
      const ys = Array.from({ length: n }, () => 10 * r() ** 2);
      const sx = [...xs].sort((a, b) => a - b);
      const sy = [...ys].sort((a, b) => a - b);
      // Source: common practice (fact of the trade): in 1-D the monotone rearrangement is optimal for squared cost.
      const sorted = mean(sx.map((v, k) => (v - sy[k]) ** 2));
      const m = matchRows(column(xs), column(ys));
      const got = mean(xs.map((v, i) => (v - ys[m[i]]) ** 2));
      expect(got).toBeCloseTo(sorted, 10);
      // With ties in x the partners of equal x's may be in any order, but the k-th smallest partner
      // is still the k-th smallest target: the multiset of targets taken by each tied group is fixed.
      const partners = [...Array(n).keys()].sort((a, b) => xs[a] - xs[b] || ys[m[a]] - ys[m[b]]).map((i) => ys[m[i]]);
      expect(partners).toEqual(sy);
    }
  });

  test('in one column the pairs map sends the source median to the target median (odd n, distinct values)', () => {
    const r = rng(8);
    const n = 99;
    const xs = Array.from({ length: n }, () => r() * 5);
    const ys = Array.from({ length: n }, () => 100 + 30 * r());
    const map = fitPairs({ ...column(xs), weights: null }, { ...column(ys), weights: null }, { units: 'raw' });
    const medX = quantileSorted(
      [...xs].sort((a, b) => a - b),
      0.5,
    );
    const medY = quantileSorted(
      [...ys].sort((a, b) => a - b),
      0.5,
    );
    // Source: simple-statistics quantileSorted (the middle value for odd n), with the 1-D monotone rearrangement.
    expect(map.apply(column([medX])).data[0]).toBe(medY);
  });
});
