import { barycentricMap } from '../entropic/barycentric-map';
import { fitEntropic } from '../entropic/fit';
import type { FitContext } from '../map';
import type { Points } from '../points';
import type { Random } from '../stats/random';
import type { TrainData } from './train-data';

/** Rows per side the teacher is fitted on (design choice: at d = 8 the entropic map on 4,000 rows fits in about 2.5 s). */
export const TEACHER_ROWS = 4000;

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
 * start of the network: a gradient of a convex function that is accurate on the
 * benchmark maps (bench/gradient-net.bench.ts) but costs O(rows) per point to
 * apply, which the network, fitted to it by regression, does not. Uses the
 * entropic method's own solver (entropic/fit.ts) with `eps` (0 = its data rule).
 * Cost: one entropic fit on min(n, 4000) x min(m, 4000) rows.
 * @throws RemapError (kind 'cancelled') when ctx.signal is aborted.
 */
export function entropicTeacher(source: TrainData, target: TrainData, eps: number, rng: Random, ctx: FitContext): Teacher {
  const xs = subsample(source, rng);
  const ys = subsample(target, rng);
  // Both names are given so the call reads the same whichever the entropic method uses; each method ignores names it does not declare.
  const settings: Record<string, number | string> = eps > 0 ? { eps, smoothing: eps, units: 'raw' } : { units: 'raw' };
  const map = fitEntropic(xs, ys, settings, { signal: ctx.signal });
  const parts = map.parts;
  const conv = map.diagnostics().convergence;
  return {
    eps: parts.eps,
    rows: { source: xs.n, target: ys.n },
    iterations: conv?.iterations ?? 0,
    converged: conv?.converged ?? true,
    at: (x: Points) => barycentricMap(x, parts.target, parts.targetLogMass, parts.g, parts.eps),
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
