import { sigmoid, sigmoidEnergy, sigmoidEnergySlope } from '../../../src/engine/gradient-net/sigmoid-energy';

describe('sigmoidEnergy h(u) = s^2/2 - s^3/3', () => {
  test("its derivative is s'(u)^2 (central differences)", () => {
    for (const u of [-8, -2, -0.5, 0, 0.7, 3, 9]) {
      const e = 1e-5;
      const fd = (sigmoidEnergy(u + e) - sigmoidEnergy(u - e)) / (2 * e);
      const s = sigmoid(u);
      expect(fd).toBeCloseTo((s * (1 - s)) ** 2, 9); // Source: derivation in sigmoid-energy.ts
      expect(sigmoidEnergySlope(u)).toBeCloseTo((s * (1 - s)) ** 2, 15);
    }
  });

  test('h(0) = 1/8 - 1/24 = 1/12, h(-inf) = 0, h(+inf) = 1/6', () => {
    expect(sigmoidEnergy(0)).toBeCloseTo(1 / 12, 15); // Source: s(0) = 1/2
    expect(sigmoidEnergy(-800)).toBe(0);
    expect(sigmoidEnergy(800)).toBeCloseTo(1 / 6, 15);
  });

  test('sigmoid does not overflow at large |u|', () => {
    expect(sigmoid(-1000)).toBe(0);
    expect(sigmoid(1000)).toBe(1);
    expect(sigmoid(0)).toBe(0.5);
  });
});
