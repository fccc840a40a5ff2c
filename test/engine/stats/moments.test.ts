import { covariance, Matrix } from 'ml-matrix';
import { sampleCovariance } from 'simple-statistics';
import { RemapError } from '../../../src/engine/errors';
import { weightedMoments } from '../../../src/engine/stats/moments';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

function randomPoints(n: number, d: number, seed: number): { n: number; d: number; data: Float64Array } {
  const u = rng(seed);
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const common = u();
    for (let k = 0; k < d; k++) data[i * d + k] = (k + 1) * u() + common * k - 3;
  }
  return { n, d, data };
}

describe('weightedMoments(p, weights) gives the moments of the empirical distribution', () => {
  test('unweighted covariance equals ml-matrix covariance times (n - 1) / n (ml-matrix divides by n - 1, we by n)', () => {
    const p = randomPoints(700, 5, 11);
    const m = weightedMoments(p);
    const rows: number[][] = [];
    for (let i = 0; i < p.n; i++) rows.push(Array.from(p.data.subarray(i * p.d, (i + 1) * p.d)));
    // Source: ml-matrix covariance (unbiased, divides by n - 1)
    const ref = covariance(new Matrix(rows)).to2DArray();
    for (let k = 0; k < p.d; k++) for (let l = 0; l < p.d; l++) expect(m.cov[k * p.d + l]).toBeCloseTo((ref[k][l] * (p.n - 1)) / p.n, 12);
    expect(m.totalWeight).toBe(700);
  });

  test('one covariance entry equals simple-statistics sampleCovariance times (n - 1) / n', () => {
    const p = randomPoints(301, 3, 5);
    const m = weightedMoments(p);
    const x = Array.from({ length: p.n }, (_, i) => p.data[i * 3]);
    const y = Array.from({ length: p.n }, (_, i) => p.data[i * 3 + 2]);
    // Source: simple-statistics sampleCovariance (divides by n - 1)
    expect(m.cov[2]).toBeCloseTo((sampleCovariance(x, y) * (p.n - 1)) / p.n, 12);
    expect(m.mean[0]).toBeCloseTo(x.reduce((a, b) => a + b, 0) / p.n, 13);
  });

  test('weighted mean and covariance equal the direct formula sum w (x - m)(x - m)^T / sum w', () => {
    const p = randomPoints(513, 4, 3);
    const u = rng(9);
    const w = Float64Array.from({ length: p.n }, (_, i) => (i % 7 === 0 ? 0 : 3 * u()));
    const m = weightedMoments(p, w);
    // Source: definition of the weighted empirical distribution's moments
    let W = 0;
    const mean = [0, 0, 0, 0];
    for (let i = 0; i < p.n; i++) {
      W += w[i];
      for (let k = 0; k < 4; k++) mean[k] += w[i] * p.data[i * 4 + k];
    }
    for (let k = 0; k < 4; k++) mean[k] /= W;
    for (let k = 0; k < 4; k++) {
      expect(m.mean[k]).toBeCloseTo(mean[k], 12);
      for (let l = 0; l < 4; l++) {
        let c = 0;
        for (let i = 0; i < p.n; i++) c += w[i] * (p.data[i * 4 + k] - mean[k]) * (p.data[i * 4 + l] - mean[l]);
        expect(m.cov[k * 4 + l]).toBeCloseTo(c / W, 12);
      }
    }
    expect(m.totalWeight).toBeCloseTo(W, 10);
  });

  test('integer weights act as repeated rows', () => {
    // Source: common practice (frequency weights)
    const a = weightedMoments({ n: 3, d: 2, data: Float64Array.from([1, 2, 3, 5, 4, 4]) }, [2, 1, 3]);
    const b = weightedMoments({ n: 6, d: 2, data: Float64Array.from([1, 2, 1, 2, 3, 5, 4, 4, 4, 4, 4, 4]) });
    for (let j = 0; j < 4; j++) expect(a.cov[j]).toBeCloseTo(b.cov[j], 14);
    for (let k = 0; k < 2; k++) expect(a.mean[k]).toBeCloseTo(b.mean[k], 14);
  });

  test('the documented example: [1, 2, 3] has mean 2 and variance 2/3', () => {
    // Source: hand computation ((1 + 0 + 1) / 3)
    const m = weightedMoments({ n: 3, d: 1, data: Float64Array.from([1, 2, 3]) });
    expect(m.mean[0]).toBe(2);
    expect(m.cov[0]).toBeCloseTo(2 / 3, 15);
  });

  test('the covariance is exactly symmetric and the inputs are not mutated', () => {
    const p = randomPoints(1000, 6, 21);
    const before = Float64Array.from(p.data);
    const w = Object.freeze(Array.from({ length: 1000 }, (_, i) => 1 + (i % 3)));
    const m = weightedMoments(Object.freeze(p), w);
    for (let k = 0; k < 6; k++) for (let l = 0; l < 6; l++) expect(m.cov[k * 6 + l]).toBe(m.cov[l * 6 + k]);
    expect(p.data).toEqual(before);
  });

  test('blocks of rows give the same result whatever n is relative to the block size', () => {
    // n = 257 crosses one block boundary (256 rows); compare with a naive sum.
    const p = randomPoints(257, 3, 2);
    const m = weightedMoments(p);
    const mean = [0, 0, 0];
    for (let i = 0; i < p.n; i++) for (let k = 0; k < 3; k++) mean[k] += p.data[i * 3 + k] / p.n;
    let c = 0;
    for (let i = 0; i < p.n; i++) c += (p.data[i * 3] - mean[0]) * (p.data[i * 3 + 1] - mean[1]);
    // Source: definition
    expect(m.cov[1]).toBeCloseTo(c / p.n, 12);
  });

  test('bad input throws RemapError naming the problem', () => {
    const p = { n: 2, d: 1, data: Float64Array.from([1, 2]) };
    expect(() => weightedMoments({ n: 0, d: 1, data: new Float64Array(0) })).toThrow(/at least one row/);
    expect(() => weightedMoments(p, [1])).toThrow(/1 weights for 2 rows/);
    expect(() => weightedMoments(p, [1, -1])).toThrow(/weight 2 is -1/);
    expect(() => weightedMoments(p, [0, 0])).toThrow(/add up to 0/);
    expect(() => weightedMoments({ n: 2, d: 1, data: Float64Array.from([1, NaN]) })).toThrow(RemapError);
    expect(() => weightedMoments({ n: 2, d: 1, data: Float64Array.from([1e200, -1e200]) })).toThrow(/too large/);
  });
});

describe('weightedMoments column ranges', () => {
  test('min and max per column over rows of positive weight (rows of weight zero are not part of the sample)', () => {
    // Source: definition (the range of the empirical distribution's support)
    const p = { n: 4, d: 2, data: Float64Array.from([1, 10, -3, 20, 7, -5, 100, 0]) };
    const all = weightedMoments(p);
    expect(Array.from(all.min)).toEqual([-3, -5]);
    expect(Array.from(all.max)).toEqual([100, 20]);
    const w = weightedMoments(p, [1, 1, 1, 0]);
    expect(Array.from(w.min)).toEqual([-3, -5]);
    expect(Array.from(w.max)).toEqual([7, 20]);
  });
});
