import * as tf from '@tensorflow/tfjs-core';
import { RemapError } from '../errors';
import type { FitContext } from '../map';
import { activateBackend } from './activate-backend';
import { exclusive, type BackendName } from './backend';
import { BatchSampler, gatherRows } from './batch-sampler';
import type { NetworkParams } from './network-params';
import { PlateauDetector } from './plateau';
import { Random } from './../stats/random';
import type { Objective } from './objective';
import type { TrainData } from './train-data';
import { Float64Network } from './float64-network';
import { TensorNetwork, paramsFromFlat } from './tensor-network';

/** Training settings, already validated (see settings.ts). */
export interface TrainOptions {
  readonly steps: number;
  readonly learningRate: number;
  /** Source rows per batch; 0 = every row. */
  readonly batch: number;
  readonly seed: number;
  readonly timeBudgetMs: number;
  readonly backend: BackendName;
  /** What each step minimises (regression onto a teacher map, or the Sinkhorn divergence to the target). */
  readonly objective: Objective;
}

/**
 * Keeping the best checkpoint: every `every` steps the current weights are
 * scored (lower is better, e.g. HeldoutScore on held-out rows) and the best are
 * kept; training returns the best, never simply the last. `start` is the
 * candidate to beat (e.g. the pure Gaussian map), so a run that only makes the
 * map worse returns `start` unchanged. With `patience` > 0, training also stops
 * (reason 'no-gain') after that many steps without a better score.
 */
export interface Checkpoints {
  readonly score: (p: NetworkParams) => number;
  readonly every: number;
  readonly patience: number;
  readonly start: { readonly params: NetworkParams; readonly score: number };
}

export type { TrainData };

export type StopReason = 'plateau' | 'no-gain' | 'steps' | 'time-budget';

export interface TrainResult {
  /** The kept weights: the best checkpoint when checkpoints are scored, else the last. */
  readonly params: NetworkParams;
  readonly steps: number;
  /** Step whose weights were kept (0 = the start given in Checkpoints, or `start` when none). */
  readonly keptStep: number;
  /** Score of the kept weights and of the start (NaN without checkpoints). */
  readonly keptScore: number;
  readonly startScore: number;
  /** Smoothed (moving-average) training loss at the kept step (NaN for the start) and at the end. */
  readonly keptLoss: number;
  readonly finalLoss: number;
  readonly stopped: StopReason;
  readonly elapsedMs: number;
  readonly backend: BackendName;
  /** Why wasm was not used, when it was asked for and failed to load. */
  readonly backendFallback: string | null;
}

/** How often progress is reported (steps and milliseconds, whichever comes first). */
const PROGRESS_EVERY_STEPS = 10;
const PROGRESS_EVERY_MS = 200;
/** Yield to the event loop this often, so a caller can set `signal.aborted`. */
const YIELD_EVERY_MS = 50;
/** Learning-rate cuts on plateaus before stopping (reduce-on-plateau, common practice). */
const LR_CUTS = 2;
const LR_CUT_FACTOR = 0.3;

/**
 * Trains a gradient network (Adam, Kingma & Ba, arXiv 1412.6980) on an
 * objective of its outputs: each step draws a source batch with our seeded
 * generator, maps it with the current weights in float64, asks the objective for
 * the loss and its gradient G with respect to the mapped points (regression onto
 * a teacher map, or the debiased Sinkhorn divergence to a target batch, whose
 * gradient needs only the final potentials by the envelope theorem); then tfjs
 * differentiates the surrogate sum_i <F(x_i), G_i> (same parameter gradient, by
 * the chain rule) and Adam updates the one weight variable. Stops at a
 * smoothed-loss plateau (after up to two learning-rate cuts), after `patience`
 * steps without a better checkpoint score, after `steps`, or when `timeBudgetMs`
 * is spent. With `checkpoints`, returns the best-scoring weights seen (or
 * `checkpoints.start` when none beat it), so it never ends worse than its start
 * by that score; steps = 0 returns the start at once, untouched (no float32
 * rounding). Deterministic: same data, start and seed give bit-identical weights
 * on the same backend. Every tensor block runs in tf.tidy; only the weight
 * variable and the optimiser's slots persist, and all are disposed before
 * returning (also on error or cancel).
 * Cost per step: the objective's (O(batch^2 (d + iterations)) for Sinkhorn) plus
 * O(batch * hidden * (d + layers)).
 * @throws RemapError(kind 'cancelled') when ctx.signal.aborted becomes true;
 *   RemapError(kind 'num') if the loss becomes non-finite.
 */
export function trainGradientNet(
  source: TrainData,
  start: NetworkParams,
  opts: TrainOptions,
  ctx: FitContext = {},
  checkpoints: Checkpoints | null = null,
): Promise<TrainResult> {
  return exclusive(() => train(source, start, opts, ctx, checkpoints));
}

async function train(source: TrainData, start: NetworkParams, opts: TrainOptions, ctx: FitContext, checkpoints: Checkpoints | null): Promise<TrainResult> {
  if (opts.steps === 0) {
    // Nothing to train: no backend, no tensors; the start is returned exactly (float64, no float32 rounding).
    const kept = checkpoints ? checkpoints.start : { params: start, score: NaN };
    ctx.onProgress?.({ step: 0, of: 0, loss: NaN, elapsedMs: 0, message: 'stopped: steps' });
    return {
      params: kept.params,
      steps: 0,
      keptStep: 0,
      keptScore: kept.score,
      startScore: kept.score,
      keptLoss: NaN,
      finalLoss: NaN,
      stopped: 'steps',
      elapsedMs: 0,
      backend: opts.backend,
      backendFallback: null,
    };
  }
  const { backend, fallback } = await activateBackend(opts.backend);
  const t0 = Date.now();
  const d = source.d;
  const rng = new Random(opts.seed ^ 0x5bd1e995);
  const sx = new BatchSampler(source.n, opts.batch > 0 ? opts.batch : source.n, source.weights, rng);
  const net = new TensorNetwork(start);
  const vars = [net.theta];
  let lr = opts.learningRate;
  let optimizer = tf.train.adam(lr);
  const fullX = sx.isFull ? sx.next() : null;
  const fullXTensor = fullX ? tf.tensor2d(gatherRows(source.data, d, fullX), [fullX.length, d]) : null;
  const plateau = new PlateauDetector();
  let cuts = 0;
  let step = 0;
  let stopped: StopReason = 'steps';
  let lastProgress = -Infinity;
  let lastYield = Date.now();
  let current: NetworkParams = net.toParams();
  let kept = checkpoints ? checkpoints.start : { params: current, score: NaN };
  let keptStep = 0;
  let keptLoss = NaN;
  let scoredStep = 0;
  const consider = (at: number): void => {
    if (!checkpoints || at === scoredStep) return;
    scoredStep = at;
    const score = checkpoints.score(current);
    if (score < kept.score) {
      kept = { params: current, score };
      keptStep = at;
      keptLoss = plateau.smoothed;
    }
  };
  const row = new Float64Array(d);
  const out = new Float64Array(d);
  try {
    for (; step < opts.steps; step++) {
      if (ctx.signal?.aborted) throw new RemapError(`fit (gradient-net): training was cancelled at step ${step} of ${opts.steps}.`, 'cancelled');
      if (Date.now() - t0 > opts.timeBudgetMs) {
        stopped = 'time-budget';
        break;
      }
      const ix = fullX ?? sx.next();
      // Mapped source batch in float64 with the current weights.
      const f64 = new Float64Network(current);
      const mapped = new Float64Array(ix.length * d);
      for (let b = 0; b < ix.length; b++) {
        for (let k = 0; k < d; k++) row[k] = source.data[ix[b] * d + k];
        f64.forward(row, out);
        mapped.set(out, b * d);
      }
      const { value, gradient } = opts.objective.evaluate(mapped, ix);
      if (!Number.isFinite(value)) {
        throw new RemapError(
          `fit (gradient-net): the training loss became ${value} at step ${step + 1}; lower learning_rate (now ${opts.learningRate}) or rescale the data.`,
          'num',
        );
      }
      tf.tidy(() => {
        const xb = fullXTensor ?? tf.tensor2d(gatherRows(source.data, d, ix), [ix.length, d]);
        const g = tf.tensor2d(Float32Array.from(gradient), [ix.length, d]);
        optimizer.minimize(() => tf.sum(tf.mul(net.apply(xb), g)) as tf.Scalar, false, vars);
      });
      current = paramsFromFlat(await net.theta.data(), d, start.hidden, start.layers);
      const plateaued = plateau.push(value);
      if (checkpoints && (step + 1) % checkpoints.every === 0) {
        consider(step + 1);
        if (checkpoints.patience > 0 && step + 1 - keptStep >= checkpoints.patience) {
          step++;
          stopped = 'no-gain';
          break;
        }
      }
      if (plateaued) {
        if (cuts >= LR_CUTS) {
          step++;
          stopped = 'plateau';
          break;
        }
        cuts++;
        lr *= LR_CUT_FACTOR;
        optimizer.dispose();
        optimizer = tf.train.adam(lr);
        plateau.reset();
      }
      const now = Date.now();
      if (ctx.onProgress && (step % PROGRESS_EVERY_STEPS === 0 || now - lastProgress >= PROGRESS_EVERY_MS)) {
        lastProgress = now;
        ctx.onProgress({ step: step + 1, of: opts.steps, loss: plateau.smoothed, elapsedMs: now - t0 });
      }
      if (now - lastYield >= YIELD_EVERY_MS) {
        await new Promise<void>((r) => setTimeout(r, 0));
        lastYield = Date.now();
      }
    }
    consider(step); // the last weights, when the run ended between checkpoints
    if (!checkpoints) {
      kept = { params: current, score: NaN };
      keptStep = step;
      keptLoss = plateau.smoothed;
    }
    const elapsedMs = Date.now() - t0;
    ctx.onProgress?.({ step, of: opts.steps, loss: plateau.smoothed, elapsedMs, message: `stopped: ${stopped}` });
    const startScore = checkpoints ? checkpoints.start.score : NaN;
    return {
      params: kept.params,
      steps: step,
      keptStep,
      keptScore: kept.score,
      startScore,
      keptLoss,
      finalLoss: plateau.smoothed,
      stopped,
      elapsedMs,
      backend,
      backendFallback: fallback,
    };
  } finally {
    optimizer.dispose();
    net.dispose();
    fullXTensor?.dispose();
  }
}
