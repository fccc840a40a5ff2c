import { BACKENDS, tf, useBackend } from './tf-backends';
import { Float64Network } from '../../../src/engine/gradient-net/float64-network';
import { smallestEigenvalue } from '../../../src/engine/stats/smallest-eigenvalue';
import { Random } from '../../../src/engine/stats/random';
import { TensorNetwork } from '../../../src/engine/gradient-net/tensor-network';
import { closedForm, randomParams } from './helpers';

describe.each(BACKENDS)('on the %s backend', (backend) => {
  beforeAll(() => useBackend(backend));

  describe('Float64Network: F is the gradient of a strongly convex function', () => {
    for (const layers of [1, 2, 3]) {
      test(`layers = ${layers}: the analytic Jacobian matches central differences and is symmetric with eigenvalues >= alpha`, () => {
        const d = 3;
        const p = randomParams(d, 12, layers, 5 + layers);
        const net = new Float64Network(p);
        const rng = new Random(layers);
        const jac = new Float64Array(d * d);
        const fp = new Float64Array(d);
        const fm = new Float64Array(d);
        for (let rep = 0; rep < 20; rep++) {
          const x = Float64Array.from({ length: d }, () => 2 * rng.normal());
          net.jacobian(x, jac);
          for (let k = 0; k < d; k++) {
            const e = 1e-6;
            const xp = Float64Array.from(x);
            const xm = Float64Array.from(x);
            xp[k] += e;
            xm[k] -= e;
            net.forward(xp, fp);
            net.forward(xm, fm);
            // Column k of the Jacobian: dF/dx_k. Source: common practice, central differences O(e^2).
            for (let i = 0; i < d; i++) expect(Math.abs((fp[i] - fm[i]) / (2 * e) - jac[i * d + k])).toBeLessThan(1e-6);
          }
          for (let i = 0; i < d; i++) for (let k = 0; k < d; k++) expect(jac[i * d + k]).toBe(jac[k * d + i]);
          expect(smallestEigenvalue(jac, d)).toBeGreaterThanOrEqual(p.alpha - 1e-12);
        }
      });

      test(`layers = ${layers}: tfjs autodiff of <v, F(x)> gives J v and F matches float64 within float32 rounding`, () => {
        const d = 3;
        const p = randomParams(d, 12, layers, 50 + layers);
        const f64 = new Float64Network(p);
        const tnet = new TensorNetwork(p);
        const rng = new Random(9);
        const x = Float64Array.from({ length: d }, () => rng.normal());
        const v = Float64Array.from({ length: d }, () => rng.normal());
        const [fx, grad] = tf.tidy(() => {
          const xt = tf.tensor2d(Float32Array.from(x), [1, d]);
          const vt = tf.tensor2d(Float32Array.from(v), [1, d]);
          const g = tf.grad((z: tf.Tensor) => tf.sum(tf.mul(tnet.apply(z as tf.Tensor2D), vt)))(xt);
          return [tnet.apply(xt).dataSync(), g.dataSync()];
        });
        tnet.dispose();
        const f = new Float64Array(d);
        f64.forward(x, f);
        const jac = new Float64Array(d * d);
        f64.jacobian(x, jac);
        for (let i = 0; i < d; i++) {
          expect(Math.abs(fx[i] - f[i])).toBeLessThan(1e-4 * (1 + Math.abs(f[i]))); // Source: float32 epsilon 1.2e-7 times a few hundred ops
          let jv = 0;
          for (let k = 0; k < d; k++) jv += jac[i * d + k] * v[k];
          expect(Math.abs(grad[i] - jv)).toBeLessThan(1e-4 * (1 + Math.abs(jv)));
        }
      });
    }

    test('F(0) = beta when the nonlinear part is centred (layers = 1)', () => {
      const p = randomParams(2, 8, 1, 3);
      const out = new Float64Array(2);
      new Float64Network(p).forward(new Float64Array(2), out);
      expect(out[0]).toBeCloseTo(p.beta[0], 14); // Source: h(b) - h(b) = 0 at x = 0
      expect(out[1]).toBeCloseTo(p.beta[1], 14);
    });
  });
});

describe('Float64Network.forwardRows', () => {
  test('gives the same numbers as forward row by row (closed form and cascade)', () => {
    for (const layers of [1, 2]) {
      const d = 3;
      const net = new Float64Network(randomParams(d, 10, layers, 40 + layers));
      const r = new Random(9);
      // Rows include far-out values, where the sigmoid saturates (e^-u overflows to Infinity).
      const x = Float64Array.from({ length: 7 * d }, (_, j) => (j === 4 ? 900 : j === 5 ? -900 : 3 * r.normal()));
      const out = new Float64Array(x.length);
      net.forwardRows(x, 7, out);
      const f = new Float64Array(d);
      for (let i = 0; i < 7; i++) {
        net.forward(x.slice(i * d, (i + 1) * d), f);
        // Source: the same formula (network-params.ts); only the order of float64 operations may differ.
        for (let k = 0; k < d; k++) expect(Math.abs(out[i * d + k] - f[k])).toBeLessThan(1e-12 * (1 + Math.abs(f[k])));
      }
    }
  });
});

describe('Float64Network.forwardColumns (the path that applies a map)', () => {
  test.each([1, 2, 3, 4, 5, 7, 9])('d = %i: equals the closed form written out directly, to 1e-12', (d) => {
    const p = randomParams(d, 16, 1, 70 + d);
    const net = new Float64Network(p);
    const r = new Random(d);
    const m = 37;
    // A few coordinates far out, where the sigmoid saturates (e^-u overflows to Infinity or underflows to 0).
    const x = Array.from({ length: d }, (_, k) => Float64Array.from({ length: m }, (_, i) => (i === 3 ? 800 * (k % 2 ? 1 : -1) : 3 * r.normal())));
    const out = net.columns(m);
    net.forwardColumns(x, m, out);
    for (let i = 0; i < m; i++) {
      const want = closedForm(
        p,
        x.map((col) => col[i]),
      );
      // Source: the closed form of arXiv 2111.12187 (network-params.ts); only the order of float64 operations differs.
      for (let k = 0; k < d; k++) expect(Math.abs(out[k][i] - want[k])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want[k])));
    }
  });

  test('layers = 2 (the cascade) gives the numbers of forward row by row', () => {
    const d = 3;
    const net = new Float64Network(randomParams(d, 10, 2, 12));
    const r = new Random(4);
    const x = Array.from({ length: d }, () => Float64Array.from({ length: 5 }, () => r.normal()));
    const out = net.columns(5);
    net.forwardColumns(x, 5, out);
    const f = new Float64Array(d);
    for (let i = 0; i < 5; i++) {
      net.forward(
        Float64Array.from(x, (col) => col[i]),
        f,
      );
      for (let k = 0; k < d; k++) expect(out[k][i]).toBe(f[k]); // Source: design choice, the cascade is evaluated row by row by forward itself
    }
  });
});
