import { isRemapError, RemapError } from '../../../src/engine/errors';
import { fitLinear } from '../../../src/engine/linear/fit';
import { product3 } from '../../../src/engine/linear/gaussian-transport';
import { column, sample, type Sample } from '../../../src/engine/points';
import { weightedMoments } from '../../../src/engine/stats/moments';
import { symmetricEigen } from '../../../src/engine/stats/symmetric-eigen';
import { gaussianW2Squared } from '../../../src/engine/linear/bures';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = Math.imul(s ^ (s >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return ((z ^ (z >>> 16)) >>> 0) / 4294967296;
  };
}

/** Seeded rows with correlated, skewed columns (not Gaussian). */
function randomSample(n: number, d: number, seed: number, shift: number, weighted = false): Sample {
  const u = rng(seed);
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const c = u();
    for (let k = 0; k < d; k++) data[i * d + k] = shift + (k + 1) * u() ** 2 + (k % 2 ? c : -c);
  }
  const weights = weighted ? Float64Array.from({ length: n }, () => 0.2 + u()) : null;
  return { n, d, data, weights };
}

/** units=raw: the map in the data's own units, the Knott & Smith closed form of the raw moments. */
const settings = { ridge: 0, units: 'raw' };

describe('fitLinear(source, target, settings) fits T(x) = m2 + A (x - m1)', () => {
  test.each([
    [2, false],
    [4, true],
  ])('the map pushes the source mean and covariance exactly onto the target ones (d = %i, weighted = %s)', (d, weighted) => {
    const s = randomSample(400, d, 1, 0, weighted);
    const t = randomSample(300, d, 2, 5, weighted);
    const map = fitLinear(s, t, settings);
    const mapped = map.apply(s);
    const a = weightedMoments(mapped, s.weights);
    const b = weightedMoments(t, t.weights);
    // Source: Knott & Smith 1984 (A S1 A = S2), applied to the empirical moments
    for (let k = 0; k < d; k++) expect(a.mean[k]).toBeCloseTo(b.mean[k], 11);
    for (let j = 0; j < d * d; j++) expect(a.cov[j]).toBeCloseTo(b.cov[j], 11);
  });

  test('in one column it is the affine map m2 + (s2 / s1)(x - m1)', () => {
    const src = [1, 2, 4, 7, 11];
    const tgt = [10, 13, 20, 30, 31, 40];
    const m1 = src.reduce((x, y) => x + y) / 5;
    const m2 = tgt.reduce((x, y) => x + y) / 6;
    const s1 = Math.sqrt(src.reduce((x, y) => x + (y - m1) ** 2, 0) / 5);
    const s2 = Math.sqrt(tgt.reduce((x, y) => x + (y - m2) ** 2, 0) / 6);
    const map = fitLinear(sample(src), sample(tgt), settings, {}, { compare: false });
    const y = map.apply(column([0, 5, 20]));
    // Source: common practice (1-D Gaussian optimal map: standardise, then rescale)
    [0, 5, 20].forEach((x, i) => expect(y.data[i]).toBeCloseTo(m2 + (s2 / s1) * (x - m1), 12));
    expect(y.outside).toBe(2);
    expect(map.cost().w2Squared).toBeCloseTo((m1 - m2) ** 2 + (s1 - s2) ** 2, 10);
  });

  test('invert undoes apply (round trip) for any point, inside or outside the fitted range', () => {
    const s = randomSample(200, 3, 3, 0);
    const t = randomSample(200, 3, 4, -2);
    const map = fitLinear(s, t, settings, {}, { compare: false });
    const x = { n: 3, d: 3, data: Float64Array.from([0.1, 0.2, 0.3, -50, 40, 9, 1, 1, 1]) };
    const back = map.invert(map.apply(x));
    for (let j = 0; j < 9; j++) expect(back.data[j]).toBeCloseTo(x.data[j], 11);
  });

  test("the cost is the Bures closed form of the samples' moments; minJacobianEigenvalue is the smallest eigenvalue of A", () => {
    const s = randomSample(300, 3, 5, 0, true);
    const t = randomSample(250, 3, 6, 1, true);
    const map = fitLinear(s, t, settings, {}, { compare: false });
    const a = weightedMoments(s, s.weights);
    const b = weightedMoments(t, t.weights);
    const cost = map.cost();
    expect(cost.kind).toBe('bures');
    // Source: gaussianW2Squared (Dowson & Landau 1982) on the same moments
    expect(cost.w2Squared).toBeCloseTo(gaussianW2Squared(a.mean, a.cov, b.mean, b.cov), 11);
    expect(cost.w2).toBeCloseTo(Math.sqrt(cost.w2Squared), 14);
    const A = map.parameters.matrix;
    expect(map.diagnostics().minJacobianEigenvalue).toBeCloseTo(symmetricEigen(A, 3).values[0], 13);
    const asa = product3(A, a.cov, A, 3);
    for (let j = 0; j < 9; j++) expect(asa[j]).toBeCloseTo(b.cov[j], 11);
  });

  test('integer weights give the same map as repeated rows', () => {
    const s = sample(
      [
        [0, 1],
        [2, 0],
        [1, 3],
        [4, 4],
        [3, 1],
      ],
      [1, 2, 1, 3, 1],
    );
    const r = sample([
      [0, 1],
      [2, 0],
      [2, 0],
      [1, 3],
      [4, 4],
      [4, 4],
      [4, 4],
      [3, 1],
    ]);
    const t = sample([
      [5, 5],
      [6, 9],
      [8, 6],
      [7, 7],
      [9, 9],
    ]);
    const a = fitLinear(s, t, settings, {}, { compare: false }).parameters.matrix;
    const b = fitLinear(r, t, settings, {}, { compare: false }).parameters.matrix;
    // Source: common practice (frequency weights)
    for (let j = 0; j < 4; j++) expect(a[j]).toBeCloseTo(b[j], 13);
  });

  test('fit-time comparisons: energy distance drops and the KS statistic is recorded', () => {
    const s = randomSample(500, 2, 7, 0);
    const t = randomSample(500, 2, 8, 3);
    const d = fitLinear(s, t, settings).diagnostics();
    expect(d.energyBefore).toBeGreaterThan(1);
    expect(d.energyAfter).toBeLessThan(0.1 * (d.energyBefore ?? 0));
    expect(d.ksMaxAfter).toBeLessThan(0.2);
    expect(fitLinear(s, t, settings, {}, { compare: false }).diagnostics().energyBefore).toBeUndefined();
  });

  test('a constant source column is refused with a message naming the sample and column and suggesting ridge', () => {
    const s = sample([
      [1, 5],
      [2, 5],
      [3, 5],
      [4, 5],
      [6, 5],
    ]);
    const t = randomSample(20, 2, 9, 0);
    let caught: unknown;
    try {
      fitLinear(s, t, settings, { columns: ['x', 'y'] });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(RemapError);
    expect((caught as RemapError).message).toMatch(/^fit \(linear\): the source covariance is singular or nearly so .* "y" is constant\. .* set ridge=/);
  });

  test('collinear target columns are refused, naming the target', () => {
    const s = randomSample(30, 2, 10, 0);
    const t = sample([
      [1, 2],
      [2, 4],
      [3, 6],
      [5, 10],
      [8, 16],
    ]);
    expect(() => fitLinear(s, t, settings)).toThrow(/the target covariance is singular or nearly so .* column 1, column 2 are \(nearly\) linear combinations/);
  });

  test('with ridge set, a singular covariance fits and the fit records a ridge-added warning', () => {
    const s = sample([
      [1, 5],
      [2, 5],
      [3, 5],
      [4, 5],
      [6, 5],
    ]);
    const t = randomSample(40, 2, 11, 0);
    const map = fitLinear(s, t, { ridge: 1e-3, units: 'raw' });
    const codes = map.diagnostics().warnings.map((w) => w.code);
    expect(codes).toContain('ridge-added');
    expect(codes).toContain('small-sample');
    expect(map.cost().note).toMatch(/include the ridge 0.001/);
    // Source: with a ridge the covariances are not the samples' own, so Gelbrich's bound does not apply
    expect(map.cost().bound).toBe('estimate');
    // The ridge enters both covariances: A (S1 + rI) A = S2 + rI.
    const a = weightedMoments(s);
    const b = weightedMoments(t);
    for (const [m, r] of [
      [a.cov, 1e-3],
      [b.cov, 1e-3],
    ] as const)
      for (let k = 0; k < 2; k++) m[k * 3] += r;
    const asa = product3(map.parameters.matrix, a.cov, map.parameters.matrix, 2);
    for (let j = 0; j < 4; j++) expect(asa[j]).toBeCloseTo(b.cov[j], 10);
  });

  test('a nearly singular covariance (ratio below 1e-8) fits but warns singular-covariance', () => {
    const u = rng(12);
    const rows = Array.from({ length: 100 }, () => {
      const x = u();
      return [x, x + 1e-5 * u()];
    });
    const map = fitLinear(sample(rows), randomSample(100, 2, 13, 0), settings, {}, { compare: false });
    expect(map.diagnostics().warnings.map((w) => w.code)).toContain('singular-covariance');
  });

  test('a negative ridge is refused', () => {
    const s = randomSample(10, 1, 1, 0);
    let caught: unknown;
    try {
      fitLinear(s, s, { ridge: -1 });
    } catch (e) {
      caught = e;
    }
    expect(isRemapError(caught) && /setting ridge of method linear must be at least 0, not -1/.test(caught.message)).toBe(true);
  });

  test('inputs are not mutated', () => {
    const s = randomSample(50, 3, 14, 0, true);
    const t = randomSample(50, 3, 15, 1, true);
    const copies = [s.data, s.weights!, t.data, t.weights!].map((a) => Float64Array.from(a));
    fitLinear(Object.freeze(s), Object.freeze(t), settings);
    [s.data, s.weights!, t.data, t.weights!].forEach((a, i) => expect(a).toEqual(copies[i]));
  });
});
