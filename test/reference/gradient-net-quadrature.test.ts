import { Float64Network } from '../../src/engine/gradient-net/float64-network';
import { gaussLegendre01 } from '../../src/engine/gradient-net/gauss-legendre';
import { sigmoid } from '../../src/engine/gradient-net/sigmoid-energy';
import { Random } from '../../src/engine/stats/random';
import { randomParams } from '../engine/gradient-net/helpers';

/**
 * The defining integral of an input convex gradient network
 * (Source: Richter-Powell, Lorraine & Amos, arXiv 2111.12187, eq. for F(x) = int_0^1 J(tx)^T J(tx) x dt),
 * evaluated by Gauss-Legendre quadrature, with J stacked from the hidden layer
 * diag(sqrt(c) s'(W t x + b)) W, the linear units V and sqrt(alpha) I.
 */
function integral(p: ReturnType<typeof randomParams>, x: Float64Array, k: number): Float64Array {
  const { d, hidden, w, b, c, v, alpha, beta } = p;
  const { nodes, weights } = gaussLegendre01(k);
  const out = Float64Array.from(beta);
  const wx = new Float64Array(hidden);
  for (let j = 0; j < hidden; j++) for (let q = 0; q < d; q++) wx[j] += w[j * d + q] * x[q];
  for (let i = 0; i < k; i++) {
    const t = nodes[i];
    for (let j = 0; j < hidden; j++) {
      const s = sigmoid(t * wx[j] + b[j]);
      const g = c[j] * (s * (1 - s)) ** 2 * wx[j];
      for (let q = 0; q < d; q++) out[q] += weights[i] * g * w[j * d + q];
    }
  }
  // Linear units: int_0^1 (V^T V + alpha I) x dt = (V^T V + alpha I) x.
  for (let q = 0; q < d; q++) {
    let s = alpha * x[q];
    for (let r = 0; r < d; r++) for (let l = 0; l < d; l++) s += v[r * d + q] * v[r * d + l] * x[l];
    out[q] += s;
  }
  return out;
}

describe('closed-form gradient network against its defining integral', () => {
  test('W^T diag(c) [h(Wx+b) - h(b)] + (V^T V + alpha I) x + beta equals the Gauss-Legendre integral to 1e-6 (float64)', () => {
    const rng = new Random(11);
    for (const [d, m] of [
      [1, 5],
      [2, 16],
      [5, 64],
    ]) {
      const p = randomParams(d, m, 1, 100 + d);
      const net = new Float64Network(p);
      const f = new Float64Array(d);
      for (let rep = 0; rep < 10; rep++) {
        const x = Float64Array.from({ length: d }, () => 2 * rng.normal());
        net.forward(x, f);
        const q = integral(p, x, 40);
        // Source: design choice (1e-6: a 40-node Gauss-Legendre rule on a smooth integrand is far more accurate)
        for (let k = 0; k < d; k++) expect(Math.abs(f[k] - q[k])).toBeLessThan(1e-6 * (1 + Math.abs(q[k])));
      }
    }
  });

  test('a coarse 2-node rule is visibly off, so the comparison can fail', () => {
    const p = randomParams(2, 16, 1, 7);
    const net = new Float64Network(p);
    const x = Float64Array.of(2.5, -1.5);
    const f = new Float64Array(2);
    net.forward(x, f);
    const q = integral(p, x, 2);
    expect(Math.max(Math.abs(f[0] - q[0]), Math.abs(f[1] - q[1]))).toBeGreaterThan(1e-4);
  });
});
