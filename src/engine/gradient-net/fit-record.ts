import type { CostReport, Convergence, FitRecord, Warning } from '../map';
import type { Points, Sample } from '../points';
import { gaussianW2Squared } from '../linear/bures';
import { weightedMoments } from '../stats/moments';
import { Random } from '../stats/random';
import { smallestEigenvalue } from '../stats/smallest-eigenvalue';
import { batchSinkhorn } from './batch-sinkhorn';
import type { Teacher } from './entropic-teacher';
import type { Frame } from './fitted-map';
import { Float64Network } from './float64-network';
import type { NetworkParams } from './network-params';
import type { TrainResult } from './train';

/** How a fit went, phase by phase, for the fit record. */
export interface FitStory {
  readonly steps: number;
  readonly timeBudget: number;
  readonly start: string;
  /** The entropic teacher, when the network was first fitted to it. */
  teacher: Teacher | null;
  readonly phases: { readonly name: string; readonly objective: string; readonly result: TrainResult; readonly stepOffset: number }[];
  /** Held-out score (see `judge`) of the Gaussian (linear) map, the candidate every checkpoint must beat. */
  startScore: number;
  /** What the checkpoint score measures, in words. */
  judge: string;
}

/** Rows per side, and eps (for the cost |x - y|^2 on data divided by one overall spread), of the remaining-distance estimate. */
export const REMAINING_ROWS = 400;
export const REMAINING_EPS = 0.05;

/** The Jacobian certificate is checked on at most this many source rows (a seeded subsample past it). */
export const JACOBIAN_ROWS = 20_000;

/**
 * What a gradient-net fit records: the cost (costOf below, from the mapped
 * source rows T(x_i) in float64, no clamping); the smallest eigenvalue of the
 * network's Jacobian J_F over the source rows (at most 20,000, seeded;
 * symmetric, at least alpha > 0 by construction, and the map's Jacobian is
 * similar to it, standardise.ts, so the certificate is read in standardised
 * units); the convergence of the RETURNED weights (the best checkpoint: its
 * step, its training loss and held-out score); and warnings, among them
 * 'kept-linear-start' when no checkpoint beat the Gaussian map. Energy distance
 * and KS are left to the shared lazy comparison of every map (BaseMap,
 * assess.ts), so they are measured on the same rows as every other method.
 * Cost O(n hidden d + min(n, 20000) (hidden d^2 + d^3) + 400^2 (d + 60)).
 */
export function fitRecordOf(
  source: Sample,
  target: Sample,
  params: NetworkParams,
  sf: Frame,
  tf: Frame,
  story: FitStory,
  baseWarnings: readonly Warning[],
): FitRecord {
  const { n, d, data, weights } = source;
  const net = new Float64Network(params);
  const mapped = new Float64Array(n * d);
  const row = new Float64Array(d);
  const f = new Float64Array(d);
  const jac = new Float64Array(d * d);
  let total = 0;
  let moved = 0;
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < d; k++) row[k] = (data[i * d + k] - sf.mean[k]) / sf.scale[k];
    net.forward(row, f);
    let s = 0;
    for (let k = 0; k < d; k++) {
      const y = tf.mean[k] + tf.scale[k] * f[k];
      mapped[i * d + k] = y;
      s += (y - data[i * d + k]) ** 2;
    }
    const w = weights ? weights[i] : 1;
    total += w;
    moved += w * s;
  }
  let minEig = Infinity;
  const rows = n > JACOBIAN_ROWS ? new Random(0x1b873593).choose(n, JACOBIAN_ROWS) : null;
  for (let r = 0; r < (rows ? rows.length : n); r++) {
    const i = rows ? rows[r] : r;
    for (let k = 0; k < d; k++) row[k] = (data[i * d + k] - sf.mean[k]) / sf.scale[k];
    net.jacobian(row, jac);
    minEig = Math.min(minEig, smallestEigenvalue(jac, d));
  }
  // The map's Jacobian is (s_t / s_s) D J_F D^-1 (standardise.ts): the eigenvalues of (s_t / s_s) J_F.
  minEig *= tf.scale[0] / sf.scale[0];
  const cost = costOf(source, target, { n, d, data: mapped }, moved / total);
  return { cost, minJacobianEigenvalue: minEig, convergence: convergenceOf(story), warnings: [...baseWarnings, ...warningsOf(story)] };
}

/**
 * The cost: the mean squared displacement D = E|T(x) - x|^2 over the weighted
 * source rows, in the data's units (kind 'mapped'). T is the gradient of a convex
 * function, so D is the squared W2 between the source and the MAPPED source, not
 * the target; an under-trained map moves the source too little and makes D small.
 * So the note also gives: r^2, an estimate of the squared W2 still left between
 * the mapped source and the target (the debiased Sinkhorn divergence, Feydy et
 * al. 2019, arXiv 1810.08278, on 400 seeded rows per side, batch-sinkhorn.ts);
 * the interval [(sqrt D - r)^2, (sqrt D + r)^2] that holds the squared W2 from
 * the source to the target by the triangle inequality of W2; and the Gaussian
 * lower bound G = |m1 - m2|^2 + Bures(S1, S2) (Gelbrich 1990), saying so when D < G.
 * O(400^2 (d + 60) + (n + m) d^2 + d^3).
 */
export function costOf(source: Sample, target: Sample, mapped: Points, displacement: number): CostReport {
  const d = source.d;
  const ms = weightedMoments(source, source.weights);
  const mt = weightedMoments(target, target.weights);
  let gelbrich = NaN;
  try {
    gelbrich = gaussianW2Squared(ms.mean, ms.cov, mt.mean, mt.cov);
  } catch {
    gelbrich = NaN; // singular covariances: no bound quoted
  }
  const r2 = remainingDistance(mapped, source.weights, target, mt.cov, ms.cov, d);
  const r = Math.sqrt(Math.max(0, r2));
  const root = Math.sqrt(displacement);
  const lower = Math.max((root - r) ** 2, Number.isFinite(gelbrich) ? gelbrich : 0);
  const upper = (root + r) ** 2;
  const below = Number.isFinite(gelbrich) && displacement < gelbrich;
  return {
    kind: 'mapped',
    w2Squared: displacement,
    w2: root,
    note:
      'Mean squared displacement |T(x) - x|^2 over the weighted source rows (data units): ' +
      'the squared W2 from the source to the mapped source, not to the target. ' +
      `The mapped source is still about ${fmt(r2)} (squared W2, debiased Sinkhorn estimate on ${REMAINING_ROWS} rows per side) from the target, ` +
      `so the squared W2 from source to target lies in about [${fmt(lower)}, ${fmt(upper)}]` +
      (Number.isFinite(gelbrich) ? `; the Gaussian lower bound from means and covariances (Gelbrich) is ${fmt(gelbrich)}` : '') +
      (below ? ', above this figure: the map has not carried the source all the way to the target.' : '.'),
  };
}

/** The debiased Sinkhorn divergence between seeded subsamples of the mapped source and the target, in data units. */
function remainingDistance(
  mapped: Points,
  mappedWeights: Float64Array | null,
  target: Sample,
  covT: ArrayLike<number>,
  covS: ArrayLike<number>,
  d: number,
): number {
  let v = 0;
  for (let k = 0; k < d; k++) v += (covT[k * d + k] + covS[k * d + k]) / 2;
  const scale = Math.sqrt(v / d) || 1;
  const rng = new Random(0x7f4a7c15);
  const a = draw(mapped, mappedWeights, rng, scale);
  const b = draw(target, target.weights, rng, scale);
  let diameter2 = 0;
  for (const p of [a, b]) {
    for (let i = 0; i < p.n; i++) {
      let s = 0;
      for (let k = 0; k < d; k++) s += p.data[i * d + k] ** 2;
      diameter2 = Math.max(diameter2, 4 * s);
    }
  }
  const r = batchSinkhorn(a.data, a.n, b.data, b.n, d, { blur: Math.sqrt(REMAINING_EPS), diameter2, iterations: 12, tolerance: 1e-2, maxIterations: 100 });
  return Math.max(0, r.value) * scale * scale;
}

/** REMAINING_ROWS rows drawn by weight (with replacement when weighted), centred on the pooled... divided by `scale`. */
function draw(p: Points, weights: Float64Array | null, rng: Random, scale: number): Points {
  const d = p.d;
  const k = Math.min(REMAINING_ROWS, p.n);
  let idx: ArrayLike<number>;
  if (weights) {
    const c = new Float64Array(p.n);
    let s = 0;
    for (let i = 0; i < p.n; i++) c[i] = s += weights[i];
    idx = Int32Array.from({ length: k }, () => {
      const u = rng.uniform() * s;
      let lo = 0;
      let hi = p.n - 1;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (c[mid] > u) hi = mid;
        else lo = mid + 1;
      }
      return lo;
    });
  } else idx = rng.choose(p.n, k);
  const data = new Float64Array(k * d);
  for (let r = 0; r < k; r++) for (let j = 0; j < d; j++) data[r * d + j] = p.data[idx[r] * d + j] / scale;
  return { n: k, d, data };
}

/**
 * The convergence of the RETURNED map: iterations = the step whose weights were
 * kept (0 for the Gaussian start), finalError = their held-out score (story.judge;
 * always finite, so the record survives JSON), converged only when training
 * stopped by itself (plateau or no further gain) after beating the start.
 */
function convergenceOf(story: FitStory): Convergence {
  const ph = story.phases;
  const teacher = story.teacher
    ? `the entropic teacher (eps ${fmt(story.teacher.eps)} for |x - y|^2 / 2, ${story.teacher.rows.source} x ${story.teacher.rows.target} rows, ` +
      `${story.teacher.iterations} Sinkhorn iterations${story.teacher.converged ? '' : ', not converged'}); `
    : '';
  const start = Number.isFinite(story.startScore) ? story.startScore : 0;
  if (ph.length === 0) {
    return {
      iterations: 0,
      finalError: start,
      converged: false,
      criterion: `no training (steps = 0): the Gaussian linear map (the linear method's map) is returned; final error: its ${story.judge} ${fmt(start)}.`,
    };
  }
  let keptPhase = -1;
  for (let i = ph.length - 1; i >= 0; i--) {
    if (ph[i].result.keptStep > 0) {
      keptPhase = i;
      break;
    }
  }
  const last = ph[ph.length - 1].result;
  const total = ph.reduce((s, p) => s + p.result.steps, 0);
  const how = ph.map((p) => `${p.name}: ${p.result.steps} steps, stopped by ${p.result.stopped}`).join('; ');
  const where = `on the ${last.backend} backend${last.backendFallback ? ` because wasm failed: ${last.backendFallback}` : ''}`;
  if (keptPhase < 0) {
    return {
      iterations: 0,
      finalError: start,
      converged: false,
      criterion:
        `${teacher}${how} (${total} steps ${where}); ` +
        `no checkpoint beat the Gaussian linear map on the ${story.judge} (${fmt(start)}, the final error), so that map is returned.`,
    };
  }
  const k = ph[keptPhase];
  const r = k.result;
  const stoppedByItself = last.stopped === 'plateau' || last.stopped === 'no-gain';
  return {
    iterations: k.stepOffset + r.keptStep,
    finalError: r.keptScore,
    converged: stoppedByItself,
    criterion:
      `${teacher}${how} (${total} steps ${where}). Returned: the weights of step ${k.stepOffset + r.keptStep} (${k.name}); final error: their ` +
      `${story.judge} ${fmt(r.keptScore)} against ${fmt(start)} for the Gaussian linear map ` +
      `(smoothed training loss, ${k.objective}, ${fmt(r.keptLoss)}; standardised units).`,
  };
}

function warningsOf(story: FitStory): Warning[] {
  const out: Warning[] = [];
  const ph = story.phases;
  if (ph.length === 0) return out;
  const last = ph[ph.length - 1].result;
  const total = ph.reduce((s, p) => s + p.result.steps, 0);
  const gained = ph.some((p) => p.result.keptStep > 0);
  if (!gained) {
    out.push({
      code: 'kept-linear-start',
      message:
        `No training step beat the linear (Gaussian) map on the held-out rows (${total} steps), ` +
        'so the map returned is that linear map, not a trained network.',
      action:
        'Use the linear method for this data, or raise time_budget and steps, or try start=entropic / a smaller smoothing; ' +
        "compare the energy distance after with the linear map's.",
    });
  }
  if (last.stopped === 'time-budget') {
    out.push({
      code: 'time-budget',
      message: `Fitting stopped after ${total} of ${story.steps} steps when the time budget of ${story.timeBudget} s ran out; the map may be under-trained.`,
      action: 'Raise time_budget, lower batch or hidden, or keep backend=wasm; then compare the convergence figures.',
    });
  } else if (last.stopped === 'steps') {
    out.push({
      code: 'not-converged',
      message: `Training used all ${total} steps before the loss levelled off; the map may be under-trained.`,
      action: 'Raise steps (or learning_rate) and refit; the fit is converged when the convergence record says so.',
    });
  }
  return out;
}

function fmt(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(3)).toString() : String(x);
}
