import { sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { Convergence, CostReport, FitContext, FitRecord, Warning } from '../map';
import type { Sample } from '../points';
import type { Settings } from '../settings';
import { defaultEps } from './default-eps';
import { EntropicMap } from './entropic-map';
import { supportOf } from './log-weights';
import { minJacobianEigenvalue } from './map-jacobian';
import { readEntropicSettings } from './settings';
import { sinkhornDivergence } from './sinkhorn-divergence';
import { SolveControl } from './solve-control';
import { Random } from '../stats/random';

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
 *  2. eps is the setting, or when it is 0 the data rule of `defaultEps`;
 *  3. three stabilised Sinkhorn solves (source-target, source-source,
 *     target-target) give the potentials f, g and the debiased Sinkhorn
 *     divergence S_eps, reported as w2Squared = 2 S_eps because the cost is
 *     |x - y|^2 / 2;
 *  4. the Jacobian of the map (Cov / eps, symmetric PSD) is checked on at most
 *     200 seeded source rows (`JACOBIAN_ROWS`; the certificate covers those rows).
 * Memory: one Float64 kernel of max(n m, n^2, m^2) entries (200 MB at 5,000 rows),
 * shared by the solves. Time: O(iterations (n m + n^2 + m^2)) plus O(n m d) per
 * kernel build (see bench/entropic.bench.ts for measured figures).
 * @param source, target validated samples with the same columns (>= 2 rows of positive weight).
 * @param settings eps (>= 0; 0 = from the data), max_iterations (1..100000), tolerance (0..0.5], seed.
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
  const eps = opts.eps > 0 ? opts.eps : defaultEps(sx.points, sx.logMass, sy.points, sy.logMass);
  const control = new SolveControl(ctx, 3 * opts.maxIterations);
  const result = sinkhornDivergence(
    { x: sx.points, y: sy.points, logA: sx.logMass, logB: sy.logMass },
    { eps, tolerance: opts.tolerance, maxIterations: opts.maxIterations, control },
  );
  const { transport, sourceSelf, targetSelf } = result;

  const rows = new Random(opts.seed).choose(n, JACOBIAN_ROWS);
  const minEig = minJacobianEigenvalue(sx.points, rows, sy.points, sy.logMass, transport.g, eps);

  // S_eps >= 0 in exact arithmetic (Feydy et al. 2019, Theorem 1); a tiny negative value is rounding.
  const w2Squared = Math.max(0, 2 * result.divergence);
  const cost: CostReport = {
    kind: 'sinkhorn-divergence',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    note: `Debiased Sinkhorn divergence at eps = ${fmt(eps)}, times 2 because the cost is |x - y|^2 / 2: an estimate of W2^2 that is biased upward by smoothing for large eps and tends to W2^2 as eps shrinks.`,
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
    settings: Object.freeze({ ...settings, eps }),
    columns: ctx.columns ?? null,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  const warnings: Warning[] = [...sizeWarnings(header)];
  if (!converged) {
    const worst = solves.filter(([, r]) => !r.converged).map(([name]) => name).join(', ');
    warnings.push({
      code: 'not-converged',
      message: `Sinkhorn did not reach the tolerance ${fmt(opts.tolerance)} within ${opts.maxIterations} iterations (${worst}); the marginal error is ${fmt(convergence.finalError)}, so the map and the cost are approximate.`,
      action: `Raise max_iterations (now ${opts.maxIterations}) or eps (now ${fmt(eps)}); a larger eps converges much faster.`,
    });
  }
  const fitted: FitRecord = { cost, minJacobianEigenvalue: minEig, convergence, warnings };
  return new EntropicMap(header, fitted, {
    eps,
    source: sx.points,
    sourceLogMass: sx.logMass,
    f: transport.f,
    target: sy.points,
    targetLogMass: sy.logMass,
    g: transport.g,
  });
}

function fmt(v: number): string {
  return Number(v.toPrecision(3)).toString();
}
