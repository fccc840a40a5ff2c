import { fitHeader, sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { CostReport, FitContext, FitRecord, Warning } from '../map';
import type { Sample } from '../points';
import { settingsOf, type Settings } from '../settings';
import { LINEAR_SETTINGS } from './settings';
import { weightedMoments } from '../stats/moments';
import { symmetricEigen } from '../stats/symmetric-eigen';
import { kishEffectiveSize } from '../stats/effective-size';
import { gaussianW2Squared } from './bures';
import { covarianceCondition, ILL_CONDITIONED_RATIO } from './covariance-condition';
import { gaussianTransport } from './gaussian-transport';
import { LinearMap } from './linear-map';
import { checkLinearScale } from './scale-check';

export interface LinearFitOptions {
  /** Record energy distances and the KS statistic (default true; computed when diagnostics are first read; off only for timing the map itself). */
  readonly compare?: boolean;
}

/**
 * Fits the linear (Gaussian) transport map from `source` to `target`:
 * T(x) = m2 + A (x - m1), the optimal map for squared Euclidean cost between
 * the Gaussians N(m1, S1) and N(m2, S2) whose means and covariances are those
 * of the two samples (Knott & Smith 1984; see gaussianTransport). The moments
 * are those of the empirical distributions: rows weighted by their weights
 * and covariances divided by the total weight (not n - 1). T pushes the
 * source's mean and covariance exactly onto the target's (up to rounding);
 * it matches the whole distribution only when both samples are Gaussian up
 * to an affine change. In one column it is m2 + (s2 / s1)(x - m1), s the
 * standard deviations.
 *
 * `settings.ridge` (>= 0, default 0) is added to every variance of both
 * samples; when positive the fit records a 'ridge-added' warning and the map
 * then pushes N(m1, S1 + ridge I) onto N(m2, S2 + ridge I).
 * A covariance with smallest/largest eigenvalue below 1e-12 is refused (see
 * covarianceCondition); below 1e-8 the fit warns 'singular-covariance'.
 * The cost is the Bures closed form (kind 'bures'); minJacobianEigenvalue is
 * the smallest eigenvalue of A (the Jacobian of T everywhere).
 *
 * Cost: O((n + m) d^2 + d^3), plus the comparisons (see compareFit) when diagnostics are first read
 * unless `options.compare` is false. Never mutates its inputs.
 * @param source, target validated samples with the same d (finite values, weights checked; prepareFit does this).
 * @param settings resolved settings; `ridge` a number >= 0.
 * @param ctx dropped rows and column names for the diagnostics.
 * @throws RemapError for a negative ridge, a singular source or target covariance (message says which and what to do),
 *   or (kind 'num') data or a ridge too small or too large for double precision (see checkLinearScale).
 * @example fitLinear(sample([1, 2, 3]), sample([10, 20, 30]), { ridge: 0 }).apply(column([2])).data // [20]
 */
export function fitLinear(source: Sample, target: Sample, settings: Settings, ctx: FitContext = {}, options: LinearFitOptions = {}): LinearMap {
  const fn = 'fit (linear)';
  if (source.d !== target.d) throw new RemapError(`${fn}: the source has ${source.d} columns and the target ${target.d}; give both the same columns.`);
  const summary = (s: Sample): LinearSummary => {
    const m = weightedMoments(s, s.weights); // ranges over rows of positive weight come from the moments' own pass
    return { mean: m.mean, cov: m.cov, min: m.min, max: m.max, varies: varies(m), rows: positiveRows(s), effectiveSize: kishEffectiveSize(s.weights, s.n) };
  };
  const header = fitHeader('linear', source, target, settings, ctx);
  const map = linearMapFromSummaries(summary(source), summary(target), settings, header, fn);
  // The energy distances and KS (assess.ts) come from the shared mechanism of every map, computed
  // when diagnostics or JSON are first asked for.
  if (options.compare !== false) map.attachSamples(source, target);
  return map;
}

/** What the linear map needs of a sample: moments (divided by the total weight), ranges and sizes. */
export interface LinearSummary {
  readonly mean: ArrayLike<number>;
  /** Row-major d x d covariance, divided by the total weight (not n - 1). */
  readonly cov: ArrayLike<number>;
  /** Per-column range over rows of positive weight (-Infinity / Infinity when unknown). */
  readonly min: Float64Array;
  readonly max: Float64Array;
  /** Per column: does it take more than one value? */
  readonly varies: readonly boolean[];
  /** Rows of positive weight (for messages). */
  readonly rows: number;
  /** Kish's effective number of rows. */
  readonly effectiveSize: number;
}

/**
 * The linear map from two samples' summaries: the one formula behind `fitLinear`
 * (rows) and `fitLinearFromMoments` (summaries a database computed), so both
 * give the same map for the same moments. In standardised units (the default)
 * each column is divided by s_k = sqrt((var_source(k) + var_target(k)) / 2), the
 * pooled spread of column-scales.ts computed from these covariances. O(d^3).
 * @throws RemapError as fitLinear.
 */
export function linearMapFromSummaries(sum1: LinearSummary, sum2: LinearSummary, settings: Settings, header: MapHeader, fn: string): LinearMap {
  const { ridge, units } = settingsOf(LINEAR_SETTINGS, settings, 'linear');
  const d = header.d;
  const columns = header.columns;
  checkLinearScale(diagonal(sum1.cov, d), diagonal(sum2.cov, d), sum1.varies, sum2.varies, fn);
  // Fitted units: raw, or each column divided by its pooled spread s_k (column-scales.ts). The ridge is added in them.
  const scales = units === 'standardised' ? pooledScales(sum1.cov, sum2.cov, d) : null;
  const cov1 = scales ? scaledCovariance(sum1.cov, scales, d) : Float64Array.from(sum1.cov);
  const cov2 = scales ? scaledCovariance(sum2.cov, scales, d) : Float64Array.from(sum2.cov);
  for (let k = 0; k < d; k++) {
    cov1[k * d + k] += ridge;
    cov2[k * d + k] += ridge;
  }
  if (ridge > 0) checkLinearScale(diagonal(cov1, d), diagonal(cov2, d), sum1.varies, sum2.varies, fn);
  const ratio1 = covarianceCondition(cov1, d, { which: 'source', columns, rows: sum1.rows, ridge, fn, units, varies: sum1.varies });
  const ratio2 = covarianceCondition(cov2, d, { which: 'target', columns, rows: sum2.rows, ridge, fn, units, varies: sum2.varies });
  const eig1 = symmetricEigen(cov1, d);
  const gt = gaussianTransport(eig1, cov1, cov2);

  // The covariances the map pushes, in raw units (ridge included: ridge s_k^2 on the diagonal when standardised).
  const rawCov1 = scales ? unscaledCovariance(cov1, scales, d) : cov1;
  const rawCov2 = scales ? unscaledCovariance(cov2, scales, d) : cov2;
  let meanPart = 0;
  for (let k = 0; k < d; k++) meanPart += (sum1.mean[k] - sum2.mean[k]) ** 2;
  // In raw units the cost is the Bures closed form of the raw moments; when the fit is in standardised units that
  // is a separate closed form (the fitted map minimises the spread-weighted cost, whose value is gt's).
  const w2Squared = scales ? gaussianW2Squared(sum1.mean, rawCov1, sum2.mean, rawCov2) : meanPart + gt.covarianceTerm;
  let scaledPart = 0;
  if (scales) for (let k = 0; k < d; k++) scaledPart += ((sum1.mean[k] - sum2.mean[k]) / scales[k]) ** 2;
  const cost: CostReport = {
    kind: 'bures',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    bound: ridge > 0 ? 'estimate' : 'lower',
    label:
      ridge > 0
        ? 'squared W2, estimate (Gaussians with the same means and covariances plus a ridge)'
        : 'squared W2, lower bound (Gaussians with the same means and covariances; Gelbrich)',
    units: 'raw',
    note:
      "Squared 2-Wasserstein distance, in the data's own units, between the Gaussians with the samples' means and covariances (closed form). " +
      (ridge > 0
        ? `The covariances include the ridge ${ridge}${scales ? ' (in standardised units)' : ''}, so the figure is an estimate, not a bound.`
        : 'It is a lower bound on the squared W2 between the samples themselves (Gelbrich 1990), equal to it only when both are Gaussian up to an affine change.') +
      (scales
        ? ` The map was fitted in standardised units (each column divided by its pooled spread), where the same closed form is ${(scaledPart + gt.covarianceTerm).toPrecision(4)}; set units=raw to fit in the data's own units.`
        : " The map was fitted in the data's own units (units=raw), where the widest column dominates."),
  };

  const effectiveSize = { source: sum1.effectiveSize, target: sum2.effectiveSize };
  const warnings: Warning[] = sizeWarnings(header, effectiveSize);
  if (ridge > 0) {
    const inUnits = scales ? " (in standardised units: a share of each column's pooled variance)" : '';
    warnings.push({
      code: 'ridge-added',
      message: `A ridge of ${ridge}${inUnits} was added to every variance of both samples, so the map matches the covariances plus the ridge on the diagonal rather than the covariances themselves.`,
      action: scales
        ? 'Keep the ridge small (for example 1e-6); set ridge=0 if no column is constant or collinear.'
        : 'Keep the ridge small next to the smallest variance of your columns; set ridge=0 if no column is constant or collinear.',
    });
  }
  const worst = Math.min(ratio1, ratio2);
  if (worst < ILL_CONDITIONED_RATIO) {
    warnings.push({
      code: 'singular-covariance',
      message: `The ${ratio1 <= ratio2 ? 'source' : 'target'} covariance is nearly singular (smallest/largest eigenvalue of its correlation matrix ${worst.toPrecision(2)}); the map stretches a direction the data barely spans and magnifies noise along it.`,
      action: 'Remove nearly collinear columns, or set a small ridge.',
    });
  }

  const fitted: FitRecord = { cost, minJacobianEigenvalue: gt.minEigenvalue, effectiveSize, warnings };
  return new LinearMap(header, fitted, {
    mean1: Float64Array.from(sum1.mean),
    mean2: Float64Array.from(sum2.mean),
    cov1: rawCov1,
    cov2: rawCov2,
    matrix: scales ? conjugate(gt.matrix, scales, d) : gt.matrix,
    inverse: scales ? conjugate(gt.inverse, scales, d) : gt.inverse,
    sourceMin: sum1.min,
    sourceMax: sum1.max,
    targetMin: sum2.min,
    targetMax: sum2.max,
  });
}

/** s_k = sqrt((C1_kk + C2_kk) / 2), 1 where that is 0 or not finite: pooledColumnScales from covariances. O(d). */
function pooledScales(cov1: ArrayLike<number>, cov2: ArrayLike<number>, d: number): Float64Array {
  const out = new Float64Array(d);
  for (let k = 0; k < d; k++) {
    const s = Math.sqrt((cov1[k * d + k] + cov2[k * d + k]) / 2);
    out[k] = s > 0 && Number.isFinite(s) ? s : 1;
  }
  return out;
}

/** D C D with D = diag(1 / s): the covariance of the columns divided by s. O(d^2). */
function scaledCovariance(cov: ArrayLike<number>, s: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) out[k * d + l] = cov[k * d + l] / (s[k] * s[l]);
  return out;
}

/** S C S with S = diag(s): back from standardised to raw units. O(d^2). */
function unscaledCovariance(cov: ArrayLike<number>, s: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) out[k * d + l] = cov[k * d + l] * s[k] * s[l];
  return out;
}

/**
 * S M S^-1 with S = diag(s): the raw-units matrix of a linear map fitted in
 * standardised units, T(x) = S T_s(S^-1 x) (same eigenvalues as M). O(d^2).
 */
function conjugate(m: ArrayLike<number>, s: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) out[k * d + l] = (s[k] * m[k * d + l]) / s[l];
  return out;
}

function diagonal(cov: ArrayLike<number>, d: number): Float64Array {
  const out = new Float64Array(d);
  for (let k = 0; k < d; k++) out[k] = cov[k * d + k];
  return out;
}

function varies(r: { readonly min: Float64Array; readonly max: Float64Array }): boolean[] {
  return Array.from(r.min, (lo, k) => r.max[k] > lo);
}

function positiveRows(s: Sample): number {
  if (!s.weights) return s.n;
  let c = 0;
  for (let i = 0; i < s.n; i++) if (s.weights[i] > 0) c++;
  return c;
}
