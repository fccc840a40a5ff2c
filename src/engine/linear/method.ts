import type { MethodSpec } from '../method';
import { fitLinear } from './fit';
import { LinearMap } from './linear-map';
import { LINEAR_SETTINGS } from './settings';

/**
 * The linear (Gaussian, Bures-Wasserstein) method: T(x) = m2 + A (x - m1)
 * with A symmetric positive definite, the optimal map between Gaussians with
 * the samples' (weighted) means and covariances. Joint over all columns,
 * takes row weights, needs d + 2 rows per sample. Closed form: O((n + m) d^2 + d^3).
 * Its setting: ridge (>= 0, default 0). The common `tails` setting has no
 * effect: a linear map extends past the fitted range as the same affine function.
 */
export const linearMethod: MethodSpec = {
  name: 'linear',
  summary: 'Affine map matching means and covariances (optimal between Gaussians); fast, joint over columns, exact inverse.',
  shape: 'joint',
  settings: LINEAR_SETTINGS,
  minRows: (d: number) => d + 2,
  weights: true,
  fit: (source, target, settings, ctx) => fitLinear(source, target, settings, ctx),
  fromJSON: (json) => LinearMap.fromJSON(json),
};
