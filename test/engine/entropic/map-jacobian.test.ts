import { barycentricMap } from '../../../src/engine/entropic/barycentric-map';
import { mapJacobian, minJacobianEigenvalue } from '../../../src/engine/entropic/map-jacobian';
import { smallestEigenvalue } from '../../../src/engine/stats/smallest-eigenvalue';
import type { Points } from '../../../src/engine/points';

function rows(n: number, d: number, seed: number): Points {
  let s = seed >>> 0;
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    data[i] = (3 * s) / 4294967296 - 1.5;
  }
  return { n, d, data };
}

describe('map-jacobian', () => {
  const d = 3;
  const y = rows(40, d, 1);
  const logMass = new Float64Array(40).fill(-Math.log(40));
  const g = Float64Array.from({ length: 40 }, (_, j) => 0.1 * Math.sin(j));
  const eps = 0.4;
  const h = Float64Array.from(logMass, (l, j) => l + g[j] / eps);

  test('mapJacobian equals central finite differences of the map, and is symmetric PSD', () => {
    const x = rows(5, d, 2);
    const J = new Float64Array(d * d);
    const step = 1e-5;
    for (let i = 0; i < x.n; i++) {
      mapJacobian(x, i, y, h, eps, J, new Float64Array(40));
      for (let k = 0; k < d; k++) {
        const plus = Float64Array.from(x.data.subarray(i * d, (i + 1) * d));
        const minus = Float64Array.from(plus);
        plus[k] += step;
        minus[k] -= step;
        const tp = barycentricMap({ n: 1, d, data: plus }, y, logMass, g, eps);
        const tm = barycentricMap({ n: 1, d, data: minus }, y, logMass, g, eps);
        // Source: central differences, error O(step^2); column k of DT is dT/dx_k.
        for (let r = 0; r < d; r++) expect(Math.abs((tp[r] - tm[r]) / (2 * step) - J[r * d + k])).toBeLessThan(1e-6);
      }
      for (let p = 0; p < d; p++) for (let q = 0; q < d; q++) expect(J[p * d + q]).toBe(J[q * d + p]);
      expect(smallestEigenvalue(J, d)).toBeGreaterThanOrEqual(-1e-12);
    }
  });

  test('minJacobianEigenvalue is the smallest eigenvalue over the given rows and is >= 0', () => {
    const x = rows(30, d, 3);
    const all = minJacobianEigenvalue(
      x,
      Int32Array.from({ length: 30 }, (_, i) => i),
      y,
      logMass,
      g,
      eps,
    );
    const some = minJacobianEigenvalue(x, Int32Array.of(0, 5), y, logMass, g, eps);
    expect(all).toBeGreaterThanOrEqual(-1e-12);
    expect(all).toBeLessThanOrEqual(some);
  });
});
