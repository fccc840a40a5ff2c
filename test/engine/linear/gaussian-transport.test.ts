import { gaussianTransport, product3 } from '../../../src/engine/linear/gaussian-transport';
import { symmetricEigen } from '../../../src/engine/stats/symmetric-eigen';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

function randomSpd(d: number, seed: number): Float64Array {
  const u = rng(seed);
  const b = Array.from({ length: d * d }, () => 2 * u() - 1);
  const s = new Float64Array(d * d);
  for (let i = 0; i < d; i++)
    for (let j = 0; j < d; j++) {
      let t = i === j ? 0.3 : 0;
      for (let k = 0; k < d; k++) t += b[i * d + k] * b[j * d + k];
      s[i * d + j] = t;
    }
  return s;
}

describe('gaussianTransport(eig(S1), S1, S2): A = S1^-1/2 (S1^1/2 S2 S1^1/2)^1/2 S1^-1/2 and the Bures trace term', () => {
  test('S1 = I, S2 = diag(4, 9) gives A = diag(2, 3) and trace term 5 (commuting case)', () => {
    // Source: Dowson & Landau 1982 closed form; for commuting covariances A = S2^1/2 S1^-1/2 and
    // tr(S1 + S2 - 2 (S1 S2)^1/2) = (1 + 4 - 4) + (1 + 9 - 6) = 5.
    const s1 = Float64Array.from([1, 0, 0, 1]);
    const g = gaussianTransport(symmetricEigen(s1, 2), s1, [4, 0, 0, 9]);
    expect(Array.from(g.matrix)).toEqual([2, 0, 0, 3]);
    expect(g.covarianceTerm).toBeCloseTo(5, 14);
    expect(g.minEigenvalue).toBeCloseTo(2, 15);
    expect(g.inverse[0]).toBeCloseTo(0.5, 15);
    expect(g.inverse[3]).toBeCloseTo(1 / 3, 15);
  });

  test.each([2, 3, 6])('for seeded random SPD S1, S2 (d = %i), A is symmetric positive definite and A S1 A = S2', (d) => {
    const s1 = randomSpd(d, d);
    const s2 = randomSpd(d, 50 + d);
    const g = gaussianTransport(symmetricEigen(s1, d), s1, s2);
    for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) expect(g.matrix[k * d + l]).toBe(g.matrix[l * d + k]);
    expect(g.minEigenvalue).toBeGreaterThan(0);
    expect(symmetricEigen(g.matrix, d).values[0]).toBeCloseTo(g.minEigenvalue, 14);
    // Source: Knott & Smith 1984 (the map pushes N(m1, S1) to N(m2, S2): A S1 A = S2)
    const asa = product3(g.matrix, s1, g.matrix, d);
    for (let j = 0; j < d * d; j++) expect(asa[j]).toBeCloseTo(s2[j], 11);
    const id = product3(
      g.matrix,
      g.inverse,
      Float64Array.from({ length: d * d }, (_, j) => (j % (d + 1) === 0 ? 1 : 0)),
      d,
    );
    for (let j = 0; j < d * d; j++) expect(id[j]).toBeCloseTo(j % (d + 1) === 0 ? 1 : 0, 12);
  });

  test('equal covariances give A = I and a zero trace term', () => {
    // Source: definition (the identity is the optimal map between equal covariances)
    const s = randomSpd(4, 9);
    const g = gaussianTransport(symmetricEigen(s, 4), s, s);
    for (let j = 0; j < 16; j++) expect(g.matrix[j]).toBeCloseTo(j % 5 === 0 ? 1 : 0, 12);
    expect(g.covarianceTerm).toBeCloseTo(0, 12);
  });

  test('inputs are not mutated', () => {
    const s1 = randomSpd(3, 1);
    const s2 = Object.freeze(Array.from(randomSpd(3, 2)));
    const c1 = Float64Array.from(s1);
    gaussianTransport(symmetricEigen(s1, 3), s1, s2);
    expect(s1).toEqual(c1);
  });
});
