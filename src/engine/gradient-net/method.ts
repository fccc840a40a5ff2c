import { sizeWarnings, type MapHeader } from '../base';
import type { FitContext, MapJSON, TransportMap } from '../map';
import type { MethodSpec } from '../method';
import type { Sample } from '../points';
import { settingsOf, type Settings } from '../settings';
import { fitRecordOf } from './fit-record';
import { GradientNetMap, type Frame } from './fitted-map';
import { gaussianLinearMap } from './gaussian-linear-map';
import { HeldoutScore } from './heldout-score';
import { holdoutSplit, pickRows } from './holdout';
import { initialParams, linearOnly } from './initial-params';
import { Random } from './../stats/random';
import { GRADIENT_NET_SETTINGS } from './settings';
import { standardise, standardiserOf } from './standardise';
import { trainGradientNet, type Checkpoints } from './train';

/** Sinkhorn iterations per training step (fixed; measured in bench/gradient-net.bench.ts). */
export const SINKHORN_ITERATIONS = 8;
/** Steps between held-out checkpoint scores, and steps without a better score before training stops. */
export const CHECK_EVERY = 10;
export const CHECK_PATIENCE = 400;

/**
 * Fits a gradient-net map: standardise both samples (centring plus one scale
 * each), compute the Gaussian linear map from all rows, hold out up to 20 % of
 * the rows of each sample (at most 1,000, seeded; holdout.ts), train the network
 * on the remaining rows by the debiased Sinkhorn divergence (train.ts), scoring
 * checkpoints by the energy distance of the held-out rows (heldout-score.ts),
 * and keep the best checkpoint. The pure Gaussian map (the linear method's map,
 * exactly) is checkpoint 0, so training never returns a map that scores worse on
 * the held-out rows; steps = 0 returns that map. Weights are copied to float64
 * and every tensor is disposed. Cost: O(steps * batch^2 * (d + 8)) for training,
 * O(steps / 10 * 1000^2 d) for the checkpoint scores, plus O(n hidden d^2) for
 * the fit record.
 * @throws RemapError (kind 'cancelled') when ctx.signal is aborted; (kind 'num') if training diverges.
 * @example await fitGradientNet(sample(xRows), sample(yRows), settings, {}) // a GradientNetMap
 */
export async function fitGradientNet(source: Sample, target: Sample, settings: Settings, ctx: FitContext = {}): Promise<GradientNetMap> {
  const d = source.d;
  const own = settingsOf(GRADIENT_NET_SETTINGS, settings, 'gradient-net');
  const { hidden, layers, steps, seed } = own;
  const blur = own.blur > 0 ? own.blur : autoBlur(d);
  const timeBudget = own.time_budget;
  const ss = standardiserOf(source);
  const ts = standardiserOf(target);
  const xs = standardise(source.data, d, ss);
  const ys = standardise(target.data, d, ts);
  const linear = gaussianLinearMap({ n: source.n, d, data: xs }, source.weights, { n: target.n, d, data: ys }, target.weights);
  const start = initialParams(d, hidden, layers, linear, new Random(seed));
  const gaussian = linearOnly(start);
  const splitRng = new Random(seed ^ 0x2f6b3c1d);
  const sSplit = holdoutSplit(source.n, source.weights, splitRng);
  const tSplit = holdoutSplit(target.n, target.weights, splitRng);
  const allX = { n: source.n, d, data: xs, weights: source.weights };
  const allY = { n: target.n, d, data: ys, weights: target.weights };
  // Without a split (small samples) training and the checkpoint scores both use all rows.
  const held = sSplit.held.length > 0 && tSplit.held.length > 0;
  const judge = held
    ? new HeldoutScore(pickRows(xs, source.weights, d, sSplit.held), pickRows(ys, target.weights, d, tSplit.held))
    : new HeldoutScore(allX, allY);
  const checkpoints: Checkpoints = { score: (p) => judge.of(p), every: CHECK_EVERY, patience: CHECK_PATIENCE, start: { params: gaussian, score: judge.of(gaussian) } };
  const result = await trainGradientNet(
    held ? pickRows(xs, source.weights, d, sSplit.train) : allX,
    held ? pickRows(ys, target.weights, d, tSplit.train) : allY,
    start,
    {
      steps,
      learningRate: own.learning_rate,
      batch: own.batch,
      seed,
      timeBudgetMs: timeBudget * 1000,
      backend: own.backend,
      blur,
      sinkhornIterations: SINKHORN_ITERATIONS,
    },
    ctx,
    checkpoints,
  );
  const header: MapHeader = {
    method: 'gradient-net',
    d,
    settings,
    columns: ctx.columns ?? null,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  const sf = frameOf(source, ss.mean, ss.scale);
  const tf = frameOf(target, ts.mean, ts.scale);
  const fitted = fitRecordOf(source, target, result.params, sf, tf, result, { steps, timeBudget, blur }, sizeWarnings(header));
  return new GradientNetMap(header, fitted, result.params, sf, tf);
}

/**
 * The default Sinkhorn blur in standardised units, sqrt(d / 2) (eps = d / 2, a
 * quarter of the mean squared distance 2d between two standardised rows).
 * Measured with converged Sinkhorn potentials (bench/accuracy.bench.ts, n = 4,000,
 * 60 s): at d = 8 blur 1 chased the batches' sampling noise (L2-UVP worse than the
 * linear map), blur 4 (the earlier d / 2) barely moved from the linear map
 * (8.1 %), blur 2 reached 4.3 %; at d = 2 blur 1 gave 0.4 %; on the scenario demo
 * data (d = 3) blur 0.75 made the map worse and 1.5 better.
 */
export function autoBlur(d: number): number {
  return Math.sqrt(d / 2);
}

function frameOf(s: Sample, mean: Float64Array, scale: number): Frame {
  const lo = new Float64Array(s.d).fill(Infinity);
  const hi = new Float64Array(s.d).fill(-Infinity);
  for (let i = 0; i < s.n; i++) {
    if (s.weights && s.weights[i] === 0) continue;
    for (let k = 0; k < s.d; k++) {
      const v = s.data[i * s.d + k];
      if (v < lo[k]) lo[k] = v;
      if (v > hi[k]) hi[k] = v;
    }
  }
  return { mean, scale, lo, hi };
}

/**
 * The gradient-net method: a neural transport map that is the gradient of a
 * convex function by construction (closed-form input convex gradient network,
 * arXiv 2111.12187, or cascaded monotone gradient network, arXiv 2301.10862),
 * trained with tfjs from unpaired samples; the fitted map is plain float64.
 */
export const gradientNetMethod: MethodSpec = {
  name: 'gradient-net',
  summary: 'Neural map that is the gradient of a convex function (monotone by construction), trained on the Sinkhorn divergence; any number of columns.',
  shape: 'joint',
  settings: GRADIENT_NET_SETTINGS,
  background: true,
  minRows: (d: number) => Math.max(10, d + 2),
  weights: true,
  fit: (source: Sample, target: Sample, settings: Settings, ctx: FitContext): Promise<TransportMap> => fitGradientNet(source, target, settings, ctx),
  fromJSON: (json: MapJSON): TransportMap => GradientNetMap.fromJSON(json),
};
