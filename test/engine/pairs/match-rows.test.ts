import { RemapError } from '../../../src/engine/errors';
import { MAX_PAIRS_ROWS, findPairs, matchRows } from '../../../src/engine/pairs/match-rows';
import { column, points, type Points } from '../../../src/engine/points';

function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

function cloud(n: number, d: number, r: () => number, scale = 1, shift = 0): Points {
  return { n, d, data: new Float64Array(n * d).map(() => shift + scale * (r() + r() - 1)) };
}

function meanSq(x: Points, y: Points, m: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < x.n; i++) for (let k = 0; k < x.d; k++) s += (x.data[i * x.d + k] - y.data[m[i] * x.d + k]) ** 2;
  return s / x.n;
}

describe('matchRows / findPairs', () => {
  test('matchRows in one column pairs the k-th smallest source value with the k-th smallest target value', () => {
    // Source: common practice (fact of the trade): in 1-D the monotone rearrangement is the optimal matching
    // for squared cost, and with distinct values it is the only one.
    const r = rng(21);
    const n = 300;
    const x = column(Array.from({ length: n }, () => r() * 10));
    const y = column(Array.from({ length: n }, () => 5 + r() ** 3 * 40));
    const m = matchRows(x, y);
    const xo = Array.from({ length: n }, (_, i) => i).sort((a, b) => x.data[a] - x.data[b]);
    const yo = Array.from({ length: n }, (_, i) => i).sort((a, b) => y.data[a] - y.data[b]);
    for (let k = 0; k < n; k++) expect(m[xo[k]]).toBe(yo[k]);
  });

  test('findPairs reports the mean squared distance of its pairs, computed from the coordinates', () => {
    // Source: computed by hand: 0 -> 1 and 10 -> 11 gives (1 + 1) / 2 = 1.
    const f = findPairs(column([0, 10]), column([11, 1]));
    expect(Array.from(f.match)).toEqual([1, 0]);
    expect(f.meanSquaredDistance).toBe(1);
  });

  test('matchRows finds the same pairs when the target is shifted or scaled by a positive number', () => {
    // Source: sum |x_i - (a y_s(i) + b)|^2 differs from a times -2 sum <x_i, y_s(i)> by terms fixed over permutations.
    const r = rng(7);
    const x = cloud(200, 3, r);
    const y = cloud(200, 3, r, 1.5);
    const m1 = matchRows(x, y);
    const moved = { n: y.n, d: y.d, data: y.data.map((v, t) => 4 * v + (t % 3) - 7) };
    expect(Array.from(matchRows(x, moved))).toEqual(Array.from(m1));
  });

  test('matchRows is never beaten by 2,000 random swaps of two partners (d = 4)', () => {
    const r = rng(13);
    const n = 150;
    const x = cloud(n, 4, r);
    const y = cloud(n, 4, r, 2, 3);
    const m = Array.from(matchRows(x, y));
    const best = meanSq(x, y, m);
    for (let t = 0; t < 2000; t++) {
      const i = Math.floor(r() * n);
      const j = Math.floor(r() * n);
      const m2 = m.slice();
      [m2[i], m2[j]] = [m2[j], m2[i]];
      expect(meanSq(x, y, m2)).toBeGreaterThanOrEqual(best - 1e-12);
    }
  });

  test('matchRows stays exact for values far from the origin (1e8 plus small offsets)', () => {
    const r = rng(17);
    const n = 100;
    const x = column(Array.from({ length: n }, () => 1e8 + r()));
    const y = column(Array.from({ length: n }, () => 1e8 + 0.5 + r()));
    const m = matchRows(x, y);
    const sx = Array.from(x.data).sort((a, b) => a - b);
    const sy = Array.from(y.data).sort((a, b) => a - b);
    let sorted = 0;
    for (let k = 0; k < n; k++) sorted += (sx[k] - sy[k]) ** 2;
    // Source: common practice (1-D monotone rearrangement is optimal).
    expect(meanSq(x, y, m)).toBeCloseTo(sorted / n, 12);
  });

  test('matchRows does not mutate its inputs', () => {
    const r = rng(2);
    const x = cloud(40, 2, r);
    const y = cloud(40, 2, r);
    const bx = x.data.slice();
    const by = y.data.slice();
    matchRows(x, y);
    expect(x.data).toEqual(bx);
    expect(y.data).toEqual(by);
  });

  test('matchRows with unequal sizes throws a RemapError saying so and suggesting the entropic method', () => {
    expect(() => matchRows(column([1, 2, 3]), column([1, 2]))).toThrow(/source has 3 rows and the target 2.*same number of rows.*entropic method/);
  });

  test('matchRows rejects different columns, empty samples, non-finite values and more than MAX_PAIRS_ROWS rows', () => {
    expect(() => matchRows(points([[1, 2]]), column([1]))).toThrow(/2 columns and the target 1/);
    expect(() => matchRows(column([]), column([]))).toThrow(/empty/);
    expect(() => matchRows(column([1, NaN]), column([1, 2]))).toThrow(/non-finite number \(NaN\) in row 2/);
    const big = column(new Float64Array(MAX_PAIRS_ROWS + 1));
    expect(() => matchRows(big, big)).toThrow(/more than the 5000 the pairs method takes.*entropic/);
  });

  test('findPairs throws kind num when squared distances overflow', () => {
    try {
      findPairs(column([-1e200, 1e200]), column([3e200, 1e200]));
      throw new Error('expected a throw');
    } catch (e) {
      expect((e as RemapError).kind).toBe('num');
      expect((e as Error).message).toMatch(/too large.*rescale/);
    }
  });

  test('matchRows throws kind cancelled when the signal is aborted', () => {
    try {
      matchRows(column([1, 2]), column([2, 1]), { aborted: true });
      throw new Error('expected a throw');
    } catch (e) {
      expect(e).toBeInstanceOf(RemapError);
      expect((e as RemapError).kind).toBe('cancelled');
    }
  });
});
