import { gaussLegendre01 } from '../../../src/engine/gradient-net/gauss-legendre';

describe('gaussLegendre01(k)', () => {
  test('2 nodes on [0, 1] are 1/2 -+ 1/(2 sqrt 3) with weights 1/2', () => {
    // Source: Abramowitz & Stegun 25.4.29 (nodes +-1/sqrt(3), weights 1 on [-1, 1]), mapped to [0, 1].
    const { nodes, weights } = gaussLegendre01(2);
    expect(nodes[0]).toBeCloseTo(0.5 - 0.5 / Math.sqrt(3), 15);
    expect(nodes[1]).toBeCloseTo(0.5 + 0.5 / Math.sqrt(3), 15);
    expect(weights[0]).toBeCloseTo(0.5, 15);
    expect(weights[1]).toBeCloseTo(0.5, 15);
  });

  test('k nodes integrate t^p exactly for p <= 2k - 1 (1/(p + 1))', () => {
    for (const k of [1, 3, 8, 20]) {
      const { nodes, weights } = gaussLegendre01(k);
      for (let p = 0; p <= 2 * k - 1; p++) {
        let s = 0;
        for (let i = 0; i < k; i++) s += weights[i] * nodes[i] ** p;
        expect(s).toBeCloseTo(1 / (p + 1), 12); // Source: exactness of Gauss quadrature, degree 2k - 1
      }
    }
  });

  test('rejects a node count outside 1..200', () => {
    expect(() => gaussLegendre01(0)).toThrow(/k must be a whole number/);
    expect(() => gaussLegendre01(2.5)).toThrow(/not 2.5/);
  });
});
