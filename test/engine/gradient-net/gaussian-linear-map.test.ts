import { inv, matrix, multiply, sqrtm } from 'mathjs';
import { covarianceOf, gaussianLinearMap } from '../../../src/engine/gradient-net/gaussian-linear-map';

describe('gaussianLinearMap', () => {
  test('matches S^-1/2 (S^1/2 T S^1/2)^1/2 S^-1/2 computed with mathjs sqrtm and pushes S onto T', () => {
    const S = [[2, 0.5], [0.5, 1]];
    const T = [[1, -0.3], [-0.3, 3]];
    const a = gaussianLinearMap(Float64Array.from(S.flat()), Float64Array.from(T.flat()), 2);
    const sh = sqrtm(matrix(S));
    const shi = inv(sh);
    const ref = multiply(multiply(shi, sqrtm(multiply(multiply(sh, matrix(T)), sh))), shi).toArray() as number[][]; // Source: mathjs sqrtm
    for (let i = 0; i < 2; i++) for (let k = 0; k < 2; k++) expect(a[i * 2 + k]).toBeCloseTo(ref[i][k], 8);
    const ama = multiply(multiply([[a[0], a[1]], [a[2], a[3]]], S), [[a[0], a[1]], [a[2], a[3]]]) as number[][];
    for (let i = 0; i < 2; i++) for (let k = 0; k < 2; k++) expect(ama[i][k]).toBeCloseTo(T[i][k], 8); // Source: A S A = T
  });

  test('covarianceOf uses the total weight as divisor', () => {
    const c = covarianceOf(Float64Array.of(0, 2), 2, 1, null);
    expect(c[0]).toBe(1); // Source: ((0-1)^2 + (2-1)^2) / 2
  });
});
