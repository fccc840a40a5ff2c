import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { isRemapError } from '../../../src/engine/errors';
import { spectralFunction, symmetricEigen } from '../../../src/engine/stats/symmetric-eigen';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

/** B B^T + shift I for a seeded random B: symmetric positive definite. */
function randomSpd(d: number, seed: number, shift = 0.1): Float64Array {
  const u = rng(seed);
  const b = Array.from({ length: d * d }, () => 2 * u() - 1);
  const s = new Float64Array(d * d);
  for (let i = 0; i < d; i++)
    for (let j = 0; j < d; j++) {
      let t = i === j ? shift : 0;
      for (let k = 0; k < d; k++) t += b[i * d + k] * b[j * d + k];
      s[i * d + j] = t;
    }
  return s;
}

function toRows(m: Float64Array, d: number): number[][] {
  return Array.from({ length: d }, (_, i) => Array.from(m.subarray(i * d, (i + 1) * d)));
}

describe('symmetricEigen(S, d) decomposes a symmetric matrix by cyclic Jacobi', () => {
  test('[[2, 1], [1, 2]] has eigenvalues 1 and 3 with eigenvectors (1, -1)/sqrt 2 and (1, 1)/sqrt 2', () => {
    // Source: hand computation, (2 - l)^2 - 1 = 0
    const e = symmetricEigen(Float64Array.from([2, 1, 1, 2]), 2);
    expect(e.values[0]).toBeCloseTo(1, 15);
    expect(e.values[1]).toBeCloseTo(3, 15);
    expect(Math.abs(e.vectors[0])).toBeCloseTo(Math.SQRT1_2, 15);
    expect(e.vectors[0] * e.vectors[2]).toBeCloseTo(-0.5, 15);
    expect(e.vectors[1] * e.vectors[3]).toBeCloseTo(0.5, 15);
  });

  test.each([2, 3, 5, 8, 12])('agrees with ml-matrix EigenvalueDecomposition for a seeded random SPD matrix, d = %i', (d) => {
    const s = randomSpd(d, 100 + d);
    const e = symmetricEigen(s, d);
    // Source: ml-matrix EigenvalueDecomposition
    const ref = new EigenvalueDecomposition(new Matrix(toRows(s, d)), { assumeSymmetric: true });
    const refValues = [...ref.realEigenvalues].sort((a, b) => a - b);
    for (let j = 0; j < d; j++) expect(e.values[j]).toBeCloseTo(refValues[j], 11);
    // Eigenvectors agree up to sign (the eigenvalues of these matrices are distinct).
    const V = ref.eigenvectorMatrix.to2DArray();
    for (let j = 0; j < d; j++) {
      const col = ref.realEigenvalues.findIndex((x) => Math.abs(x - e.values[j]) < 1e-9);
      let dot = 0;
      for (let k = 0; k < d; k++) dot += e.vectors[k * d + j] * V[k][col];
      expect(Math.abs(dot)).toBeCloseTo(1, 10);
    }
    // V diag(values) V^T rebuilds S, and V is orthonormal.
    const rebuilt = spectralFunction(e, (x) => x);
    for (let j = 0; j < d * d; j++) expect(rebuilt[j]).toBeCloseTo(s[j], 11);
    for (let a = 0; a < d; a++)
      for (let b = 0; b < d; b++) {
        let dot = 0;
        for (let k = 0; k < d; k++) dot += e.vectors[k * d + a] * e.vectors[k * d + b];
        expect(dot).toBeCloseTo(a === b ? 1 : 0, 13);
      }
  });

  test('values come out in ascending order, repeated eigenvalues included', () => {
    // 2 I + (1,1,1)(1,1,1)^T has eigenvalues 2, 2, 5. Source: hand computation (rank-one update of 2 I)
    const e = symmetricEigen(Float64Array.from([3, 1, 1, 1, 3, 1, 1, 1, 3]), 3);
    expect(e.values[0]).toBeCloseTo(2, 14);
    expect(e.values[1]).toBeCloseTo(2, 14);
    expect(e.values[2]).toBeCloseTo(5, 14);
  });

  test('a 1 x 1 matrix is its own eigenvalue; the input is not mutated', () => {
    const m = Object.freeze([7]);
    const e = symmetricEigen(m, 1);
    expect(Array.from(e.values)).toEqual([7]);
    expect(Array.from(e.vectors)).toEqual([1]);
    const s = randomSpd(4, 3);
    const copy = Float64Array.from(s);
    symmetricEigen(s, 4);
    expect(s).toEqual(copy);
  });

  test('bad input throws RemapError saying what to fix', () => {
    expect(() => symmetricEigen([1, 2, 3], 2)).toThrow(/3 entries but a 2 x 2 matrix needs 4/);
    expect(() => symmetricEigen([1, 2, 3, 4], 2)).toThrow(/not symmetric: entry \(1, 2\) is 2 but \(2, 1\) is 3/);
    expect(() => symmetricEigen([1, NaN, NaN, 1], 2)).toThrow(/entry \(1, 2\) is NaN/);
    expect(() => symmetricEigen([1], 0)).toThrow(/size d is 0/);
  });

  test('a sweep bound too small to converge throws a num-kind RemapError instead of returning rough values', () => {
    let caught: unknown;
    try {
      symmetricEigen(randomSpd(8, 5), 8, 1);
    } catch (e) {
      caught = e;
    }
    expect(isRemapError(caught) && caught.kind === 'num' && /did not converge in 1 sweeps/.test(caught.message)).toBe(true);
  });

  test('spectralFunction(eig, sqrt) of diag(4, 9) is diag(2, 3)', () => {
    // Source: hand computation
    const r = spectralFunction(symmetricEigen(Float64Array.from([4, 0, 0, 9]), 2), Math.sqrt);
    expect(Array.from(r)).toEqual([2, 0, 0, 3]);
    expect(() => spectralFunction(symmetricEigen([0, 0, 0, 1], 2), (x) => 1 / x)).toThrow(/gives Infinity at eigenvalue 0/);
  });
});
