import { raisedOmega } from '../../../src/engine/entropic/over-relaxation';

/** Young's SOR rate for omega below the optimum, given the plain rate mu^2. */
const youngRate = (omega: number, mu: number): number => ((omega * mu + Math.sqrt(omega * omega * mu * mu - 4 * (omega - 1))) / 2) ** 2;

describe('over-relaxation', () => {
  test('raisedOmega recovers the optimal omega 2 / (1 + sqrt(1 - mu^2)) from the rate observed under a smaller omega', () => {
    for (const mu2 of [0.9, 0.98, 0.995]) {
      const mu = Math.sqrt(mu2);
      const best = 2 / (1 + Math.sqrt(1 - mu2));
      const omega = 1 + (best - 1) / 2;
      // Source: Young's SOR relation, as shown for Sinkhorn by Lehmann, von Renesse, Sambale & Uschmajew 2021.
      expect(raisedOmega(omega, youngRate(omega, mu), 1.99)).toBeCloseTo(best, 10);
    }
  });

  test('raisedOmega never lowers omega, never exceeds the cap, and ignores rates at omega - 1 or without decay', () => {
    expect(raisedOmega(1.5, 0.5, 1.9)).toBe(1.5); // rate = omega - 1: already at or above the optimum
    expect(raisedOmega(1.5, 1.2, 1.9)).toBe(1.5); // the error grew
    expect(raisedOmega(1.5, NaN, 1.9)).toBe(1.5);
    expect(raisedOmega(1.5, 0.999, 1.6)).toBe(1.6);
  });
});
