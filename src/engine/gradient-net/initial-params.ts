import { spectralFunction, symmetricEigen } from '../stats/symmetric-eigen';
import type { NetworkParams } from './network-params';
import type { Random } from '../stats/random';

/**
 * The warm start: the network's linear part is set to the optimal linear map
 * between Gaussians with the samples' covariances (`linear`, from
 * gaussian-linear-map.ts): alpha = lambda_min(A) / 2 and V = (A - alpha I)^1/2,
 * so V^T V + alpha I = A exactly, and beta = 0 (both samples are centred). The
 * nonlinear part starts small: W has N(0, weightScale^2 / d) entries (so w . x has
 * spread about weightScale on standardised data), biases N(0, 1), and the output
 * gains c are set so that its mean Jacobian is about `share` of the identity.
 * The fit therefore starts at the Gaussian (Bures) map and training adds the
 * non-Gaussian part; this replaces a regression warm start, which would only
 * approximate the same linear map. O(hidden * d * layers + d^3).
 * @param linear A, symmetric positive definite d x d (row-major).
 * @param rng seeded generator (advanced). @param opts.weightScale > 0 (default 1.5);
 *   opts.share > 0 (default 0.1).
 * @example initialParams(2, 64, 1, Float64Array.of(1, 0, 0, 1), new Random(0)).alpha // 0.5
 */
export function initialParams(
  d: number,
  hidden: number,
  layers: number,
  linear: Float64Array,
  rng: Random,
  opts: { weightScale?: number; share?: number } = {},
): NetworkParams {
  const weightScale = opts.weightScale ?? 1.5;
  const share = opts.share ?? 0.1;
  const lo = symmetricEigen(linear, d).values[0];
  const alpha = Math.max(lo / 2, 1e-6);
  const shifted = Float64Array.from(linear);
  for (let i = 0; i < d; i++) shifted[i * d + i] -= alpha;
  const v = spectralFunction(symmetricEigen(shifted, d), (l) => Math.sqrt(Math.max(l, 0)));
  const w = new Float64Array(hidden * d);
  const sd = weightScale / Math.sqrt(d);
  for (let i = 0; i < w.length; i++) w[i] = sd * rng.normal();
  const b = new Float64Array(layers * hidden);
  for (let i = 0; i < b.length; i++) b[i] = rng.normal() - (i >= hidden ? 0.5 : 0);
  // Mean unit gain: E[h'(u)] for the closed form (h' <= 1/16), E[s'(z)] for the cascade (s' <= 1/4).
  const meanGain = layers === 1 ? 0.035 : 0.2;
  const cValue = Math.max(1e-4, (share * d) / (hidden * meanGain * weightScale * weightScale));
  const c = new Float64Array(hidden).fill(cValue);
  return { d, hidden, layers, w, b, c, v, alpha, beta: new Float64Array(d) };
}

/**
 * The same parameters with every output gain c set to 0: the network is then
 * exactly its linear part, F(x) = (V^T V + alpha I) x + beta, so the Gaussian
 * warm start without its small random nonlinear part (the linear method's map,
 * in standardised units). A new object; `p` is not changed. O(hidden).
 * @example new Float64Network(linearOnly(p)).forward(x, out) // out = A x
 */
export function linearOnly(p: NetworkParams): NetworkParams {
  return { ...p, c: new Float64Array(p.hidden) };
}
