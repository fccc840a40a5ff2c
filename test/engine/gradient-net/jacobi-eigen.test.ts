import { eigs } from 'mathjs';
import { smallestEigenvalue, symmetricEigen, symmetricFunction } from '../../../src/engine/gradient-net/jacobi-eigen';
import { makePrng } from '../../../src/engine/gradient-net/prng';

describe('symmetricEigen (cyclic Jacobi)', () => {
  test('eigenvalues agree with mathjs eigs on random symmetric matrices', () => {
    const rng = makePrng(4);
    for (const d of [1, 2, 5, 8]) {
      const a = new Float64Array(d * d);
      for (let i = 0; i < d; i++) for (let k = i; k < d; k++) a[i * d + k] = a[k * d + i] = rng.normal();
      Object.freeze(a.buffer);
      const rows = Array.from({ length: d }, (_, i) => Array.from(a.subarray(i * d, (i + 1) * d)));
      const ref = (eigs(rows).values as number[]).slice().sort((x, y) => x - y); // Source: mathjs eigs
      const ours = Array.from(symmetricEigen(a, d).values).sort((x, y) => x - y);
      for (let i = 0; i < d; i++) expect(ours[i]).toBeCloseTo(ref[i], 10);
      expect(smallestEigenvalue(a, d)).toBeCloseTo(ref[0], 10);
    }
  });

  test('symmetricFunction with sqrt squares back to the matrix', () => {
    const a = Float64Array.of(5, 2, 0, 2, 3, 1, 0, 1, 4);
    const r = symmetricFunction(a, 3, Math.sqrt);
    for (let i = 0; i < 3; i++) {
      for (let k = 0; k < 3; k++) {
        let s = 0;
        for (let j = 0; j < 3; j++) s += r[i * 3 + j] * r[j * 3 + k];
        expect(s).toBeCloseTo(a[i * 3 + k], 12); // Source: definition of the principal square root
      }
    }
  });

  test('a 2 x 2 example: [[2, 1], [1, 2]] has eigenvalues 1 and 3', () => {
    expect(smallestEigenvalue(Float64Array.of(2, 1, 1, 2), 2)).toBeCloseTo(1, 15); // Source: worked example
  });
});
