import { TruncatedSoftmax } from '../entropic/truncated-softmax';
import { supportOf } from '../entropic/log-weights';
import { solveSinkhorn } from '../entropic/sinkhorn';
import { SolveControl } from '../entropic/solve-control';
import type { FitContext } from '../map';
import type { Points } from '../points';
import type { Random } from '../stats/random';
import type { TrainData } from './train-data';

/** Rows per side the teacher is fitted on (design choice: at d = 8 the entropic map on 4,000 rows fits in about 2.5 s). */
export const TEACHER_ROWS = 4000;
/** The teacher's Sinkhorn stops at this L1 marginal error or iteration count (its map feeds a regression, which averages small errors). */
export const TEACHER_TOLERANCE = 1e-3;
export const TEACHER_MAX_ITERATIONS = 300;

/** A fast, accurate map the network is first fitted to by regression. */
export interface Teacher {
  /** The entropic regularisation used, in the units of the cost |x - y|^2 / 2 (standardised data). */
  readonly eps: number;
  /** Rows per side it was fitted on. */
  readonly rows: { readonly source: number; readonly target: number };
  /** Sinkhorn iterations of the fit, and whether it converged. */
  readonly iterations: number;
  readonly converged: boolean;
  /** The teacher's map at the given rows (row-major, new array). O(rows * teacher rows * d). */
  at(x: Points): Float64Array;
}

/**
 * The entropic map of Pooladian & Niles-Weed (2021, arXiv 2109.12004) fitted on
 * at most TEACHER_ROWS seeded rows of each (standardised) sample, the amortised
 * start of the network: a gradient of a convex function, accurate but costing
 * O(rows d) per point to apply, which the network, fitted to it by regression,
 * does not. Only the source-to-target Sinkhorn solve is needed (the entropic
 * method's solver, entropic/sinkhorn.ts, for the cost |x - y|^2 / 2 at `eps`),
 * stopped at a marginal error of 1e-3 or 300 iterations.
 * Cost: O(iterations * rows^2) with rows = min(n, 4000), plus O(rows^2 d) per kernel build.
 * @param eps > 0, in the units of the cost |x - y|^2 / 2 on the standardised data.
 * @throws RemapError (kind 'cancelled') when ctx.signal is aborted.
 */
export function entropicTeacher(source: TrainData, target: TrainData, eps: number, rng: Random, ctx: FitContext): Teacher {
  const xs = supportOf(subsample(source, rng));
  const ys = supportOf(subsample(target, rng));
  const control = new SolveControl({ signal: ctx.signal }, TEACHER_MAX_ITERATIONS);
  const r = solveSinkhorn(
    { x: xs.points, y: ys.points, logA: xs.logMass, logB: ys.logMass },
    { eps, tolerance: TEACHER_TOLERANCE, maxIterations: TEACHER_MAX_ITERATIONS, control },
  );
  const y = ys.points;
  const logB = ys.logMass;
  // The entropic map's own kernel (within 1e-10 of the support's diameter of the untruncated map), built once.
  const h = new Float64Array(y.n);
  for (let j = 0; j < y.n; j++) h[j] = logB[j] + r.g[j] / eps;
  let kernel: TruncatedSoftmax | null = null;
  return {
    eps,
    rows: { source: xs.points.n, target: y.n },
    iterations: r.iterations,
    converged: r.converged,
    at: (x: Points) => (kernel ??= new TruncatedSoftmax(y, h, eps)).map(x),
  };
}

function subsample(s: TrainData, rng: Random): TrainData & { weights: Float64Array | null } {
  if (s.n <= TEACHER_ROWS) return { n: s.n, d: s.d, data: s.data, weights: s.weights };
  const idx = rng.choose(s.n, TEACHER_ROWS);
  const d = s.d;
  const data = new Float64Array(idx.length * d);
  for (let r = 0; r < idx.length; r++) for (let k = 0; k < d; k++) data[r * d + k] = s.data[idx[r] * d + k];
  const weights = s.weights ? Float64Array.from(idx, (i) => s.weights![i]) : null;
  return { n: idx.length, d, data, weights };
}
