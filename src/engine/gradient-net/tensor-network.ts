import * as tf from '@tensorflow/tfjs-core';
import type { NetworkParams } from './network-params';

/**
 * The trainable gradient network in tfjs (float32), with the same formulas as
 * Float64Network (see network-params.ts):
 *   layers = 1: F(x) = W^T diag(c) [h(Wx + b_0) - h(b_0)] + (V^T V + alpha I) x + beta,
 *               h = s^2/2 - s^3/3 (closed-form input convex gradient network, arXiv 2111.12187);
 *   layers >= 2: cascaded monotone gradient network (arXiv 2301.10862).
 * Positive quantities are stored unconstrained: c = softplus(cRaw), alpha = softplus(aRaw),
 * so every value of the variables gives a monotone map.
 *
 * All weights live in ONE flat variable theta = [W^T (d x hidden), b (layers x hidden),
 * cRaw (hidden), V (d x d), aRaw (1), beta (d)] and are sliced out per call: tfjs pays a
 * fixed overhead per op, and Adam on one variable is about 10 ops instead of 10 per
 * weight tensor. W is stored transposed so the forward pass needs no transposed
 * matMul (slow on wasm). Owns its tensors: call dispose() exactly once.
 */
export class TensorNetwork {
  readonly d: number;
  readonly hidden: number;
  readonly layers: number;
  readonly theta: tf.Variable;
  private readonly eye: tf.Tensor2D;
  private readonly half: tf.Scalar;
  private readonly third: tf.Scalar;
  private readonly sizes: number[];

  /**
   * Creates the variable from float64 parameters (rounded to float32); `params.c`
   * and `params.alpha` are the positive values, stored as softplus^-1 of them.
   * O(hidden * d * layers).
   */
  constructor(params: NetworkParams) {
    const { d, hidden, layers } = params;
    this.d = d;
    this.hidden = hidden;
    this.layers = layers;
    this.sizes = [d * hidden, layers * hidden, hidden, d * d, 1, d];
    const flat = new Float32Array(this.sizes.reduce((a, b) => a + b, 0));
    let o = 0;
    for (let k = 0; k < d; k++) for (let j = 0; j < hidden; j++) flat[o++] = params.w[j * d + k];
    for (let i = 0; i < layers * hidden; i++) flat[o++] = params.b[i];
    for (let j = 0; j < hidden; j++) flat[o++] = softplusInverse(params.c[j]);
    for (let i = 0; i < d * d; i++) flat[o++] = params.v[i];
    flat[o++] = softplusInverse(params.alpha);
    for (let k = 0; k < d; k++) flat[o++] = params.beta[k];
    const t = tf.tensor1d(flat);
    this.theta = tf.variable(t, true);
    t.dispose();
    this.eye = tf.eye(d) as tf.Tensor2D;
    this.half = tf.scalar(0.5);
    this.third = tf.scalar(1 / 3);
  }

  /**
   * F(x) for a batch x (n x d). Call inside tf.tidy or a gradient function.
   * Cost O(n * hidden * (d + layers) + n d^2).
   */
  apply(x: tf.Tensor2D): tf.Tensor2D {
    const { d, hidden, layers } = this;
    const [wtFlat, bFlat, cRaw, vFlat, aRaw, beta] = tf.split(this.theta, this.sizes);
    const wt = tf.reshape(wtFlat, [d, hidden]) as tf.Tensor2D;
    const w = tf.transpose(wt); // hidden x d, once per call
    const b = tf.reshape(bFlat, [layers, hidden]);
    const c = tf.softplus(cRaw);
    const xw = tf.matMul(x, wt);
    let act: tf.Tensor;
    if (layers === 1) {
      const b0 = tf.reshape(b, [hidden]);
      const s = tf.sigmoid(tf.add(xw, b0));
      const s0 = tf.sigmoid(b0);
      act = tf.mul(tf.sub(this.energy(s), this.energy(s0)), c);
    } else {
      const bs = tf.unstack(b);
      let z: tf.Tensor = tf.add(xw, bs[0]);
      for (let l = 1; l < layers; l++) z = tf.add(tf.add(xw, tf.sigmoid(z)), bs[l]);
      act = tf.mul(tf.sigmoid(z), c);
    }
    const v = tf.reshape(vFlat, [d, d]) as tf.Tensor2D;
    const lin = tf.add(tf.matMul(tf.transpose(v), v), tf.mul(this.eye, tf.softplus(aRaw)));
    return tf.add(tf.add(tf.matMul(act as tf.Tensor2D, w), tf.matMul(x, lin as tf.Tensor2D)), beta) as tf.Tensor2D;
  }

  /** Copies theta into float64 parameters (positive values, W hidden x d). Synchronous read. */
  toParams(): NetworkParams {
    return paramsFromFlat(this.theta.dataSync() as Float32Array, this.d, this.hidden, this.layers);
  }

  dispose(): void {
    this.theta.dispose();
    this.eye.dispose();
    this.half.dispose();
    this.third.dispose();
  }

  /** h(u) = s^2 (1/2 - s/3) from s = sigmoid(u), elementwise, with constant scalars (no per-call tensors). */
  private energy(s: tf.Tensor): tf.Tensor {
    return tf.mul(tf.square(s), tf.sub(this.half, tf.mul(s, this.third)));
  }
}

/** Float64 parameters from the flat float32 layout of TensorNetwork.theta. O(size). */
export function paramsFromFlat(flat: ArrayLike<number>, d: number, hidden: number, layers: number): NetworkParams {
  let o = 0;
  const w = new Float64Array(hidden * d);
  for (let k = 0; k < d; k++) for (let j = 0; j < hidden; j++) w[j * d + k] = flat[o++];
  const b = new Float64Array(layers * hidden);
  for (let i = 0; i < b.length; i++) b[i] = flat[o++];
  const c = new Float64Array(hidden);
  for (let j = 0; j < hidden; j++) c[j] = softplus(flat[o++]);
  const v = new Float64Array(d * d);
  for (let i = 0; i < v.length; i++) v[i] = flat[o++];
  const alpha = softplus(flat[o++]);
  const beta = new Float64Array(d);
  for (let k = 0; k < d; k++) beta[k] = flat[o++];
  return { d, hidden, layers, w, b, c, v, alpha, beta };
}

/** log(1 + e^x) in float64, overflow-safe. @example softplus(0) // 0.693... */
export function softplus(x: number): number {
  return x > 30 ? x : x < -30 ? Math.exp(x) : Math.log1p(Math.exp(x));
}

/** The x with softplus(x) = y, for y > 0. @example softplusInverse(Math.LN2) // 0 */
export function softplusInverse(y: number): number {
  return y > 30 ? y : Math.log(Math.expm1(y));
}
