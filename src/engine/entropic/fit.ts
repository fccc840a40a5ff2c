import { sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { Convergence, CostReport, FitContext, FitRecord, Warning } from '../map';
import type { Sample } from '../points';
import type { Settings } from '../settings';
import { costNote } from './cost-note';
import { defaultEps } from './default-eps';
import { EntropicMap } from './entropic-map';
import { supportOf } from './log-weights';
import { minJacobianEigenvalue } from './map-jacobian';
import { readEntropicSettings } from './settings';
import { sinkhornDivergence } from './sinkhorn-divergence';
import { SolveControl } from './solve-control';
import { Random } from '../stats/random';
import { pooledColumnScales } from '../stats/column-scales';
import type { Points } from '../points';
import type { WeightedSupport } from './log-weights';

/** The largest kernel the fit stores: 5,000 x 5,000 entries, 200 MB of Float64. */
export const MAX_KERNEL_ENTRIES = 25_000_000;
/**
 * Source rows on which the Jacobian's smallest eigenvalue is checked: a seeded
 * random sample of the source rows (all of them when there are fewer). The
 * certificate covers those rows only; the map is monotone everywhere in exact
 * arithmetic (its Jacobian is a covariance over eps), so the check guards
 * against numerical trouble, not against a wrong method. It was 500 rows,
 * about 0.5 s of a 4,000 x 4,000, d = 8 fit (bench/entropic.bench.ts); 200
 * rows cost 0.2 s.
 */
export const JACOBIAN_ROWS = 200;

/**
 * Fits an entropic transport map from `source` to `target`:
 *  1. rows of zero weight are dropped and the weights normalised to probabilities;
 *     each sample is centred on its mean and, with units = standardised (the
 *     default), every column of both is divided by its pooled spread
 *     (`pooledColumnScales`): the fit is then optimal for the cost that weighs
 *     each column by its spread, and the map is monotone in that weighted inner
 *     product (src/engine/stats/column-scales.ts);
 *  2. eps is the setting `smoothing` (in squared fitted units), or when it is 0
 *     the data rule of `defaultEps` on the fitted data;
 *  3. three stabilised Sinkhorn solves (source-target, source-source,
 *     target-target) give the potentials f, g and the debiased Sinkhorn
 *     divergence S_eps, reported as w2Squared = 2 S_eps because the cost is
 *     |x - y|^2 / 2 (in fitted units; see `costNote` for its bias);
 *  4. the Jacobian of the map (Cov / eps, symmetric PSD) is checked on at most
 *     200 seeded source rows (`JACOBIAN_ROWS`; the certificate covers those rows),
 *     in fitted units (the raw-units Jacobian is similar to it: same eigenvalues).
 * Memory: one Float64 kernel of max(n m, n^2, m^2) entries (200 MB at 5,000 rows),
 * shared by the solves. Time: O(iterations (n m + n^2 + m^2)) plus O(n m d) per
 * kernel build (see bench/entropic.bench.ts for measured figures).
 * @param source, target validated samples with the same columns (>= 2 rows of positive weight).
 * @param settings smoothing (epsilon >= 0; 0 = from the data), max_iterations (1..100000), tolerance (0..0.5], seed, units.
 * @param ctx dropped rows, column names, onProgress, signal.
 * @throws RemapError if a sample has more than 5,000 rows of positive weight, or (kind 'cancelled') when cancelled.
 * @example fitEntropic(sample([[0, 0], [1, 1], [2, 0]]), sample([[5, 5], [6, 6], [7, 5]]), {}).apply(points([[1, 1]]))
 */
export function fitEntropic(source: Sample, target: Sample, settings: Settings, ctx: FitContext = {}): EntropicMap {
  const opts = readEntropicSettings(settings);
  const sx = supportOf(source);
  const sy = supportOf(target);
  const n = sx.points.n;
  const m = sy.points.n;
  const entries = Math.max(n * m, n * n, m * m);
  if (entries > MAX_KERNEL_ENTRIES) {
    throw new RemapError(
      `fit (entropic): ${n} source and ${m} target rows need a ${Math.max(n, m)} x ${Math.max(n, m)} kernel (${Math.round((entries * 8) / 1e6)} MB); the entropic method takes at most 5,000 rows of positive weight per sample. Fit on a random subsample, or use the gradient-net or linear method.`,
    );
  }
  // Fitted units: each sample centred on its own (weighted) mean, then every column divided by the pooled spread
  // (units = standardised) or by 1 (raw). Centring leaves the optimal plan unchanged (the cost changes by terms in
  // x alone and y alone) and the map is moved back exactly (see EntropicMap); it keeps the schedule's first eps small.
  const scales = opts.units === 'standardised' ? pooledColumnScales(source, target) : new Float64Array(source.d).fill(1);
  const sourceCentre = weightedMean(sx);
  const targetCentre = weightedMean(sy);
  const fx: WeightedSupport = { points: toFitted(sx.points, sourceCentre, scales), logMass: sx.logMass };
  const fy: WeightedSupport = { points: toFitted(sy.points, targetCentre, scales), logMass: sy.logMass };
  const eps = opts.smoothing > 0 ? opts.smoothing : defaultEps(fx.points, fx.logMass, fy.points, fy.logMass);
  const control = new SolveControl(ctx, 3 * opts.maxIterations);
  const result = sinkhornDivergence(
    { x: fx.points, y: fy.points, logA: fx.logMass, logB: fy.logMass },
    { eps, tolerance: opts.tolerance, maxIterations: opts.maxIterations, control },
  );
  const { transport, sourceSelf, targetSelf } = result;

  const rows = new Random(opts.seed).choose(n, JACOBIAN_ROWS);
  const minEig = minJacobianEigenvalue(fx.points, rows, fy.points, fy.logMass, transport.g, eps);

  // Centring each sample lowered the transport term by |mean difference|^2 / 2 (in fitted units) and left the self
  // terms alone: add it back. S_eps >= 0 in exact arithmetic (Feydy et al. 2019, Theorem 1); a tiny negative value is rounding.
  const gap = new Float64Array(source.d);
  let meanGap = 0;
  for (let k = 0; k < source.d; k++) {
    gap[k] = (targetCentre[k] - sourceCentre[k]) / scales[k];
    meanGap += gap[k] ** 2;
  }
  const w2Squared = Math.max(0, 2 * result.divergence + meanGap);
  const cost: CostReport = {
    kind: 'sinkhorn-divergence',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    units: opts.units === 'standardised' ? 'standardised' : 'raw',
    note: costNote(eps, opts.units, fx.points, fx.logMass, fy.points, fy.logMass, gap, w2Squared),
  };
  const solves = [
    ['source to target', transport],
    ['source onto itself', sourceSelf],
    ['target onto itself', targetSelf],
  ] as const;
  const converged = solves.every(([, r]) => r.converged);
  const convergence: Convergence = {
    iterations: transport.iterations + sourceSelf.iterations + targetSelf.iterations,
    finalError: Math.max(transport.marginalError, sourceSelf.marginalError, targetSelf.marginalError),
    converged,
    criterion: `L1 error of the Sinkhorn plan's marginals (largest of three solves; tolerance ${fmt(opts.tolerance)}): ${solves
      .map(([name, r]) => `${name} ${r.iterations} iterations, error ${fmt(r.marginalError)}`)
      .join('; ')}.`,
  };
  const header: MapHeader = {
    method: 'entropic',
    d: source.d,
    settings: Object.freeze({ ...settings, smoothing: eps, units: opts.units }),
    columns: ctx.columns ?? null,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  const warnings: Warning[] = [...sizeWarnings(header)];
  if (!converged) {
    const worst = solves
      .filter(([, r]) => !r.converged)
      .map(([name]) => name)
      .join(', ');
    warnings.push({
      code: 'not-converged',
      message: `Sinkhorn did not reach the tolerance ${fmt(opts.tolerance)} within ${opts.maxIterations} iterations (${worst}); the marginal error is ${fmt(convergence.finalError)}, so the map and the cost are approximate.`,
      action: `Raise max_iterations (now ${opts.maxIterations}) or smoothing (now ${fmt(eps)}); a larger smoothing converges much faster.`,
    });
  }
  const fitted: FitRecord = { cost, minJacobianEigenvalue: minEig, convergence, warnings };
  return new EntropicMap(header, fitted, {
    eps,
    source: fx.points,
    sourceLogMass: fx.logMass,
    f: transport.f,
    target: fy.points,
    targetLogMass: fy.logMass,
    g: transport.g,
    scales,
    sourceCentre,
    targetCentre,
  });
}

/** The weighted mean of a support's rows (masses exp(logMass)). O(n d). */
function weightedMean(s: WeightedSupport): Float64Array {
  const { n, d, data } = s.points;
  const out = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    const w = Math.exp(s.logMass[i]);
    for (let k = 0; k < d; k++) out[k] += w * data[i * d + k];
  }
  return out;
}

/** (x - centre) / scales, column by column, as new Points. O(n d). */
function toFitted(p: Points, centre: Float64Array, scales: Float64Array): Points {
  const { n, d, data } = p;
  const out = new Float64Array(n * d);
  for (let i = 0, j = 0; i < n; i++) for (let k = 0; k < d; k++, j++) out[j] = (data[j] - centre[k]) / scales[k];
  return { n, d, data: out };
}

function fmt(v: number): string {
  return Number(v.toPrecision(3)).toString();
}
