import { Matrix } from 'ml-matrix';
import * as math from 'mathjs';
import { fitLinear } from '../../../src/engine/linear/fit';
import { sample, type Sample } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';

/**
 * A survey-like table in four different units: income (tens of thousands),
 * a rate (hundredths), age (years) and hours worked per week. Invented, seeded.
 */
function surveyTable(n: number, seed: number, shift: number): Sample {
  const r = new Random(seed);
  const rows: number[][] = [];
  const w: number[] = [];
  for (let i = 0; i < n; i++) {
    const z1 = r.normal();
    const z2 = r.normal();
    const age = 20 + 45 * r.uniform() + 3 * shift;
    const hours = Math.max(0, 30 + 8 * z2 + 0.1 * (age - 40));
    const income = 20000 * Math.exp(0.5 * z1 + 0.01 * (age - 40) + 0.1 * shift) + 300 * hours;
    const rate = 0.04 + 0.008 * z1 + 0.003 * r.normal() + 0.002 * shift;
    rows.push([income, rate, age, hours]);
    w.push(0.5 + r.uniform());
  }
  return sample(rows, w);
}

/** Weighted mean and covariance (divided by the total weight) with ml-matrix, independent of the engine's moments. */
function momentsMl(s: Sample): { mean: number[]; cov: Matrix } {
  const X = new Matrix(s.n, s.d);
  for (let i = 0; i < s.n; i++) for (let k = 0; k < s.d; k++) X.set(i, k, s.data[i * s.d + k]);
  const w = Array.from(s.weights ?? new Float64Array(s.n).fill(1));
  const total = w.reduce((a, b) => a + b, 0);
  const mean = Array.from({ length: s.d }, (_, k) => X.getColumn(k).reduce((a, v, i) => a + w[i] * v, 0) / total);
  const C = Matrix.zeros(s.d, s.d);
  for (let i = 0; i < s.n; i++) {
    const e = Matrix.rowVector(X.getRow(i).map((v, k) => v - mean[k]));
    C.add(
      e
        .transpose()
        .mmul(e)
        .mul(w[i] / total),
    );
  }
  return { mean, cov: C };
}

describe('the linear map in standardised units (units=standardised, the default) on columns in very different units', () => {
  const src = surveyTable(600, 11, 0);
  const tgt = surveyTable(500, 12, 1);

  test('fits the table (raw-scale covariance eigenvalue ratio far below 1e-12) and pushes means and covariances exactly', () => {
    const a = momentsMl(src);
    // Source: mathjs eigenvalues of the raw covariance: the rate's variance is ~1e-12 of the income's, which the raw check once called singular
    const ev = (math.eigs(math.matrix(a.cov.to2DArray())).values as math.Matrix).toArray() as number[];
    expect(Math.min(...ev) / Math.max(...ev)).toBeLessThan(1e-12);
    const map = fitLinear(src, tgt, { ridge: 0 }, {}, { compare: false });
    const mapped = map.apply(src);
    const m = momentsMl({ ...mapped, weights: src.weights });
    const b = momentsMl(tgt);
    // Source: ml-matrix moments of the mapped source and of the target (A S1 A^T = S2, Knott & Smith 1984, conjugated by the column scales)
    for (let k = 0; k < 4; k++) expect(Math.abs(m.mean[k] - b.mean[k])).toBeLessThan(1e-9 * Math.sqrt(b.cov.get(k, k)));
    for (let k = 0; k < 4; k++)
      for (let l = 0; l < 4; l++) {
        const scale = Math.sqrt(b.cov.get(k, k) * b.cov.get(l, l));
        expect(Math.abs(m.cov.get(k, l) - b.cov.get(k, l))).toBeLessThan(1e-9 * scale);
      }
  });

  test('the map is T(x) = D^-1 T_s(D x), linear, with the eigenvalues of the standardised map; the cost says its units', () => {
    const map = fitLinear(src, tgt, { ridge: 0 }, {}, { compare: false });
    const A = new Matrix([
      Array.from(map.parameters.matrix.slice(0, 4)),
      Array.from(map.parameters.matrix.slice(4, 8)),
      Array.from(map.parameters.matrix.slice(8, 12)),
      Array.from(map.parameters.matrix.slice(12, 16)),
    ]);
    const Ainv = new Matrix([0, 1, 2, 3].map((r) => Array.from(map.parameters.inverse.slice(4 * r, 4 * r + 4))));
    // Source: ml-matrix product: the stored inverse is the inverse of the stored matrix
    const I = A.mmul(Ainv);
    for (let k = 0; k < 4; k++) for (let l = 0; l < 4; l++) expect(I.get(k, l)).toBeCloseTo(k === l ? 1 : 0, 9);
    // Source: mathjs eigenvalues of A (similar to the symmetric positive definite standardised matrix, so real and positive)
    const ev = (math.eigs(math.matrix(A.to2DArray())).values as math.Matrix).toArray() as number[];
    expect(Math.min(...ev.map(Number))).toBeCloseTo(map.diagnostics().minJacobianEigenvalue ?? NaN, 8);
    expect(Math.min(...ev.map(Number))).toBeGreaterThan(0);
    const cost = map.cost();
    expect(cost.units).toBe('raw');
    expect(cost.note).toMatch(/fitted in standardised units/);
    expect(cost.bound).toBe('lower');
  });

  test('units=raw fits the same table too (the conditioning is judged on the correlation scale), but the income dominates it', () => {
    const raw = fitLinear(src, tgt, { ridge: 0, units: 'raw' }, {}, { compare: false });
    const std = fitLinear(src, tgt, { ridge: 0 }, {}, { compare: false });
    // Source: design choice (both fit; they differ, since each is optimal for its own cost)
    expect(raw.parameters.matrix).not.toEqual(std.parameters.matrix);
    // Source: Gelbrich 1990: the raw-units closed form does not depend on the fitted units
    expect(raw.cost().w2Squared).toBeCloseTo(std.cost().w2Squared, 3);
    expect(raw.cost().note).toMatch(/units=raw/);
  });

  test("a constant column in standardised units suggests a ridge of 1e-6, a millionth of each column's pooled variance", () => {
    const rows = Array.from({ length: 20 }, (_, i) => [30000 + 1000 * Math.sin(i), 0.05]);
    const t = Array.from({ length: 20 }, (_, i) => [31000 + 900 * Math.cos(i), 0.04 + 0.001 * Math.sin(3 * i)]);
    // Source: design choice (advice that swamps no column)
    expect(() => fitLinear(sample(rows), sample(t), { ridge: 0 })).toThrow(
      /column 2 is constant\. .*set ridge=0\.000001 \(a millionth of each column's pooled variance/,
    );
  });
});
