import type { NetworkParams } from '../../../src/engine/gradient-net/network-params';
import { Random } from '../../../src/engine/stats/random';

/** Random but fixed network parameters for tests (d columns, m units, L layers). */
export function randomParams(d: number, m: number, layers: number, seed: number): NetworkParams {
  const r = new Random(seed);
  const arr = (len: number, f: () => number) => Float64Array.from({ length: len }, f);
  return {
    d,
    hidden: m,
    layers,
    w: arr(m * d, () => r.normal()),
    b: arr(layers * m, () => r.normal()),
    c: arr(m, () => 0.2 + r.uniform()),
    v: arr(d * d, () => 0.5 * r.normal()),
    alpha: 0.3,
    beta: arr(d, () => r.normal()),
  };
}

/**
 * The closed form of the one-layer network written out directly (network-params.ts; Richter-Powell, Lorraine & Amos,
 * "Input Convex Gradient Networks", arXiv 2111.12187): F(x) = W^T diag(c) [h(W x + b) - h(b)] + (V^T V + alpha I) x + beta,
 * h(u) = s^2/2 - s^3/3 with s the logistic sigmoid, evaluated unit by unit with no shared code from the engine.
 */
export function closedForm(p: NetworkParams, x: ArrayLike<number>): number[] {
  const { d, hidden, w, b, c, v, alpha, beta } = p;
  const logistic = (t: number) => (t >= 0 ? 1 / (1 + Math.exp(-t)) : Math.exp(t) / (1 + Math.exp(t)));
  const h = (t: number) => logistic(t) ** 2 / 2 - logistic(t) ** 3 / 3;
  const f = Array.from(beta);
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      let vtv = 0;
      for (let r = 0; r < d; r++) vtv += v[r * d + i] * v[r * d + k];
      f[i] += (vtv + (i === k ? alpha : 0)) * x[k];
    }
  }
  for (let j = 0; j < hidden; j++) {
    let u = b[j];
    for (let k = 0; k < d; k++) u += w[j * d + k] * x[k];
    const a = c[j] * (h(u) - h(b[j]));
    for (let i = 0; i < d; i++) f[i] += w[j * d + i] * a;
  }
  return f;
}
