import { barycentricMap } from '../../../src/engine/entropic/barycentric-map';
import { TruncatedSoftmax } from '../../../src/engine/entropic/truncated-softmax';
import type { Points } from '../../../src/engine/points';
import { Random } from '../../../src/engine/stats/random';

function cloud(n: number, d: number, seed: number, spread: number): Points {
  const r = new Random(seed);
  return { n, d, data: Float64Array.from({ length: n * d }, () => spread * r.normal()) };
}

describe('TruncatedSoftmax', () => {
  test.each([
    [2, 0.01],
    [5, 0.05],
    [8, 0.03],
  ])('at d = %p, eps = %p it matches the untruncated entropic map within its stated bound, 1e-10 x the support diameter', (d, eps) => {
    // Source: the bound follows from the truncation rule (weights below e^-(23.03 + log m) of the largest left out; see
    // the class comment); the untruncated map is barycentricMap (exponentiates every weight above e^-60).
    const m = 700;
    const support = cloud(m, d, 1, 1);
    const r = new Random(2);
    const logMass = new Float64Array(m).fill(-Math.log(m));
    const g = Float64Array.from({ length: m }, () => 0.5 * r.normal());
    const h = Float64Array.from(g, (v, j) => logMass[j] + v / eps);
    const x = cloud(203, d, 3, 1.5); // 203: the last block of four is partial
    const exact = barycentricMap(x, support, logMass, g, eps);
    const fast = new TruncatedSoftmax(support, h, eps).map(x);
    let diameter = 0;
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < i; j++) {
        let s = 0;
        for (let k = 0; k < d; k++) s += (support.data[i * d + k] - support.data[j * d + k]) ** 2;
        diameter = Math.max(diameter, Math.sqrt(s));
      }
    }
    for (let i = 0; i < x.n; i++) {
      let e = 0;
      for (let k = 0; k < d; k++) e += (fast[i * d + k] - exact[i * d + k]) ** 2;
      expect(Math.sqrt(e)).toBeLessThanOrEqual(1e-10 * diameter + 1e-13);
    }
  });

  test('a row gives the same bits whichever rows share its block of four', () => {
    // Source: design choice (results must not depend on the batch a row arrives in).
    const d = 3;
    const support = cloud(50, d, 4, 1);
    const h = new Float64Array(50);
    const softmax = new TruncatedSoftmax(support, h, 0.1);
    const x = cloud(7, d, 5, 1);
    const all = softmax.map(x);
    const last = softmax.map({ n: 1, d, data: x.data.slice(6 * d) });
    expect(Array.from(last)).toEqual(Array.from(all.slice(6 * d)));
  });
});
