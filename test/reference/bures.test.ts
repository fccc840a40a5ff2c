/**
 * Outside checks of the linear map and the Bures cost against mathjs (an
 * independent matrix square root: Denman-Beavers iteration) and against
 * textbook identities of Gaussian optimal transport.
 */
import { add, inv, multiply, sqrtm, subtract, trace, transpose } from 'mathjs';
import { gaussianW2Squared } from '../../src/engine/linear/bures';
import { fitLinear } from '../../src/engine/linear/fit';
import type { Sample } from '../../src/engine/points';
import { weightedMoments } from '../../src/engine/stats/moments';

type M = number[][];

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

function randomSpd(d: number, seed: number): M {
  const u = rng(seed);
  const b = Array.from({ length: d }, () => Array.from({ length: d }, () => 2 * u() - 1));
  return multiply(b, transpose(b)).map((row, i) => row.map((v, j) => v + (i === j ? 0.25 : 0))) as M;
}

const rows = (m: ArrayLike<number>, d: number): M => Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => m[i * d + j]));

/** tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2) with mathjs. */
function mathjsBures(s1: M, s2: M): number {
  const r1 = sqrtm(s1) as unknown as M;
  const inner = sqrtm(multiply(multiply(r1, s2), r1) as M) as unknown as M;
  return trace(subtract(add(s1, s2), multiply(2, inner)) as M) as number;
}

describe('Bures-Wasserstein closed form against mathjs and textbook identities', () => {
  test.each([2, 3, 5])('gaussianW2Squared equals |m1 - m2|^2 + tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2) computed with mathjs sqrtm, d = %i', (d) => {
    const s1 = randomSpd(d, d);
    const s2 = randomSpd(d, 10 + d);
    const m1 = Array.from({ length: d }, (_, k) => k);
    const m2 = Array.from({ length: d }, (_, k) => 1 - k * k);
    const meanPart = m1.reduce((acc, v, k) => acc + (v - m2[k]) ** 2, 0);
    // Source: Dowson & Landau 1982, evaluated with mathjs sqrtm
    expect(gaussianW2Squared(m1, s1, m2, s2)).toBeCloseTo(meanPart + mathjsBures(s1, s2), 9);
  });

  test('the fitted matrix equals S1^-1/2 (S1^1/2 S2 S1^1/2)^1/2 S1^-1/2 computed with mathjs', () => {
    const u = rng(77);
    const n = 200;
    const d = 3;
    const mk = (shift: number): Sample => ({
      n,
      d,
      data: Float64Array.from({ length: n * d }, (_, j) => shift + ((j % d) + 1) * u() + u() * u()),
      weights: null,
    });
    const s = mk(0);
    const t = mk(2);
    const map = fitLinear(s, t, { ridge: 0, units: 'raw' }, {}, { compare: false });
    const s1 = rows(weightedMoments(s).cov, d);
    const s2 = rows(weightedMoments(t).cov, d);
    const r1 = sqrtm(s1) as unknown as M;
    const ir1 = inv(r1);
    // Source: Knott & Smith 1984 / Olkin & Pukelsheim 1982, evaluated with mathjs
    const A = multiply(multiply(ir1, sqrtm(multiply(multiply(r1, s2), r1) as M) as unknown as M), ir1) as M;
    const got = map.parameters.matrix;
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) expect(got[i * d + j]).toBeCloseTo(A[i][j], 10);
  });

  test('for Gaussians the cost equals the transport cost of the map: |m2 - m1|^2 + tr((A - I) S1 (A - I))', () => {
    const u = rng(5);
    const n = 300;
    const d = 4;
    const mk = (shift: number, seedScale: number): Sample => ({
      n,
      d,
      data: Float64Array.from({ length: n * d }, (_, j) => shift + seedScale * ((j % d) + 1) * u() + u() ** 3),
      weights: null,
    });
    const s = mk(0, 1);
    const t = mk(-1, 2);
    const map = fitLinear(s, t, { ridge: 0, units: 'raw' }, {}, { compare: false });
    const m1 = weightedMoments(s);
    const m2 = weightedMoments(t);
    const A = rows(map.parameters.matrix, d);
    const I = Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => (i === j ? 1 : 0)));
    const AmI = subtract(A, I) as M;
    const covPart = trace(multiply(multiply(AmI, rows(m1.cov, d)), AmI) as M) as number;
    let meanPart = 0;
    for (let k = 0; k < d; k++) meanPart += (m1.mean[k] - m2.mean[k]) ** 2;
    // Source: Knott & Smith 1984 (E|T(X) - X|^2 for the optimal linear map equals W2^2 between the Gaussians)
    expect(map.cost().w2Squared).toBeCloseTo(meanPart + covPart, 10);
  });
});
