import * as tf from '@tensorflow/tfjs';
import { initialParams, linearOnly } from '../../../src/engine/gradient-net/initial-params';
import type { NetworkParams } from '../../../src/engine/gradient-net/network-params';
import { Random } from '../../../src/engine/stats/random';
import { trainGradientNet } from '../../../src/engine/gradient-net/train';

const r = new Random(1);
const X = { n: 80, d: 2, data: Float64Array.from({ length: 160 }, () => r.normal()), weights: null };
const Y = { n: 80, d: 2, data: Float64Array.from({ length: 160 }, () => 1 + 2 * r.normal()), weights: null };
const OPTS = { steps: 15, learningRate: 0.01, batch: 0, seed: 1, timeBudgetMs: 30000, backend: 'wasm' as const, blur: 1, sinkhornIterations: 6 };

describe('trainGradientNet', () => {
  test('lowers the Sinkhorn divergence from a poor start, deterministically, leaving no tensors', async () => {
    await tf.setBackend('wasm');
    const before = tf.memory().numTensors;
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const losses: number[] = [];
    const a = await trainGradientNet(X, Y, start, { ...OPTS, steps: 20, learningRate: 0.05 }, { onProgress: (p) => losses.push(p.loss) });
    const b = await trainGradientNet(X, Y, start, { ...OPTS, steps: 20, learningRate: 0.05 });
    expect(tf.memory().numTensors).toBe(before);
    expect(Array.from(a.params.w)).toEqual(Array.from(b.params.w));
    expect(losses[losses.length - 1]).toBeLessThan(losses[0]);
    expect(a.stopped).toBe('steps');
    expect(a.backend).toBe('wasm');
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
    const r = await trainGradientNet(X, Y, start, { ...OPTS, steps: 12 }, {}, { score, every: 3, patience: 0, start: { params: gaussian, score: 0.9 } });
    expect(seen.length).toBe(4);
    expect(r.keptStep).toBe(6);
    expect(r.keptScore).toBe(0.5);
    expect(r.params).toBe(seen[1]);
    const worse = await trainGradientNet(X, Y, start, { ...OPTS, steps: 6 }, {}, { score: () => 1, every: 3, patience: 0, start: { params: gaussian, score: 0.9 } });
    expect(worse.keptStep).toBe(0);
    expect(worse.params).toBe(gaussian); // Source: the brief -- training never ends worse than its start
  });

  test('stops with no-gain after `patience` steps without a better checkpoint', async () => {
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const r = await trainGradientNet(X, Y, start, { ...OPTS, steps: 1000 }, {}, { score: () => 1, every: 2, patience: 6, start: { params: linearOnly(start), score: 0.9 } });
    expect(r.stopped).toBe('no-gain');
    expect(r.steps).toBe(6);
  });

  test('steps = 0 returns the start exactly, with no tensor work', async () => {
    const start = initialParams(2, 8, 1, Float64Array.of(1, 0, 0, 1), new Random(2));
    const before = tf.memory().numTensors;
    const r = await trainGradientNet(X, Y, start, { ...OPTS, steps: 0 }, {}, { score: () => 0, every: 10, patience: 0, start: { params: linearOnly(start), score: 0.2 } });
    expect(r.steps).toBe(0);
    expect(Array.from(r.params.c)).toEqual(new Array(8).fill(0));
    expect(tf.memory().numTensors).toBe(before);
  });
});
