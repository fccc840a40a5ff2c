import { inv, matrix, multiply, sqrtm } from 'mathjs';
import { gaussianLinearMap } from '../../../src/engine/gradient-net/gaussian-linear-map';
import { points, sample } from '../../../src/engine/points';
import { fitLinear } from '../../../src/engine/linear/fit';
import { Random } from '../../../src/engine/stats/random';

/** Covariance with divisor n, by the textbook two-pass formula. */
function cov(rows: number[][]): number[][] {
  const n = rows.length;
  const d = rows[0].length;
  const m = Array.from({ length: d }, (_, k) => rows.reduce((s, r) => s + r[k], 0) / n);
  return Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => rows.reduce((s, r) => s + (r[i] - m[i]) * (r[j] - m[j]), 0) / n));
}

describe('gaussianLinearMap', () => {
  test('of samples with covariances diag(1/2, 1/2) and diag(2, 9/2) is diag(2, 3)', () => {
    // Source: closed form, commuting case: A = (S^-1 T)^1/2 = diag(sqrt(4), sqrt(9))
    const a = gaussianLinearMap(
      points([
        [1, 0],
        [-1, 0],
        [0, 1],
        [0, -1],
      ]),
      null,
      points([
        [2, 0],
        [-2, 0],
        [0, 3],
        [0, -3],
      ]),
      null,
    );
    expect(Array.from(a).map((v) => Number(v.toFixed(6)))).toEqual([2, 0, 0, 3]);
  });

  test('matches S^-1/2 (S^1/2 T S^1/2)^1/2 S^-1/2 computed with mathjs sqrtm and pushes S onto T', () => {
    const r = new Random(5);
    const src = Array.from({ length: 200 }, () => {
      const u = r.normal();
      return [u, 0.5 * u + r.normal()];
    });
    const tgt = Array.from({ length: 150 }, () => {
      const u = r.normal();
      return [2 * u, -u + 0.3 * r.normal()];
    });
    const a = gaussianLinearMap(points(src), null, points(tgt), null);
    const S = cov(src);
    const T = cov(tgt);
    const sh = sqrtm(matrix(S));
    const shi = inv(sh);
    const ref = multiply(multiply(shi, sqrtm(multiply(multiply(sh, matrix(T)), sh))), shi).toArray() as number[][]; // Source: mathjs sqrtm
    for (let i = 0; i < 2; i++) for (let k = 0; k < 2; k++) expect(a[i * 2 + k]).toBeCloseTo(ref[i][k], 6);
    const A = [
      [a[0], a[1]],
      [a[2], a[3]],
    ];
    const ama = multiply(multiply(A, S), A) as number[][];
    for (let i = 0; i < 2; i++) for (let k = 0; k < 2; k++) expect(ama[i][k]).toBeCloseTo(T[i][k], 6); // Source: A S A = T (Olkin & Pukelsheim 1982)
  });

  test("is the linear method's matrix bit for bit on well-conditioned data (no ridge added)", () => {
    const r = new Random(8);
    const src = Array.from({ length: 100 }, () => [r.normal(), 3 * r.normal()]);
    const tgt = Array.from({ length: 120 }, () => {
      const u = r.normal();
      return [u, u + 0.1 * r.normal()];
    });
    const a = gaussianLinearMap(points(src), null, points(tgt), null);
    const lin = fitLinear(sample(src), sample(tgt), { ridge: 0, units: 'raw' }).toJSON().params as { matrix: number[] };
    expect(Array.from(a)).toEqual(lin.matrix); // Source: both use stats/moments.ts and linear/gaussian-transport.ts
  });

  test('adds a tiny ridge for a singular covariance instead of failing', () => {
    const a = gaussianLinearMap(
      points([
        [0, 0],
        [1, 1],
        [2, 2],
      ]),
      null,
      points([
        [0, 1],
        [1, 0],
        [2, 3],
      ]),
      null,
    );
    expect(Array.from(a).every(Number.isFinite)).toBe(true);
  });
});
