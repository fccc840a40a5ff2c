import { RemapError } from '../../../src/engine/errors';
import type { Progress } from '../../../src/engine/map';
import { solveAssignment } from '../../../src/engine/pairs/assignment';

/** Park-Miller minimal standard generator: seeded, the same numbers every run. */
function rng(seed: number): () => number {
  let s = seed % 2147483647;
  if (s <= 0) s += 2147483646;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

/** Checks the linear-programming certificate: u_i + v_j <= c_ij, equality on the assignment, sum(u) + sum(v) = total. */
function expectCertificate(cost: Float64Array, n: number, a: ReturnType<typeof solveAssignment>, tol: number): void {
  let worst = 0;
  let dual = 0;
  for (let i = 0; i < n; i++) {
    dual += a.rowPotential[i] + a.colPotential[i];
    for (let j = 0; j < n; j++) worst = Math.min(worst, cost[i * n + j] - a.rowPotential[i] - a.colPotential[j]);
    expect(Math.abs(cost[i * n + a.rowToCol[i]] - a.rowPotential[i] - a.colPotential[a.rowToCol[i]])).toBeLessThanOrEqual(tol);
  }
  expect(worst).toBeGreaterThanOrEqual(-tol);
  expect(Math.abs(dual - a.total)).toBeLessThanOrEqual(tol * n);
}

function expectPermutation(a: ReturnType<typeof solveAssignment>, n: number): void {
  const seen = new Set<number>();
  for (let i = 0; i < n; i++) {
    expect(a.rowToCol[i]).toBeGreaterThanOrEqual(0);
    expect(a.rowToCol[i]).toBeLessThan(n);
    seen.add(a.rowToCol[i]);
    expect(a.colToRow[a.rowToCol[i]]).toBe(i);
  }
  expect(seen.size).toBe(n);
}

describe('solveAssignment', () => {
  test('solveAssignment finds the cheapest assignment of a 3x3 table computed by hand', () => {
    // Source: computed by hand over all 6 permutations of [[6,2,9],[1,7,4],[8,3,5]]:
    // (0,1,2)=18, (0,2,1)=13, (1,0,2)=8, (1,2,0)=14, (2,0,1)=13, (2,1,0)=24; the minimum is 8 at (1,0,2).
    const cost = Float64Array.from([6, 2, 9, 1, 7, 4, 8, 3, 5]);
    const a = solveAssignment(cost, 3);
    expect(Array.from(a.rowToCol)).toEqual([1, 0, 2]);
    expect(Array.from(a.colToRow)).toEqual([1, 0, 2]);
    expect(a.total).toBe(8);
  });

  test('solveAssignment returns a permutation with a valid duality certificate on random tables (n = 80, with negative costs)', () => {
    const r = rng(11);
    const n = 80;
    const cost = new Float64Array(n * n).map(() => 200 * r() - 100);
    const a = solveAssignment(cost, n);
    expectPermutation(a, n);
    // Source: linear-programming duality (common practice): a feasible dual with equal objective certifies optimality.
    expectCertificate(cost, n, a, 1e-9);
  });

  test('solveAssignment is optimal with heavy ties (integer costs 0..3) and repeated rows and columns', () => {
    const r = rng(5);
    const n = 120;
    const cost = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      const src = i % 3 === 0 && i > 0 ? i - 1 : i; // every third row copies the row before it
      for (let j = 0; j < n; j++) cost[i * n + j] = src === i ? Math.floor(4 * r()) : cost[src * n + j];
    }
    for (let i = 0; i < n; i++) cost[i * n + n - 1] = cost[i * n + n - 2]; // two identical columns
    const a = solveAssignment(cost, n);
    expectPermutation(a, n);
    expectCertificate(cost, n, a, 1e-12);
    // Source: common practice: with integer costs the optimum is an integer.
    expect(Number.isInteger(a.total)).toBe(true);
  });

  test('solveAssignment gives a constant table any permutation at cost n * c', () => {
    const n = 50;
    const a = solveAssignment(new Float64Array(n * n).fill(2.5), n);
    expectPermutation(a, n);
    expect(a.total).toBe(n * 2.5); // Source: every permutation costs n * 2.5.
  });

  test('solveAssignment handles n = 0 and n = 1', () => {
    const z = solveAssignment(new Float64Array(0), 0);
    expect(z.rowToCol.length).toBe(0);
    expect(z.total).toBe(0);
    const one = solveAssignment(Float64Array.from([-3.5]), 1);
    expect(Array.from(one.rowToCol)).toEqual([0]);
    expect(one.total).toBe(-3.5);
    expect(one.rowPotential[0] + one.colPotential[0]).toBe(-3.5);
  });

  test('solveAssignment is deterministic and does not mutate the table', () => {
    const r = rng(99);
    const n = 60;
    const cost = new Float64Array(n * n).map(() => Math.floor(10 * r()));
    const before = cost.slice();
    const a = solveAssignment(cost, n);
    const b = solveAssignment(cost, n);
    expect(cost).toEqual(before);
    expect(Array.from(a.rowToCol)).toEqual(Array.from(b.rowToCol));
    expect(a.total).toBe(b.total);
  });

  test('solveAssignment rejects a bad size, a wrong-length table and non-finite costs with RemapError', () => {
    expect(() => solveAssignment(new Float64Array(4), 1.5)).toThrow(/whole number/);
    expect(() => solveAssignment(new Float64Array(4), -1)).toThrow(RemapError);
    expect(() => solveAssignment(new Float64Array(5), 2)).toThrow(/n x n = 4 entries, but it is 5 entries/);
    expect(() => solveAssignment([1, 2, 3, 4] as unknown as Float64Array, 2)).toThrow(/not a Float64Array/);
    expect(() => solveAssignment(Float64Array.from([1, NaN, 3, 4]), 2)).toThrow(/row 1, column 2 is not a finite number \(NaN\)/);
    expect(() => solveAssignment(Float64Array.from([1, 2, Infinity, 4]), 2, { caller: 'myCaller' })).toThrow(/^myCaller: the cost in row 2, column 1/);
  });

  test('solveAssignment reports progress from 0 to all augmenting paths, with loss = rows still unmatched', () => {
    const r = rng(3);
    const n = 150;
    const cost = new Float64Array(n * n).map(() => r());
    const seen: Progress[] = [];
    const a = solveAssignment(cost, n, { onProgress: (p) => seen.push(p) });
    expect(seen.length).toBeGreaterThanOrEqual(2);
    expect(seen[0].step).toBe(0);
    const last = seen[seen.length - 1];
    expect(last.step).toBe(last.of);
    expect(last.of).toBe(a.augmentations);
    expect(last.loss).toBe(0);
    for (let k = 1; k < seen.length; k++) {
      expect(seen[k].step).toBeGreaterThan(seen[k - 1].step);
      expect(seen[k].loss).toBe(seen[k].of - seen[k].step);
    }
  });

  test('solveAssignment throws a cancelled RemapError when the signal is already aborted', () => {
    let err: unknown;
    try {
      solveAssignment(new Float64Array(9).fill(1), 3, { signal: { aborted: true } });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RemapError);
    expect((err as RemapError).kind).toBe('cancelled');
  });

  test('solveAssignment stops with kind cancelled when the signal turns true during the augmenting phase', () => {
    const r = rng(8);
    const n = 200;
    const cost = new Float64Array(n * n).map(() => r());
    const signal = { aborted: false };
    let calls = 0;
    let err: unknown;
    try {
      solveAssignment(cost, n, {
        signal,
        onProgress: (p) => {
          calls++;
          if (p.step > 0) signal.aborted = true; // abort after the first paths are found
        },
      });
    } catch (e) {
      err = e;
    }
    expect(calls).toBeGreaterThanOrEqual(2);
    expect((err as RemapError).kind).toBe('cancelled');
    expect((err as Error).message).toMatch(/cancelled/);
  });
});
