import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { smallestEigenvalue } from '../../../src/engine/stats/smallest-eigenvalue';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  };
}

describe('smallest-eigenvalue', () => {
  test('smallestEigenvalue of [[2, 1], [1, 2]] is 1', () => {
    // Source: common practice, eigenvalues 1 and 3.
    expect(smallestEigenvalue(Float64Array.of(2, 1, 1, 2), 2)).toBeCloseTo(1, 14);
  });

  test('smallestEigenvalue agrees with ml-matrix EigenvalueDecomposition on random symmetric matrices up to d = 20', () => {
    const r = rng(3);
    for (const d of [1, 3, 8, 20]) {
      const a = new Float64Array(d * d);
      for (let i = 0; i < d; i++) for (let j = i; j < d; j++) a[i * d + j] = a[j * d + i] = r();
      const rows = Array.from({ length: d }, (_, i) => Array.from(a.subarray(i * d, (i + 1) * d)));
      // Source: ml-matrix EigenvalueDecomposition (symmetric QL).
      const expected = Math.min(...new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues);
      expect(Math.abs(smallestEigenvalue(a, d) - expected)).toBeLessThan(1e-12);
    }
  });

  test('smallestEigenvalue does not change its input', () => {
    const a = Float64Array.of(4, 1, 1, 3);
    smallestEigenvalue(a, 2);
    expect(Array.from(a)).toEqual([4, 1, 1, 3]);
  });
});

describe('smallestEigenvalue of a non-symmetric Jacobian', () => {
  test('uses the symmetric part: [[1, 4], [0, 1]] has symmetric part [[1, 2], [2, 1]], eigenvalues -1 and 3', () => {
    // Source: hand computation, eigenvalues of [[1, 2], [2, 1]] are 1 +- 2
    expect(smallestEigenvalue(Float64Array.of(1, 4, 0, 1), 2)).toBeCloseTo(-1, 14);
  });
});
