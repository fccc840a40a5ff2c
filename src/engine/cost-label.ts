import type { CostBound, CostReport, LabelledCost } from './map';

/**
 * How each kind of cost relates to the squared 2-Wasserstein distance between
 * the source and target samples, and the label doors print beside it:
 *  - exact-1d: exact; the 1-D optimal coupling is the quantile coupling.
 *  - per-column-1d: a lower bound. The joint optimal coupling's column
 *    marginals are couplings of the column marginals, so the joint cost is at
 *    least the sum of the per-column optimal costs (the squared distance is a
 *    sum over columns).
 *  - bures: a lower bound. The squared W2 between Gaussians with the samples'
 *    means and covariances is at most the squared W2 between any two
 *    distributions with those means and covariances (Gelbrich, "On a formula
 *    for the L2 Wasserstein metric between measures on Euclidean and Hilbert
 *    spaces", Math. Nachr. 147, 1990); with a ridge added the covariances are
 *    not the samples' own, so it is then only an estimate.
 *  - assignment: exact for two equal-size, equally weighted samples (the
 *    optimal coupling of such samples is a permutation: Birkhoff-von Neumann).
 *  - sinkhorn-divergence: an estimate (entropic smoothing biases it).
 *  - mapped: an estimate; the mean squared displacement of the fitted map, a
 *    W2 to the target only if the map pushes the source exactly onto it.
 */
const DEFAULTS: Readonly<Record<CostReport['kind'], { readonly bound: CostBound; readonly label: string }>> = {
  'exact-1d': { bound: 'exact', label: 'squared W2, exact' },
  'per-column-1d': { bound: 'lower', label: 'squared W2, lower bound (sum of per-column costs; dependence ignored)' },
  bures: { bound: 'lower', label: 'squared W2, lower bound (Gaussians with the same means and covariances; Gelbrich)' },
  assignment: { bound: 'exact', label: 'squared W2, exact (optimal assignment of equal-size samples)' },
  'sinkhorn-divergence': { bound: 'estimate', label: 'squared W2, estimate (debiased Sinkhorn divergence)' },
  mapped: { bound: 'estimate', label: 'mean squared displacement |T(x) - x|^2 of the map (not a distance to the target)' },
};

/**
 * The cost with its `bound` and `label` filled in from its kind where the
 * method left them out; what a method set is kept. O(1). Never mutates `cost`.
 * @example labelCost({ kind: 'bures', w2Squared: 5, w2: 2.236, note: '' }).bound // 'lower'
 */
export function labelCost(cost: CostReport): LabelledCost {
  const fill = DEFAULTS[cost.kind] ?? { bound: 'estimate' as const, label: 'squared W2, estimate' };
  return { ...cost, bound: cost.bound ?? fill.bound, label: cost.label ?? fill.label };
}
