import * as tf from '@tensorflow/tfjs';
import { initialParams } from '../../../src/engine/gradient-net/initial-params';
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
    const a = await trainGradientNet(X, Y, start, { ...OPTS, steps: 40, learningRate: 0.05 }, { onProgress: (p) => losses.push(p.loss) });
    const b = await trainGradientNet(X, Y, start, { ...OPTS, steps: 40, learningRate: 0.05 });
    expect(tf.memory().numTensors).toBe(before);
    expect(Array.from(a.params.w)).toEqual(Array.from(b.params.w));
    expect(losses[losses.length - 1]).toBeLessThan(losses[0]);
    expect(a.stopped).toBe('steps');
    expect(a.backend).toBe('wasm');
  });
});
