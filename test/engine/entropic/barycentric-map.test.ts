import { barycentricMap, softmaxLogits } from '../../../src/engine/entropic/barycentric-map';
import { points } from '../../../src/engine/points';

describe('barycentric-map', () => {
  const y = points([
    [-1, 0],
    [1, 0],
    [0, 2],
  ]);
  const logMass = Float64Array.of(Math.log(0.2), Math.log(0.3), Math.log(0.5));
  const g = Float64Array.of(0.1, -0.3, 0.2);

  test('barycentricMap(x) = sum_j y_j softmax_j(log b_j + (g_j - |x - y_j|^2 / 2) / eps)', () => {
    const x = points([
      [0.3, 0.4],
      [-2, 5],
    ]);
    const eps = 0.7;
    const out = barycentricMap(x, y, logMass, g, eps);
    for (let i = 0; i < 2; i++) {
      const z = [0, 1, 2].map((j) => logMass[j] + (g[j] - ((x.data[2 * i] - y.data[2 * j]) ** 2 + (x.data[2 * i + 1] - y.data[2 * j + 1]) ** 2) / 2) / eps);
      const w = z.map(Math.exp);
      const tot = w.reduce((s, v) => s + v, 0);
      // Source: Pooladian & Niles-Weed 2021, arXiv 2109.12004, eq. (3.2).
      for (let k = 0; k < 2; k++) expect(out[2 * i + k]).toBeCloseTo(w.reduce((s, v, j) => s + v * y.data[2 * j + k], 0) / tot, 14);
    }
  });

  test('a symmetric support and potential map the centre to the centre', () => {
    const out = barycentricMap(points([[0]]), points([[-1], [1]]), Float64Array.of(Math.log(0.5), Math.log(0.5)), Float64Array.of(0, 0), 1);
    // Source: symmetry.
    expect(out[0]).toBe(0);
  });

  test('rows far away saturate at one support point with no overflow (stable softmax)', () => {
    const out = barycentricMap(points([[1e6, 0]]), y, logMass, g, 1e-3);
    // Source: the softmax of well-separated logits puts all mass on the largest.
    expect(Array.from(out)).toEqual([1, 0]);
  });

  test('softmaxLogits sets the largest weight to exactly 1 and negligible ones to 0', () => {
    const w = new Float64Array(3);
    softmaxLogits(points([[1, 0]]), 0, y, Float64Array.of(0, 0, 0), 1e-3, w);
    expect(w[1]).toBe(1);
    expect(w[0]).toBe(0);
  });

  test('inputs are not mutated', () => {
    const x = points([[0.5, 0.5]]);
    const copy = [x.data, y.data, logMass, g].map((a) => Float64Array.from(a));
    barycentricMap(x, y, logMass, g, 0.3);
    expect([x.data, y.data, logMass, g]).toEqual(copy);
  });
});
