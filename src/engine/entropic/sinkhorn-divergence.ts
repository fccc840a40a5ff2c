import { solveSelfSinkhorn, type SelfSinkhornResult } from './self-sinkhorn';
import { packedSize } from './symmetric-kernel';
import { solveSinkhorn, type SinkhornResult, type TransportProblem } from './sinkhorn';
import type { SolveControl } from './solve-control';

export interface DivergenceOptions {
  readonly eps: number;
  readonly tolerance: number;
  readonly maxIterations: number;
  readonly control?: SolveControl;
  /** Scratch of length >= max(n m, n (n + 1) / 2, m (m + 1) / 2), shared by the three solves. */
  readonly kernel?: Float64Array;
  /** First eps of every schedule (default: the transport solve starts at a quarter of its mean cost, see `meanCost`; the self solves at eps). */
  readonly startEps?: number;
}

export interface DivergenceResult {
  /** S_eps(a, b) = OT_eps(a, b) - (OT_eps(a, a) + OT_eps(b, b)) / 2, for the cost |x - y|^2 / 2. */
  readonly divergence: number;
  readonly transport: SinkhornResult;
  readonly sourceSelf: SelfSinkhornResult;
  readonly targetSelf: SelfSinkhornResult;
}

/**
 * The debiased Sinkhorn divergence between two weighted point sets (Feydy,
 * Sejourne, Vialard, Amari, Trouve & Peyre 2019, "Interpolating between optimal
 * transport and MMD using Sinkhorn divergences", eq. (4)):
 *   S_eps(a, b) = OT_eps(a, b) - (OT_eps(a, a) + OT_eps(b, b)) / 2,
 * each OT_eps the dual objective <f, a> + <g, b> at the solves' end (minus
 * eps (mass - 1), which is as small as the marginal error). S_eps is
 * symmetric, 0 for identical samples and non-negative; as eps -> 0 it tends to
 * the unregularised cost, here W2^2 / 2 since the cost is |x - y|^2 / 2.
 * Runs three Sinkhorn solves sharing one kernel buffer. O(iterations (n m + n^2 + m^2)).
 * @param p the problem (masses positive, summing to 1).
 * @throws RemapError (kind 'cancelled') through `o.control`.
 * @example sinkhornDivergence({ x, y: x, logA, logB: logA }, { eps: 0.1, tolerance: 1e-9, maxIterations: 500 }).divergence // about 0
 */
export function sinkhornDivergence(p: TransportProblem, o: DivergenceOptions): DivergenceResult {
  const n = p.x.n;
  const m = p.y.n;
  const kernel = o.kernel ?? new Float64Array(Math.max(n * m, packedSize(n), packedSize(m)));
  const common = { eps: o.eps, tolerance: o.tolerance, maxIterations: o.maxIterations, control: o.control, kernel, startEps: o.startEps };
  const transport = solveSinkhorn(p, common);
  const sourceSelf = solveSelfSinkhorn(p.x, p.logA, common);
  const targetSelf = solveSelfSinkhorn(p.y, p.logB, common);
  const divergence = transport.value - (sourceSelf.value + targetSelf.value) / 2;
  return { divergence, transport, sourceSelf, targetSelf };
}
