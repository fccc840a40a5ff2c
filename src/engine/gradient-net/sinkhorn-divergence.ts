import * as tf from '@tensorflow/tfjs-core';

/**
 * The debiased Sinkhorn divergence (Feydy, Sejourne, Vialard, Amari, Trouve &
 * Peyre, "Interpolating between Optimal Transport and MMD using Sinkhorn
 * Divergences", arXiv 1810.08278, eq. 3 and sec. 3.1) between two uniformly
 * weighted point clouds x (n x d) and y (m x d), cost C(x, y) = |x - y|^2,
 * computed by tfjs in the log domain:
 *   S_eps(a, b) = OT_eps(a, b) - OT_eps(a, a)/2 - OT_eps(b, b)/2,
 *   OT_eps(a, b) = <a, f> + <b, g> at the optimal dual potentials,
 *   softmin update f_i = -eps log sum_j b_j exp((g_j - C_ij) / eps).
 * A fixed number of symmetric (averaged) updates with epsilon-scaling: eps falls
 * geometrically from the squared diameter to blur^2 over the first two thirds of
 * the iterations (the annealing of Feydy's thesis, sec. 3.3.3), then stays.
 *
 * Training uses the float64 version in batch-sinkhorn.ts (same formulas; as fast as
 * this one on wasm and ten times faster than it on the cpu backend, see the bench).
 * This tensor version is kept for that comparison and for tf.grad checks.
 */
export interface SinkhornSetup {
  /** Target blur (eps = blur^2), in the units of x and y. */
  readonly blur: number;
  /** Squared diameter bound of the clouds (start of the annealing). */
  readonly diameter2: number;
  /** Number of Sinkhorn iterations, >= 1. */
  readonly iterations: number;
}

/** Dual potentials at the final eps, as 1-D tensors (owned by the caller's tidy). */
export interface SinkhornPotentials {
  readonly g: tf.Tensor1D; // on y, from the x-y problem
  readonly p: tf.Tensor1D; // on x, symmetric x-x problem
  readonly q: tf.Tensor1D; // on y, symmetric y-y problem
  readonly eps: number;
}

/** The eps schedule of `iterations` values (geometric, then flat at blur^2). */
export function epsSchedule(s: SinkhornSetup): number[] {
  const last = s.blur * s.blur;
  const first = Math.max(s.diameter2, last);
  const ramp = Math.max(1, Math.ceil((2 * s.iterations) / 3));
  const out: number[] = [];
  for (let k = 0; k < s.iterations; k++) out.push(k >= ramp - 1 ? last : first * Math.pow(last / first, k / (ramp - 1)));
  return out;
}

/** |x_i - y_j|^2 as an n x m tensor; `yt` is y transposed (d x m). */
export function squaredDistances(x: tf.Tensor2D, yt: tf.Tensor2D): tf.Tensor2D {
  const x2 = tf.sum(tf.square(x), 1, true); // n x 1
  const y2 = tf.sum(tf.square(yt), 0); // m
  return tf.relu(tf.add(tf.sub(x2, tf.mul(tf.matMul(x, yt), 2)), y2)) as tf.Tensor2D;
}

/**
 * softmin_eps over columns: out_i = -eps log( (1/m) sum_j exp((h_j - C_ij)/eps) ),
 * h a 1-D potential on the m columns of C. O(n m).
 */
export function softmin(c: tf.Tensor2D, h: tf.Tensor1D | null, eps: number): tf.Tensor1D {
  const m = c.shape[1];
  const inner = h ? tf.div(tf.sub(h, c), eps) : tf.div(c, -eps);
  return tf.mul(tf.sub(tf.logSumExp(inner, 1), Math.log(m)), -eps) as tf.Tensor1D;
}

/**
 * Runs the Sinkhorn iterations for the x-y, x-x and y-y problems (no gradient
 * is recorded: call inside tf.tidy, outside any gradient function). The caller
 * disposes the returned potentials (tidy does it). O(iterations * (n + m)^2).
 */
export function sinkhornPotentials(x: tf.Tensor2D, y: tf.Tensor2D, setup: SinkhornSetup): SinkhornPotentials {
  const xt = tf.transpose(x) as tf.Tensor2D;
  const yt = tf.transpose(y) as tf.Tensor2D;
  const cxy = squaredDistances(x, yt);
  const cyx = tf.transpose(cxy) as tf.Tensor2D;
  const cxx = squaredDistances(x, xt);
  const cyy = squaredDistances(y, yt);
  const schedule = epsSchedule(setup);
  let eps = schedule[0];
  let f = softmin(cxy, null, eps);
  let g = softmin(cyx, null, eps);
  let p = softmin(cxx, null, eps);
  let q = softmin(cyy, null, eps);
  for (let k = 1; k < schedule.length; k++) {
    eps = schedule[k];
    const fn = softmin(cxy, g, eps);
    const gn = softmin(cyx, f, eps);
    const pn = softmin(cxx, p, eps);
    const qn = softmin(cyy, q, eps);
    f = tf.mul(tf.add(f, fn), 0.5);
    g = tf.mul(tf.add(g, gn), 0.5);
    p = tf.mul(tf.add(p, pn), 0.5);
    q = tf.mul(tf.add(q, qn), 0.5);
  }
  // Last extrapolation (no averaging) at the final eps.
  const gLast = softmin(cyx, f, eps);
  const qLast = softmin(cyy, q, eps);
  const pLast = softmin(cxx, p, eps);
  return { g: gLast, p: pLast, q: qLast, eps };
}

/**
 * The Sinkhorn divergence as a differentiable function of x with the potentials
 * held fixed (the envelope theorem: at the optimal potentials, d OT/dx_i =
 * sum_j pi_ij dC(x_i, y_j)/dx_i, which is what differentiating
 * <a, softmin(C(x, y), g)> with g fixed gives; for OT(a, a) the one softmin
 * differentiated in both arguments of C(x, x) gives the factor 2 it needs).
 * Value: <a, f~> + <b, g> - (<a, p~> + <a, p>)/2 - <b, q>. Call inside a
 * gradient function; O((n + m)^2 d).
 */
export function sinkhornDivergenceAt(x: tf.Tensor2D, y: tf.Tensor2D, pot: SinkhornPotentials): tf.Scalar {
  const yt = tf.transpose(y) as tf.Tensor2D;
  const xt = tf.transpose(x) as tf.Tensor2D;
  const f = softmin(squaredDistances(x, yt), pot.g, pot.eps);
  const pTilde = softmin(squaredDistances(x, xt), pot.p, pot.eps);
  const live = tf.sub(tf.mean(f), tf.mul(tf.mean(pTilde), 0.5));
  const fixed = tf.sub(tf.sub(tf.mean(pot.g), tf.mul(tf.mean(pot.p), 0.5)), tf.mean(pot.q));
  return tf.add(live, fixed) as tf.Scalar;
}
