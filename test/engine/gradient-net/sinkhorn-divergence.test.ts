import { BACKENDS, tf, useBackend } from './tf-backends';
import { batchSinkhorn } from '../../../src/engine/gradient-net/batch-sinkhorn';
import { Random } from '../../../src/engine/stats/random';
import { sinkhornDivergenceAt, sinkhornPotentials } from '../../../src/engine/gradient-net/sinkhorn-divergence';

describe.each(BACKENDS)('on the %s backend', (backend) => {
  beforeAll(() => useBackend(backend));

  describe('tfjs Sinkhorn divergence (the bench comparison)', () => {
    test('gives the same value and gradient as the float64 version, to float32 accuracy', () => {
      const r = new Random(3);
      const x = Float64Array.from({ length: 40 }, () => r.normal());
      const y = Float64Array.from({ length: 50 }, () => r.normal() + 0.5);
      const setup = { blur: 0.5, diameter2: 40, iterations: 10 };
      const ref = batchSinkhorn(x, 20, y, 25, 2, setup);
      const before = tf.memory().numTensors;
      const [value, grad] = tf.tidy(() => {
        const xt = tf.tensor2d(Float32Array.from(x), [20, 2]);
        const yt = tf.tensor2d(Float32Array.from(y), [25, 2]);
        const pot = sinkhornPotentials(xt, yt, setup);
        const g = tf.grad((z: tf.Tensor) => sinkhornDivergenceAt(z as tf.Tensor2D, yt, pot))(xt);
        return [sinkhornDivergenceAt(xt, yt, pot).dataSync()[0], g.dataSync()];
      });
      expect(tf.memory().numTensors).toBe(before);
      expect(value).toBeCloseTo(ref.value, 4); // Source: float32 rounding of the same formulas
      // The tfjs version differentiates one more x-x softmin step than the float64 one, so after 10 iterations they differ slightly.
      for (let i = 0; i < 40; i++) expect(Math.abs(grad[i] - ref.gradient[i])).toBeLessThan(1e-3);
    });
  });
});
