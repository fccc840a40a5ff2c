import type { NetworkParams } from './network-params';
import { sigmoidEnergy, sigmoidEnergySlope } from './sigmoid-energy';

/**
 * The nonlinear part of the closed-form one-hidden-layer input convex gradient
 * network (Richter-Powell, Lorraine & Amos, "Input Convex Gradient Networks",
 * arXiv 2111.12187): for one row x it writes, per hidden unit j,
 *   act[j]  = c_j [h(w_j . x + b_j) - h(b_j)]     (F's nonlinear part is W^T act)
 *   gain[j] = c_j h'(w_j . x + b_j)               (its Jacobian is W^T diag(gain) W)
 * with h = s^2/2 - s^3/3 (see sigmoid-energy.ts for the derivation from the
 * integral over t in [0, 1]). Cost O(hidden * d).
 * @param x one row of length d (standardised coordinates).
 * @param act, gain outputs of length hidden (either may be null).
 * @example icgnHidden(p, Float64Array.of(0, 0), act, gain) // act all 0 at x = 0
 */
export function icgnHidden(p: NetworkParams, x: Float64Array, act: Float64Array | null, gain: Float64Array | null): void {
  const { d, hidden, w, b, c } = p;
  for (let j = 0; j < hidden; j++) {
    let u = b[j];
    const o = j * d;
    for (let k = 0; k < d; k++) u += w[o + k] * x[k];
    if (act) act[j] = c[j] * (sigmoidEnergy(u) - sigmoidEnergy(b[j]));
    if (gain) gain[j] = c[j] * sigmoidEnergySlope(u);
  }
}
