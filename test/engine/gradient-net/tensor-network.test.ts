import { BACKENDS, tf, useBackend } from './tf-backends';
import { TensorNetwork, paramsFromFlat, softplus, softplusInverse } from '../../../src/engine/gradient-net/tensor-network';
import { randomParams } from './helpers';

describe.each(BACKENDS)('on the %s backend', (backend) => {
  beforeAll(() => useBackend(backend));

  describe('TensorNetwork', () => {
    test('stores all weights in one variable and reads them back (float32 rounding only)', () => {
      const p = randomParams(3, 5, 2, 4);
      const before = tf.memory().numTensors;
      const net = new TensorNetwork(p);
      const back = net.toParams();
      net.dispose();
      expect(tf.memory().numTensors).toBe(before);
      for (const k of ['w', 'b', 'c', 'v', 'beta'] as const) {
        // Source: float32 epsilon 1.2e-7
        for (let i = 0; i < p[k].length; i++) expect(Math.abs(back[k][i] - p[k][i])).toBeLessThan(1e-6 * (1 + Math.abs(p[k][i])));
      }
      expect(back.alpha).toBeCloseTo(p.alpha, 6);
    });

    test('paramsFromFlat inverts the flat layout; softplus and its inverse agree', () => {
      const flat = Float32Array.from({ length: 2 * 3 + 3 + 3 + 4 + 1 + 2 }, (_, i) => i / 10);
      const p = paramsFromFlat(flat, 2, 3, 1);
      expect(p.w[1 * 2 + 0]).toBeCloseTo(0.1, 6); // W^T stored d x hidden: W[1][0] = flat[0 * 3 + 1]
      expect(softplusInverse(softplus(0.3))).toBeCloseTo(0.3, 12); // Source: definition
      expect(softplus(-50)).toBeGreaterThan(0);
    });
  });
});
