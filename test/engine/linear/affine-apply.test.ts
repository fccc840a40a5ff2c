import { affineApply } from '../../../src/engine/linear/affine-apply';
import { column, points } from '../../../src/engine/points';

const f64 = (v: number[]): Float64Array => Float64Array.from(v);

describe('affineApply(x, from, M, to, lo, hi) computes to + M (x - from) and counts rows outside [lo, hi]', () => {
  test('the documented example: 10 + 2 (x - 0) on [1, 5] with range [0, 4]', () => {
    // Source: hand computation
    expect(affineApply(column([1, 5]), f64([0]), f64([2]), f64([10]), f64([0]), f64([4]), 'apply')).toEqual({ n: 2, d: 1, data: f64([12, 20]), outside: 1 });
  });

  test.each([1, 2, 3, 4, 5, 6, 7, 9])('matches a plain matrix-vector product for d = %i (unrolled paths included)', (d) => {
    const m = f64(Array.from({ length: d * d }, (_, j) => ((j * 7) % 5) - 2));
    const from = f64(Array.from({ length: d }, (_, k) => k));
    const to = f64(Array.from({ length: d }, (_, k) => -k));
    const rows = [Array.from({ length: d }, (_, k) => k * 0.5), Array.from({ length: d }, (_, k) => 3 - k)];
    const r = affineApply(points(rows), from, m, to, f64(Array(d).fill(-100)), f64(Array(d).fill(100)), 'apply');
    for (let i = 0; i < 2; i++)
      for (let l = 0; l < d; l++) {
        let s = to[l];
        for (let k = 0; k < d; k++) s += m[l * d + k] * (rows[i][k] - from[k]);
        // Source: definition of the matrix-vector product
        expect(r.data[i * d + l]).toBeCloseTo(s, 12);
      }
    expect(r.outside).toBe(0);
  });

  test('a row counts once as outside however many coordinates are out', () => {
    const r = affineApply(
      points([
        [5, 5],
        [0.5, 0.5],
        [-1, 0.5],
      ]),
      f64([0, 0]),
      f64([1, 0, 0, 1]),
      f64([0, 0]),
      f64([0, 0]),
      f64([1, 1]),
      'apply',
    );
    expect(r.outside).toBe(2);
  });

  test('a non-finite value throws RemapError naming row and column; the input is not mutated', () => {
    const x = points([
      [1, 2],
      [3, NaN],
    ]);
    expect(() => affineApply(x, f64([0, 0]), f64([1, 0, 0, 1]), f64([0, 0]), f64([0, 0]), f64([9, 9]), 'invert')).toThrow(/invert: row 2, column 2 is NaN/);
    const y = points([[1, 2]]);
    affineApply(Object.freeze(y), f64([0, 0]), f64([1, 0, 0, 1]), f64([0, 0]), f64([0, 0]), f64([9, 9]), 'apply');
    expect(Array.from(y.data)).toEqual([1, 2]);
  });
});
