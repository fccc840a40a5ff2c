import { sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { CostReport, FitContext, FitRecord, Warning } from '../map';
import type { Sample } from '../points';
import { settingsOf, type Settings } from '../settings';
import { LINEAR_SETTINGS } from './settings';
import { weightedMoments } from '../stats/moments';
import { symmetricEigen } from '../stats/symmetric-eigen';
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
  const { ridge } = settingsOf(LINEAR_SETTINGS, settings, 'linear');
  if (source.d !== target.d) throw new RemapError(`${fn}: the source has ${source.d} columns and the target ${target.d}; give both the same columns.`);
  const d = source.d;
  const columns = ctx.columns ?? null;

  const mom1 = weightedMoments(source, source.weights);
  const mom2 = weightedMoments(target, target.weights);
  const r1 = mom1; // per-column ranges over rows of positive weight, from the moments' own pass
  const r2 = mom2;
  checkLinearScale(diagonal(mom1.cov, d), diagonal(mom2.cov, d), varies(r1), varies(r2), fn);
  const cov1 = Float64Array.from(mom1.cov);
  const cov2 = Float64Array.from(mom2.cov);
  for (let k = 0; k < d; k++) {
    cov1[k * d + k] += ridge;
    cov2[k * d + k] += ridge;
  }
  if (ridge > 0) checkLinearScale(diagonal(cov1, d), diagonal(cov2, d), varies(r1), varies(r2), fn);
  const eig1 = symmetricEigen(cov1, d);
  const ratio1 = covarianceCondition(eig1, cov1, { which: 'source', columns, rows: positiveRows(source), ridge, fn });
  const eig2 = symmetricEigen(cov2, d);
  const ratio2 = covarianceCondition(eig2, cov2, { which: 'target', columns, rows: positiveRows(target), ridge, fn });
  const gt = gaussianTransport(eig1, cov1, cov2);

  let meanPart = 0;
  for (let k = 0; k < d; k++) meanPart += (mom1.mean[k] - mom2.mean[k]) ** 2;
  const w2Squared = meanPart + gt.covarianceTerm;
  const cost: CostReport = {
    kind: 'bures',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    note:
      'Squared 2-Wasserstein distance between the Gaussians with the samples\' means and covariances (closed form); it equals the distance between the samples themselves only when both are Gaussian' +
      (ridge > 0 ? `, and the covariances include the ridge ${ridge}.` : '.'),
  };

  const header: MapHeader = {
    method: 'linear',
    d,
    settings,
    columns,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  const warnings: Warning[] = sizeWarnings(header);
  if (ridge > 0) {
    warnings.push({
      code: 'ridge-added',
      message: `A ridge of ${ridge} was added to every variance of both samples, so the map matches the covariances plus ${ridge} on the diagonal rather than the covariances themselves.`,
      action: 'Keep the ridge small next to the variances of your columns; set ridge=0 if no column is constant or collinear.',
    });
  }
  const worst = Math.min(ratio1, ratio2);
  if (worst < ILL_CONDITIONED_RATIO) {
    warnings.push({
      code: 'singular-covariance',
      message: `The ${ratio1 <= ratio2 ? 'source' : 'target'} covariance is nearly singular (smallest/largest eigenvalue ${worst.toPrecision(2)}); the map stretches a direction the data barely spans and magnifies noise along it.`,
      action: 'Remove nearly collinear columns, rescale columns to similar sizes, or set a small ridge.',
    });
  }

  const fitted: FitRecord = { cost, minJacobianEigenvalue: gt.minEigenvalue, warnings };
  const map = new LinearMap(header, fitted, {
    mean1: mom1.mean,
    mean2: mom2.mean,
    cov1,
    cov2,
    matrix: gt.matrix,
    inverse: gt.inverse,
    sourceMin: r1.min,
    sourceMax: r1.max,
    targetMin: r2.min,
    targetMax: r2.max,
  });
  // The energy distances and KS (assess.ts) come from the shared mechanism of every map, computed
  // when diagnostics or JSON are first asked for.
  if (options.compare !== false) map.attachSamples(source, target);
  return map;
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
