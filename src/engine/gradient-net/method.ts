import { sizeWarnings, type MapHeader } from '../base';
import type { FitContext, MapJSON, TransportMap } from '../map';
import type { MethodSpec } from '../method';
import type { Sample } from '../points';
import type { Settings } from '../settings';
import type { BackendName } from './backend';
import { fitRecordOf } from './fit-record';
import { GradientNetMap, type Frame } from './fitted-map';
import { gaussianLinearMap } from './gaussian-linear-map';
import { initialParams } from './initial-params';
import { Random } from './../stats/random';
import { GRADIENT_NET_SETTINGS } from './settings';
import { standardise, standardiserOf } from './standardise';
import { trainGradientNet } from './train';

/** Sinkhorn iterations per training step (fixed; measured in bench/gradient-net.bench.ts). */
export const SINKHORN_ITERATIONS = 8;

/**
 * Fits a gradient-net map: standardise both samples (centring plus one scale
 * each), warm-start at the Gaussian linear map, train the network on the
 * debiased Sinkhorn divergence (train.ts), copy the weights to float64 and
 * dispose every tensor. Cost: O(steps * batch^2 * (d + 8)) for training plus
 * O(n hidden d^2) for the fit record.
 * @throws RemapError (kind 'cancelled') when ctx.signal is aborted; (kind 'num') if training diverges.
 * @example await fitGradientNet(sample(xRows), sample(yRows), settings, {}) // a GradientNetMap
 */
export async function fitGradientNet(source: Sample, target: Sample, settings: Settings, ctx: FitContext = {}): Promise<GradientNetMap> {
  const d = source.d;
  const hidden = Number(settings.hidden);
  const layers = Number(settings.layers);
  const steps = Number(settings.steps);
  const seed = Number(settings.seed);
  const blur = Number(settings.blur) > 0 ? Number(settings.blur) : autoBlur(d);
  const timeBudget = Number(settings.time_budget);
  const ss = standardiserOf(source);
  const ts = standardiserOf(target);
  const xs = standardise(source.data, d, ss);
  const ys = standardise(target.data, d, ts);
  const linear = gaussianLinearMap({ n: source.n, d, data: xs }, source.weights, { n: target.n, d, data: ys }, target.weights);
  const start = initialParams(d, hidden, layers, linear, new Random(seed));
  const result = await trainGradientNet(
    { n: source.n, d, data: xs, weights: source.weights },
    { n: target.n, d, data: ys, weights: target.weights },
    start,
    {
      steps,
      learningRate: Number(settings.learning_rate),
      batch: Number(settings.batch),
      seed,
      timeBudgetMs: timeBudget * 1000,
      backend: settings.backend as BackendName,
      blur,
      sinkhornIterations: SINKHORN_ITERATIONS,
    },
    ctx,
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
 * The default Sinkhorn blur in standardised units, d / 2. Measured (bench, n = 4,000):
 * small blurs chase the sampling noise of the batches, which grows with d (the
 * minibatch divergence between two samples of one law decays like n^(-2/d)); a
 * blur near d / 2 gave the lowest map error at d = 2 and d = 8 (at d = 2 any blur in
 * 0.3 .. 1 did as well).
 */
export function autoBlur(d: number): number {
  return d / 2;
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
