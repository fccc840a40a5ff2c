import { icgnHidden } from '../../../src/engine/gradient-net/icgn';
import { sigmoidEnergy, sigmoidEnergySlope } from '../../../src/engine/gradient-net/sigmoid-energy';
import { randomParams } from './helpers';

describe('icgnHidden', () => {
  test("act_j = c_j [h(w_j.x + b_j) - h(b_j)] and gain_j = c_j h'(w_j.x + b_j) > 0", () => {
    const p = randomParams(2, 4, 1, 1);
    const x = Float64Array.of(0.3, -1.2);
    const act = new Float64Array(4);
    const gain = new Float64Array(4);
    icgnHidden(p, x, act, gain);
    for (let j = 0; j < 4; j++) {
      const u = p.w[j * 2] * x[0] + p.w[j * 2 + 1] * x[1] + p.b[j];
      expect(act[j]).toBeCloseTo(p.c[j] * (sigmoidEnergy(u) - sigmoidEnergy(p.b[j])), 15); // Source: closed form, sigmoid-energy.ts
      expect(gain[j]).toBeCloseTo(p.c[j] * sigmoidEnergySlope(u), 15);
      expect(gain[j]).toBeGreaterThan(0);
    }
  });
});
