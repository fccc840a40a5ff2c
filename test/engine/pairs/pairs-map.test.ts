import type { MapHeader } from '../../../src/engine/base';
import { RemapError } from '../../../src/engine/errors';
import type { MapJSON } from '../../../src/engine/map';
import { fitPairs } from '../../../src/engine/pairs/method';
import { PairsMap } from '../../../src/engine/pairs/pairs-map';
import { column, points, sample, toRows, type Points } from '../../../src/engine/points';

const settings = Object.freeze({ units: 'raw' });

function header(n: number, d: number): MapHeader {
  return { method: 'pairs', d, settings, columns: null, n: { source: n, target: n }, dropped: { source: 0, target: 0 } };
}

function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

function sameBits(a: Float64Array, b: Float64Array): boolean {
  return a.length === b.length && a.every((v, i) => Object.is(v, b[i]));
}

describe('PairsMap', () => {
  const src = sample([
    [0, 0],
    [4, 0],
    [0, 3],
  ]);
  const tgt = sample([
    [5, 1],
    [1, 4],
    [1, 1],
  ]);
  // Source: computed by hand over the 6 permutations: (0,0)->(1,1), (4,0)->(5,1), (0,3)->(1,4): cost 2+2+2 = 6, mean 2.
  const map = fitPairs(src, tgt, settings);

  test('apply maps each source row to its partner exactly, and invert maps each target row back', () => {
    expect(
      toRows(
        map.apply(
          points([
            [4, 0],
            [0, 0],
            [0, 3],
            [4, 0],
          ]),
        ),
      ),
    ).toEqual([
      [5, 1],
      [1, 1],
      [1, 4],
      [5, 1],
    ]);
    expect(
      toRows(
        map.invert(
          points([
            [1, 4],
            [5, 1],
            [1, 1],
          ]),
        ),
      ),
    ).toEqual([
      [0, 3],
      [4, 0],
      [0, 0],
    ]);
    expect(Array.from(map.pairs())).toEqual([2, 0, 1]);
    expect(map.apply(points([[4, 0]])).outside).toBe(0);
  });

  test('cost() is kind assignment with w2Squared = mean over pairs of |x_i - y_s(i)|^2', () => {
    const c = map.cost();
    expect(c.kind).toBe('assignment');
    expect(c.w2Squared).toBe(2);
    expect(c.w2).toBe(Math.SQRT2);
    expect(c.note).toMatch(/exact squared 2-Wasserstein/);
  });

  test('apply on a row that is not a source row throws RemapError (kind na) naming the row and the methods for new points', () => {
    let err: unknown;
    try {
      map.apply(
        points([
          [0, 0],
          [1, 2],
        ]),
      );
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RemapError);
    expect((err as RemapError).kind).toBe('na');
    expect((err as Error).message).toMatch(
      /^apply \(pairs\): row 2 of the values \(1, 2\) is not one of the 3 source rows.*maps the source rows only.*entropic or gradient-net/,
    );
    expect(() => map.invert(points([[0, 0]]))).toThrow(/invert \(pairs\): row 1 .* not one of the 3 target rows.*inverts the target rows only/);
    expect(() => map.apply(column([0]))).toThrow(/1 column but the pairs map was fitted on 2/);
  });

  test('the fit record warns source-rows-only and reports a passed 2-cycle check as converged', () => {
    const dg = map.diagnostics();
    expect(dg.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['small-sample', 'source-rows-only']));
    expect(dg.warnings.map((w) => w.code)).not.toContain('not-converged');
    expect(dg.convergence).toMatchObject({ converged: true, finalError: 0 });
    expect(dg.minJacobianEigenvalue).toBeUndefined();
  });

  test('a repeated source value maps to the average of its partners; a repeated target value inverts to the average of its sources', () => {
    // Rows 0 and 2 of the source are both (1): they are paired with 0 and 2 (sorted matching 1,1,5 -> 0,2,9),
    // so apply(1) = (0 + 2) / 2 = 1; the target 7 appears twice, paired with sources 3 and 8.
    const m = fitPairs(sample([1, 5, 1]), sample([2, 9, 0]), settings);
    expect(Array.from(m.apply(column([1, 5])).data)).toEqual([1, 9]);
    const m2 = fitPairs(sample([3, 8, 0]), sample([7, 7, -1]), settings);
    expect(Array.from(m2.invert(column([7, -1])).data)).toEqual([5.5, 0]);
    expect(m.diagnostics().warnings.map((w) => w.code)).toContain('ties');
    expect(map.diagnostics().warnings.map((w) => w.code)).not.toContain('ties');
  });

  test("the averaged images of repeated values stay monotone: <x - x', T(x) - T(x')> >= 0 on all distinct source values", () => {
    const r = rng(31);
    const base = Array.from({ length: 12 }, () => [Math.floor(r() * 4), Math.floor(r() * 4)]);
    const rows = [...base, ...base.slice(0, 8)]; // 20 rows with repeats
    const tg = Array.from({ length: 20 }, () => [r() * 3, r() * 3 + 1]);
    const m = fitPairs(sample(rows), sample(tg), settings);
    const imgs = toRows(m.apply(points(rows)));
    let smallest = Infinity;
    for (let i = 0; i < rows.length; i++) {
      for (let j = 0; j < rows.length; j++) {
        const s = (rows[i][0] - rows[j][0]) * (imgs[i][0] - imgs[j][0]) + (rows[i][1] - rows[j][1]) * (imgs[i][1] - imgs[j][1]);
        smallest = Math.min(smallest, s);
      }
    }
    // Source: Rockafellar, Convex Analysis, Thm 24.8 (cyclically monotone support lies in a convex subdifferential).
    expect(smallest).toBeGreaterThanOrEqual(-1e-12);
  });

  test('toJSON -> JSON text -> fromJSON restores the map bit for bit', () => {
    const r = rng(4);
    const n = 60;
    const rows = Array.from({ length: n }, () => [r() * 1e-3, -r() / 3, r() * 7e5]);
    rows[5][0] = -0; // stored as 0
    const tg = Array.from({ length: n }, () => [r() / 7, r() * 0.1 - 1, r() * 1e6]);
    const m = fitPairs(sample(rows), sample(tg), settings, { columns: ['a', 'b', 'c'], dropped: { source: 1, target: 0 } });
    const json = m.toJSON();
    const back = PairsMap.fromJSON(JSON.parse(JSON.stringify(json)) as MapJSON);
    expect(back.toJSON()).toEqual(json);
    expect(JSON.stringify(back.toJSON())).toBe(JSON.stringify(json));
    const xs = points(rows);
    expect(sameBits(back.apply(xs).data, m.apply(xs).data)).toBe(true);
    const ys = points(tg);
    expect(sameBits(back.invert(ys).data, m.invert(ys).data)).toBe(true);
    expect(back.diagnostics().warnings).toEqual(json.fitted.warnings);
    expect(back.diagnostics().columns).toEqual(['a', 'b', 'c']);
    expect((json.params as { permutation: number[] }).permutation).toEqual(Array.from(m.pairs()));
  });

  test('fromJSON rejects params that are missing, the wrong shape, not finite, or not a permutation', () => {
    const json = map.toJSON();
    const p = json.params as { source: number[][]; target: number[][]; permutation: number[] };
    const withParams = (params: unknown): MapJSON => ({ ...json, params });
    expect(() => PairsMap.fromJSON(withParams(null))).toThrow(/no params/);
    expect(() => PairsMap.fromJSON(withParams({ ...p, source: p.source.slice(1) }))).toThrow(/source rows must be a list of 3 rows; found 2/);
    expect(() => PairsMap.fromJSON(withParams({ ...p, target: [[1, 2], [3], [4, 5]] }))).toThrow(/target row 2 must hold 2 numbers/);
    expect(() =>
      PairsMap.fromJSON(
        withParams({
          ...p,
          target: [
            [1, 2],
            [3, 'x'],
            [4, 5],
          ],
        }),
      ),
    ).toThrow(/row 2, column 2 is not a finite number/);
    expect(() => PairsMap.fromJSON(withParams({ ...p, permutation: [0, 0, 1] }))).toThrow(/entry 2 of the permutation \(0\)/);
    expect(() => PairsMap.fromJSON(withParams({ ...p, permutation: [0, 1, 2.5] }))).toThrow(/entry 3 of the permutation/);
    expect(() => PairsMap.fromJSON({ ...json, n: { source: 3, target: 4 } })).toThrow(/3 source and 4 target rows/);
  });

  test('fromMatch with a non-optimal pairing records a not-converged warning with the negative 2-cycle value', () => {
    // Crossed 1-D pairs: (0 -> 7, 1 -> 5) gives <0 - 1, 7 - 5> = -2.
    const m = PairsMap.fromMatch(column([0, 1]), column([5, 7]), Int32Array.from([1, 0]), header(2, 1));
    const w = m.diagnostics().warnings.find((x) => x.code === 'not-converged');
    expect(w?.message).toMatch(/= -2\.000 < 0/);
    expect(m.diagnostics().convergence).toMatchObject({ converged: false, finalError: 2 });
    expect(() => PairsMap.fromMatch(column([0, 1]), column([5, 7]), Int32Array.from([1, 1]), header(2, 1))).toThrow(/permutation/);
  });

  test('fitting does not mutate the samples, and the map keeps its own copy', () => {
    const xs: Points = points([
      [1, 2],
      [3, 4],
    ]);
    const ys: Points = points([
      [5, 6],
      [7, 8],
    ]);
    const bx = xs.data.slice();
    const by = ys.data.slice();
    const m = fitPairs({ ...xs, weights: null }, { ...ys, weights: null }, settings);
    expect(xs.data).toEqual(bx);
    expect(ys.data).toEqual(by);
    xs.data[0] = 99; // changing the caller's array afterwards does not change the map
    expect(toRows(m.apply(points([[1, 2]])))).toEqual([[5, 6]]);
  });
});
