import { mgnHidden } from '../../../src/engine/gradient-net/cascaded-mgn';
import { sigmoid } from '../../../src/engine/gradient-net/sigmoid-energy';
import { randomParams } from './helpers';

describe('mgnHidden (cascaded monotone gradient network)', () => {
  test('follows z_0 = Wx + b_0, z_l = Wx + s(z_{l-1}) + b_l and its gain is d s(z_{L-1}) / d(Wx) > 0', () => {
    const p = randomParams(2, 3, 3, 2);
    const x = Float64Array.of(-0.4, 0.9);
    const act = new Float64Array(3);
    const gain = new Float64Array(3);
    mgnHidden(p, x, act, gain);
    for (let j = 0; j < 3; j++) {
      const wx = p.w[j * 2] * x[0] + p.w[j * 2 + 1] * x[1];
      const out = (t: number) => {
        let z = t + p.b[j];
        for (let l = 1; l < 3; l++) z = t + sigmoid(z) + p.b[l * 3 + j];
        return sigmoid(z);
      };
      expect(act[j]).toBeCloseTo(p.c[j] * out(wx), 15); // Source: arXiv 2301.10862, C-MGN recursion
      const e = 1e-6;
      expect(gain[j]).toBeCloseTo((p.c[j] * (out(wx + e) - out(wx - e))) / (2 * e), 8); // Source: common practice, central differences
      expect(gain[j]).toBeGreaterThan(0);
    }
  });
});
