import { sizeWarnings, type MapHeader } from '../base';
import type { FitContext, MapJSON, TransportMap } from '../map';
import type { MethodSpec } from '../method';
import type { Sample } from '../points';
import { settingsOf, type Settings } from '../settings';
import { pooledColumnScales } from '../stats/column-scales';
import { Random } from '../stats/random';
import { entropicTeacher, TEACHER_ROWS, type Teacher } from './entropic-teacher';
import { fitRecordOf, type FitStory } from './fit-record';
import { GradientNetMap, type Frame } from './fitted-map';
import { gaussianLinearMap } from './gaussian-linear-map';
import { HeldoutScore } from './heldout-score';
import { holdoutSplit, pickRows } from './holdout';
import { initialParams, linearOnly } from './initial-params';
import type { NetworkParams } from './network-params';
import { RegressionObjective } from './regression-objective';
import { GRADIENT_NET_SETTINGS } from './settings';
import { SinkhornObjective } from './sinkhorn-objective';
import { TeacherScore } from './teacher-score';
import { standardise, standardiserOf } from './standardise';
import type { Checkpoints, TrainResult } from './train';
import type { TrainData } from './train-data';

/** Steps between held-out checkpoint scores, and steps without a better score before training stops. */
export const CHECK_EVERY = 10;
export const CHECK_PATIENCE = 400;
/** The regression onto the teacher uses at most this many training rows (seeded subset). */
export const REGRESSION_ROWS = 20_000;

/** Choices made on the tuning half of the bench zoo; the method uses DEFAULT_TUNING, benches may vary it. */
export interface Tuning {
  /** Share of `steps` spent on regression onto the teacher (the rest refines on the Sinkhorn divergence). */
  readonly regressionShare: number;
  readonly regressionLearningRate: number;
  /**
   * Refinement on the Sinkhorn divergence after the regression (false: regression only). Off: on the
   * tune half of the zoo (d = 8, 20 s) no refinement checkpoint was kept over the regression's, and
   * its time was better spent on regression steps.
   */
  readonly refine: boolean;
  readonly refineLearningRate: number;
  /** eps of the refinement's Sinkhorn divergence for the cost |x - y|^2, as a multiple of the teacher's eps. */
  readonly refineEpsFactor: number;
  /** The automatic smoothing: this factor times mean column variance times n^(-2/(d+4)) (see autoSmoothing). */
  readonly smoothingFactor: number;
  /** Bench only: keep the last weights instead of the best held-out checkpoint (to see what the judge sees). */
  readonly keepLast?: boolean;
}

export const DEFAULT_TUNING: Tuning = {
  regressionShare: 1,
  regressionLearningRate: 0.01,
  refine: false,
  refineLearningRate: 0.002,
  refineEpsFactor: 2,
  smoothingFactor: 0.125,
};

/**
 * Fits a gradient-net map:
 *  1. standardise both samples (standardise.ts: centring, the pooled per-column
 *     spreads with units = standardised, one size factor per side);
 *  2. the Gaussian linear map from all rows is the network's linear part at the
 *     start and the candidate to beat (the linear method's map, exactly);
 *  3. hold out up to 20 % of the rows of each sample (at most 1,000, seeded;
 *     holdout.ts) to score checkpoints by the energy distance of the held-out
 *     rows (heldout-score.ts), keeping the best;
 *  4. start = entropic (default): fit the entropic map to at most 4,000 training
 *     rows per side (entropic-teacher.ts) and fit the network to it by regression
 *     on source batches from all training rows (amortisation: the network costs
 *     O(hidden d) per row to apply where the teacher costs O(4,000 d)); start =
 *     gaussian: train on the debiased Sinkhorn divergence from the Gaussian start.
 * The result is the best checkpoint, never worse on the held-out rows than the
 * Gaussian map, which is returned (with a warning) when nothing beat it; steps =
 * 0 returns that map without loading TensorFlow.js. Every tensor is disposed.
 * Cost: the teacher's entropic fit, O(steps * batch * (teacher rows + hidden) * d)
 * for the regression, O(steps / 10 * 1000^2 d) for the checkpoint scores, plus
 * O(n hidden d^2) for the fit record. The whole fit stops at time_budget.
 * @throws RemapError (kind 'cancelled') when ctx.signal is aborted; (kind 'num') if training diverges.
 * @example await fitGradientNet(sample(xRows), sample(yRows), settings, {}) // a GradientNetMap
 */
export async function fitGradientNet(
  source: Sample,
  target: Sample,
  settings: Settings,
  ctx: FitContext = {},
  tuning: Tuning = DEFAULT_TUNING,
): Promise<GradientNetMap> {
  const t0 = Date.now();
  const d = source.d;
  const own = settingsOf(GRADIENT_NET_SETTINGS, settings, 'gradient-net');
  const { layers, steps, seed } = own;
  const hidden = own.hidden > 0 ? own.hidden : autoHidden(d);
  const budgetMs = own.time_budget * 1000;
  const columnScales = own.units === 'raw' ? new Float64Array(d).fill(1) : pooledColumnScales(source, target);
  const ss = standardiserOf(source, columnScales);
  const ts = standardiserOf(target, columnScales);
  const xs = standardise(source.data, d, ss);
  const ys = standardise(target.data, d, ts);
  const linear = gaussianLinearMap({ n: source.n, d, data: xs }, source.weights, { n: target.n, d, data: ys }, target.weights);
  const start = initialParams(d, hidden, layers, linear, new Random(seed));
  const gaussian = linearOnly(start);
  const splitRng = new Random(seed ^ 0x2f6b3c1d);
  const sSplit = holdoutSplit(source.n, source.weights, splitRng);
  const tSplit = holdoutSplit(target.n, target.weights, splitRng);
  const allX: TrainData = { n: source.n, d, data: xs, weights: source.weights };
  const allY: TrainData = { n: target.n, d, data: ys, weights: target.weights };
  // Without a split (small samples) training and the checkpoint scores both use all rows.
  const held = sSplit.held.length > 0 && tSplit.held.length > 0;
  const judge = held
    ? new HeldoutScore(pickRows(xs, source.weights, d, sSplit.held), pickRows(ys, target.weights, d, tSplit.held))
    : new HeldoutScore(allX, allY);
  const trainX = held ? pickRows(xs, source.weights, d, sSplit.train) : allX;
  const trainY = held ? pickRows(ys, target.weights, d, tSplit.train) : allY;
  const heldX = held ? pickRows(xs, source.weights, d, sSplit.held) : allX;
  const story: FitStory = { steps, timeBudget: own.time_budget, start: own.start, teacher: null, phases: [], startScore: NaN, judge: '' };
  let params: NetworkParams = gaussian;
  if (steps === 0) {
    story.startScore = judge.of(gaussian);
    story.judge = 'held-out energy distance';
  } else {
    // TensorFlow.js is loaded here, when a fit first trains, and not by the rest of the engine.
    const { trainGradientNet } = await import('./train');
    const left = (): number => budgetMs - (Date.now() - t0);
    let kept: { params: NetworkParams; score: number } = { params: gaussian, score: NaN };
    let done = 0;
    let scoreOf: (p: NetworkParams) => number = (p) => judge.of(p);
    const run = async (
      name: string,
      rows: TrainData,
      objective: SinkhornObjective | RegressionObjective,
      count: number,
      lr: number,
      from: NetworkParams,
    ): Promise<TrainResult> => {
      let tick = 0;
      const score = tuning.keepLast ? () => -++tick : scoreOf;
      const checkpoints: Checkpoints = {
        score,
        every: CHECK_EVERY,
        patience: CHECK_PATIENCE,
        start: tuning.keepLast ? { params: kept.params, score: 0 } : kept,
      };
      const offset = done;
      const phaseCtx: FitContext = { ...ctx, onProgress: ctx.onProgress ? (p) => ctx.onProgress!({ ...p, step: p.step + offset, of: steps }) : undefined };
      const opts = {
        steps: count,
        learningRate: lr,
        batch: own.batch,
        seed: seed + story.phases.length,
        timeBudgetMs: Math.max(0, left()),
        backend: own.backend,
        objective,
      };
      const r = await trainGradientNet(rows, from, opts, phaseCtx, checkpoints);
      story.phases.push({ name, objective: objective.describe, result: r, stepOffset: offset });
      done += r.steps;
      kept = { params: r.params, score: r.keptScore };
      return r;
    };
    if (own.start === 'entropic') {
      const smoothing = own.smoothing > 0 ? own.smoothing : autoSmoothing(trainX, allY, tuning.smoothingFactor);
      // The target's held-out rows only serve the energy-distance judge, which this path does not use: the teacher sees every target row.
      const teacher: Teacher = entropicTeacher(trainX, allY, smoothing, new Random(seed ^ 0x51ed270b), ctx);
      story.teacher = teacher;
      const judgeByTeacher = new TeacherScore(heldX, teacher.at(heldX));
      scoreOf = (p) => judgeByTeacher.of(p);
      kept = { params: gaussian, score: scoreOf(gaussian) };
      story.startScore = kept.score;
      story.judge = 'held-out mean squared distance to the teacher map';
      const reg = regressionRows(teacher, trainX, new Random(seed ^ 0x6a09e667));
      const count = Math.max(1, Math.round(steps * tuning.regressionShare));
      const r = await run('regression onto the entropic map', reg.rows, new RegressionObjective(reg.targetsOf), count, tuning.regressionLearningRate, start);
      if (tuning.refine && done < steps && left() > 0 && r.stopped !== 'time-budget') {
        const eps = 2 * teacher.eps * tuning.refineEpsFactor;
        await run(
          'refinement on the Sinkhorn divergence',
          trainX,
          new SinkhornObjective(trainY, own.batch, eps, seed ^ 0x3c6ef372),
          steps - done,
          tuning.refineLearningRate,
          kept.params,
        );
      }
    } else {
      kept = { params: gaussian, score: scoreOf(gaussian) };
      story.startScore = kept.score;
      story.judge = 'held-out energy distance';
      const eps = own.smoothing > 0 ? 2 * own.smoothing : gaussianStartEps(d);
      await run(
        'Sinkhorn divergence from the Gaussian start',
        trainX,
        new SinkhornObjective(trainY, own.batch, eps, seed ^ 0x3c6ef372),
        steps,
        own.learning_rate,
        start,
      );
    }
    params = kept.params;
  }
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
  const fitted = fitRecordOf(source, target, params, sf, tf, story, sizeWarnings(header));
  const map = new GradientNetMap(header, fitted, params, sf, tf);
  map.attachSamples(source, target); // energy distance and KS on demand, as for every method (assess.ts)
  return map;
}

/**
 * The rows the regression trains on and the teacher's map at them: every
 * training row up to REGRESSION_ROWS, else a seeded subset of that many (the
 * teacher costs O(4,000 d) per row, and 20,000 rows are plenty for a network
 * of a few thousand weights). O(rows * teacher rows * d).
 */
function regressionRows(teacher: Teacher, x: TrainData, rng: Random): { rows: TrainData; targetsOf: (idx: Uint32Array) => Float64Array } {
  const d = x.d;
  const rows = x.n > REGRESSION_ROWS ? pickRows(x.data, x.weights, d, Uint32Array.from(rng.choose(x.n, REGRESSION_ROWS))) : x;
  const all = teacher.at({ n: rows.n, d, data: rows.data });
  const targetsOf = (idx: Uint32Array): Float64Array => {
    const out = new Float64Array(idx.length * d);
    for (let b = 0; b < idx.length; b++) for (let k = 0; k < d; k++) out[b * d + k] = all[idx[b] * d + k];
    return out;
  };
  return { rows, targetsOf };
}

/**
 * The automatic width, max(64, 12 d): chosen on the tuning half of the bench
 * zoo at d = 8 (n = 4,000, 20 s), where 96 units gave L2-UVP 1.59-2.10 % against
 * 1.65-2.28 % for 64, while applying the map costs O(hidden d) per row, so
 * narrower nets are kept where they suffice (d <= 5). O(1).
 * @example autoHidden(8) // 96
 */
export function autoHidden(d: number): number {
  return Math.max(64, 12 * d);
}

/**
 * The automatic smoothing (epsilon of the teacher, cost |x - y|^2 / 2):
 * factor * V * n^(-2 / (d + 4)), V the mean column variance of the two
 * standardised samples (about 1), n the smaller of the row counts the teacher
 * uses (at most TEACHER_ROWS). The n^(-2/(d+4)) rate is the kernel-smoothing
 * rate for a squared bandwidth (as the entropic method's rule, entropic/default-eps.ts).
 * The factor was chosen on the tuning half of the bench zoo: the network's
 * regression averages the teacher's noise, so it prefers a less smoothed, less
 * biased teacher than the entropic method on its own. O((n + m) d).
 */
export function autoSmoothing(x: TrainData, y: TrainData, factor: number): number {
  const d = x.d;
  const v = (meanColumnVariance(x) + meanColumnVariance(y)) / 2;
  const n = Math.min(x.n, y.n, TEACHER_ROWS);
  const eps = factor * v * Math.pow(n, -2 / (d + 4));
  return eps > 0 && Number.isFinite(eps) ? eps : 1e-3;
}

function meanColumnVariance(p: TrainData): number {
  const { n, d, data, weights } = p;
  let total = 0;
  const mean = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    total += w;
    for (let k = 0; k < d; k++) mean[k] += w * data[i * d + k];
  }
  let s = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    for (let k = 0; k < d; k++) s += w * (data[i * d + k] - mean[k] / total) ** 2;
  }
  return s / total / d;
}

/**
 * eps for the cost |x - y|^2 when training from the Gaussian start on the
 * Sinkhorn divergence alone (start = gaussian): d / 2 in standardised units.
 * Measured with converged Sinkhorn potentials (n = 4,000, 60 s): at d = 8 eps 1
 * chased the batches' sampling noise, eps 16 barely moved from the linear map,
 * eps 4 was best; at d = 2 eps 1 was best.
 */
export function gaussianStartEps(d: number): number {
  return d / 2;
}

function frameOf(s: Sample, mean: Float64Array, scale: Float64Array): Frame {
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
  summary:
    'Neural map that is the gradient of a convex function (monotone by construction), fitted to the entropic map and kept at its best held-out checkpoint; fast to apply to many rows; any number of columns.',
  shape: 'joint',
  settings: GRADIENT_NET_SETTINGS,
  background: true,
  minRows: (d: number) => Math.max(10, d + 2),
  weights: true,
  fit: (source: Sample, target: Sample, settings: Settings, ctx: FitContext): Promise<TransportMap> => fitGradientNet(source, target, settings, ctx),
  fromJSON: (json: MapJSON): TransportMap => GradientNetMap.fromJSON(json),
};
