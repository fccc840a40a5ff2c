import { BACKENDS, tf, useBackend } from './tf-backends';
import { initialParams, linearOnly } from '../../../src/engine/gradient-net/initial-params';
import type { NetworkParams } from '../../../src/engine/gradient-net/network-params';
import { RegressionObjective } from '../../../src/engine/gradient-net/regression-objective';
import { SinkhornObjective } from '../../../src/engine/gradient-net/sinkhorn-objective';
import { Random } from '../../../src/engine/stats/random';
import { trainGradientNet } from '../../../src/engine/gradient-net/train';

const r = new Random(1);
const X = { n: 80, d: 2, data: Float64Array.from({ length: 160 }, () => r.normal()), weights: null };
const Y = { n: 80, d: 2, data: Float64Array.from({ length: 160 }, () => 1 + 2 * r.normal()), weights: null };

describe.each(BACKENDS)('trainGradientNet on the %s backend', (backend) => {
  const sinkhorn = () => new SinkhornObjective(Y, 0, 1, 1);
  const opts = (steps: number, lr = 0.01) => ({ steps, learningRate: lr, batch: 0, seed: 1, timeBudgetMs: 30000, backend, objective: sinkhorn() });
  beforeAll(() => useBackend(backend));

  test('lowers the Sinkhorn divergence from a poor start, deterministically, leaving no tensors', async () => {
    const before = tf.memory().numTensors;
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const losses: number[] = [];
    const a = await trainGradientNet(X, start, opts(20, 0.05), { onProgress: (p) => losses.push(p.loss) });
    const b = await trainGradientNet(X, start, opts(20, 0.05));
    expect(tf.memory().numTensors).toBe(before);
    expect(Array.from(a.params.w)).toEqual(Array.from(b.params.w));
    expect(losses[losses.length - 1]).toBeLessThan(losses[0]);
    expect(a.stopped).toBe('steps');
    expect(a.backend).toBe(backend);
  });

  test('regression onto a known affine map recovers it (the amortised start)', async () => {
    // Target map t(x) = 2 x + (1, -1): the gradient of the convex x.x + (1, -1).x.
    const targets = (rows: Uint32Array) => {
      const out = new Float64Array(rows.length * 2);
      rows.forEach((i, b) => {
        out[b * 2] = 2 * X.data[i * 2] + 1;
        out[b * 2 + 1] = 2 * X.data[i * 2 + 1] - 1;
      });
      return out;
    };
    const before = tf.memory().numTensors;
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const res = await trainGradientNet(X, start, { ...opts(400, 0.05), objective: new RegressionObjective(targets) });
    expect(tf.memory().numTensors).toBe(before);
    // Source: the affine map above; design choice: within 0.05 after 400 full-batch Adam steps.
    expect(res.finalLoss).toBeLessThan(0.05);
  });

  test('keeps the best-scoring checkpoint, and returns the start itself when no checkpoint beats it', async () => {
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const gaussian = linearOnly(start);
    const seen: NetworkParams[] = [];
    // A score that prefers the checkpoint of step 6 (scores 1, 0.5, 3, 4 at steps 3, 6, 9, 12).
    const score = (p: NetworkParams) => {
      seen.push(p);
      return seen.length === 2 ? 0.5 : seen.length;
    };
    const res = await trainGradientNet(X, start, opts(12), {}, { score, every: 3, patience: 0, start: { params: gaussian, score: 0.9 } });
    expect(seen.length).toBe(4);
    expect(res.keptStep).toBe(6);
    expect(res.keptScore).toBe(0.5);
    expect(res.params).toBe(seen[1]);
    expect(Number.isFinite(res.keptLoss)).toBe(true);
    const worse = await trainGradientNet(X, start, opts(6), {}, { score: () => 1, every: 3, patience: 0, start: { params: gaussian, score: 0.9 } });
    expect(worse.keptStep).toBe(0);
    expect(worse.params).toBe(gaussian); // Source: design choice -- training never ends worse than its start
  });

  test('stops with no-gain after `patience` steps without a better checkpoint', async () => {
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const res = await trainGradientNet(X, start, opts(1000), {}, { score: () => 1, every: 2, patience: 6, start: { params: linearOnly(start), score: 0.9 } });
    expect(res.stopped).toBe('no-gain');
    expect(res.steps).toBe(6);
  });

  test('steps = 0 returns the start exactly, with no tensor work', async () => {
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const before = tf.memory().numTensors;
    const res = await trainGradientNet(X, start, opts(0), {}, { score: () => 0, every: 10, patience: 0, start: { params: linearOnly(start), score: 0.2 } });
    expect(res.steps).toBe(0);
    expect(Array.from(res.params.c)).toEqual(new Array(8).fill(0));
    expect(tf.memory().numTensors).toBe(before);
  });
});
