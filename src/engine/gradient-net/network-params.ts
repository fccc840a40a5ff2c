import { RemapError } from '../errors';

/**
 * The trained weights of a gradient network, in float64 (copied from the float32
 * tensors after training), in standardised coordinates. With m = hidden, d = columns:
 *
 *   layers = 1 (closed-form input convex gradient network, arXiv 2111.12187):
 *     F(x) = W^T diag(c) [h(W x + b_0) - h(b_0)] + (V^T V + alpha I) x + beta
 *   layers = L >= 2 (cascaded monotone gradient network, C-MGN, arXiv 2301.10862):
 *     z_0 = W x + b_0,  z_l = W x + s(z_{l-1}) + b_l  (l = 1 .. L-1)
 *     F(x) = W^T diag(c) s(z_{L-1}) + (V^T V + alpha I) x + beta
 *
 * c > 0 (per-unit output gains: the hidden layer diag(sqrt c) s(Wx+b), still of
 * the published form), alpha > 0, s the logistic sigmoid, h = s^2/2 - s^3/3.
 */
export interface NetworkParams {
  readonly d: number;
  readonly hidden: number;
  readonly layers: number;
  /** W, hidden x d, row-major: w[j * d + k]. */
  readonly w: Float64Array;
  /** Biases b_0 .. b_{L-1}, layers x hidden, row-major. */
  readonly b: Float64Array;
  /** Output gains c_j > 0, length hidden. */
  readonly c: Float64Array;
  /** V, d x d, row-major; the linear part is V^T V + alpha I. */
  readonly v: Float64Array;
  readonly alpha: number;
  /** Output offset, length d. */
  readonly beta: Float64Array;
}

/** Largest hidden width and depth the method accepts (settings enforce the same). */
export const MAX_HIDDEN = 1024;
export const MAX_LAYERS = 8;

/**
 * Checks that `p` is a complete, finite parameter set (used when restoring a map
 * from JSON). O(hidden * d * layers).
 * @throws RemapError naming the first bad field.
 */
export function checkNetworkParams(p: NetworkParams, fn: string): void {
  const bad = (what: string): never => {
    throw new RemapError(`${fn}: the saved gradient-net parameters are damaged (${what}); save the map again from a fresh fit.`);
  };
  if (!Number.isInteger(p.d) || p.d < 1) bad(`d = ${p.d}`);
  if (!Number.isInteger(p.hidden) || p.hidden < 1 || p.hidden > MAX_HIDDEN) bad(`hidden = ${p.hidden}`);
  if (!Number.isInteger(p.layers) || p.layers < 1 || p.layers > MAX_LAYERS) bad(`layers = ${p.layers}`);
  const sizes: [string, Float64Array, number][] = [
    ['w', p.w, p.hidden * p.d],
    ['b', p.b, p.layers * p.hidden],
    ['c', p.c, p.hidden],
    ['v', p.v, p.d * p.d],
    ['beta', p.beta, p.d],
  ];
  for (const [name, arr, len] of sizes) {
    if (!(arr instanceof Float64Array) || arr.length !== len) bad(`${name} should hold ${len} numbers`);
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) bad(`${name}[${i}] is not finite`);
  }
  for (let j = 0; j < p.hidden; j++) if (!(p.c[j] >= 0)) bad(`c[${j}] = ${p.c[j]} is negative`);
  if (!(p.alpha > 0) || !Number.isFinite(p.alpha)) bad(`alpha = ${p.alpha} must be positive`);
}
