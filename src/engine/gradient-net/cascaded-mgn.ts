import type { NetworkParams } from './network-params';
import { sigmoid } from './sigmoid-energy';

/**
 * The nonlinear part of the cascaded monotone gradient network (C-MGN of
 * Chaudhari, Pranav & Moura, "Learning Gradients of Convex Functions with
 * Monotone Gradient Networks", arXiv 2301.10862), with one weight matrix W
 * shared by all layers:
 *   z_0 = W x + b_0,   z_l = W x + s(z_{l-1}) + b_l   (l = 1 .. L-1),
 *   nonlinear part = W^T diag(c) s(z_{L-1}).
 * Because W is shared, dz_l/dx = diag(g_l) W with g_0 = 1, g_l = 1 + s'(z_{l-1}) g_{l-1},
 * so the Jacobian is W^T diag(c s'(z_{L-1}) g_{L-1}) W: symmetric and positive
 * semi-definite with no integral (all factors are positive).
 * For one row x this writes act[j] = c_j s(z_{L-1,j}) and gain[j] = c_j s'(z_{L-1,j}) g_{L-1,j}.
 * Cost O(hidden * (d + L)).
 * @param x one row of length d (standardised coordinates).
 * @param act, gain outputs of length hidden (either may be null).
 * @example mgnHidden(p, x, act, gain) // gain[j] > 0 for every unit
 */
export function mgnHidden(p: NetworkParams, x: Float64Array, act: Float64Array | null, gain: Float64Array | null): void {
  const { d, hidden, layers, w, b, c } = p;
  for (let j = 0; j < hidden; j++) {
    let wx = 0;
    const o = j * d;
    for (let k = 0; k < d; k++) wx += w[o + k] * x[k];
    let z = wx + b[j];
    let g = 1;
    for (let l = 1; l < layers; l++) {
      const s = sigmoid(z);
      g = 1 + s * (1 - s) * g;
      z = wx + s + b[l * hidden + j];
    }
    const s = sigmoid(z);
    if (act) act[j] = c[j] * s;
    if (gain) gain[j] = c[j] * s * (1 - s) * g;
  }
}
