import { sqrtm } from 'mathjs';
import { PSD_TOLERANCE, psdEigen, psdInverseSqrt, psdSqrt } from '../../../src/engine/stats/sqrtm';

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
      let t = i === j ? 0.2 : 0;
      for (let k = 0; k < d; k++) t += b[i * d + k] * b[j * d + k];
      s[i * d + j] = t;
    }
  return s;
}

const rows = (m: Float64Array, d: number): number[][] => Array.from({ length: d }, (_, i) => Array.from(m.subarray(i * d, (i + 1) * d)));

function mul(a: Float64Array, b: Float64Array, d: number): Float64Array {
  const c = new Float64Array(d * d);
  for (let i = 0; i < d; i++) for (let k = 0; k < d; k++) for (let j = 0; j < d; j++) c[i * d + j] += a[i * d + k] * b[k * d + j];
  return c;
}

describe('psdSqrt and psdInverseSqrt: symmetric square roots through the eigendecomposition', () => {
  test.each([1, 2, 4, 7])('psdSqrt agrees with mathjs sqrtm for a seeded random SPD matrix, d = %i', (d) => {
    const s = randomSpd(d, 40 + d);
    const r = psdSqrt(s, d);
    // Source: mathjs sqrtm (Denman-Beavers iteration)
    const ref = sqrtm(rows(s, d)) as unknown as number[][];
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) expect(r[i * d + j]).toBeCloseTo(ref[i][j], 10);
    const rr = mul(r, r, d);
    for (let j = 0; j < d * d; j++) expect(rr[j]).toBeCloseTo(s[j], 12);
  });

  test('psdInverseSqrt(S) psdSqrt(S) is the identity', () => {
    const d = 5;
    const s = randomSpd(d, 8);
    const p = mul(psdInverseSqrt(s, d), psdSqrt(s, d), d);
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) expect(p[i * d + j]).toBeCloseTo(i === j ? 1 : 0, 11);
  });

  test('the square root of the singular [[1, 1], [1, 1]] is [[1, 1], [1, 1]] / sqrt 2', () => {
    // Source: hand computation ([[1,1],[1,1]] = 2 P with P a projection, so its root is sqrt(2) P)
    const r = psdSqrt([1, 1, 1, 1], 2);
    for (const x of r) expect(x).toBeCloseTo(Math.SQRT1_2, 15);
  });

  test('rounding-level negative eigenvalues are set to zero; clearly negative ones throw', () => {
    const e = psdEigen([1, 1, 1, 1 - 1e-13], 2, 'S', 'test');
    // Source: hand computation: eigenvalues (2 - t -/+ sqrt(4 + t^2)) / 2 with t = 1e-13, i.e. about -2.5e-14 and 2 - 5e-14;
    // the negative one is within PSD_TOLERANCE of zero, so the documented rule (design choice) sets it to exactly 0
    expect(e.values[0]).toBe(0);
    expect(e.values[1]).toBeCloseTo(2 - 5e-14, 12);
    expect(PSD_TOLERANCE).toBe(1e-10);
    expect(() => psdSqrt([1, 2, 2, 1], 2)).toThrow(/not positive semidefinite \(its smallest eigenvalue is -1\.000/);
  });

  test('psdInverseSqrt refuses a singular matrix with a num-kind error', () => {
    expect(() => psdInverseSqrt([1, 1, 1, 1], 2)).toThrow(/singular or nearly so/);
  });

  test('inputs are not mutated', () => {
    const s = Object.freeze(Array.from(randomSpd(3, 1)));
    const copy = [...s];
    psdSqrt(s, 3);
    psdInverseSqrt(s, 3);
    expect([...s]).toEqual(copy);
  });
});
