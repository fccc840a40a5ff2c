/**
 * A seeded known-truth transport pair for benchmarks: source X ~ N(0, I_d) and
 * target grad phi(X') for an independent draw X', with the convex, non-quadratic
 *   phi(x) = 1/2 x^T A x + sum_k c_k softplus(w_k . x + b_k),   A SPD, c_k > 0.
 * grad phi(x) = A x + sum_k c_k sigmoid(w_k . x + b_k) w_k is the gradient of a
 * strictly convex function, so by Brenier's theorem it is the optimal map for
 * the squared Euclidean cost from N(0, I_d) to its image (Brenier 1991, "Polar
 * factorization and monotone rearrangement of vector-valued functions").
 * Accuracy is reported as L2-UVP = 100 * mean |T_hat(x) - grad phi(x)|^2 / Var(target),
 * Var the total variance over columns (Korotin et al. 2021, "Do Neural Optimal
 * Transport Solvers Work? A Continuous Wasserstein-2 Benchmark", section 4).
 * Every draw takes a seed; the same seed gives the same numbers on every run.
 */
import type { Points } from '../src/engine/points';
import { Random } from '../src/engine/stats/random';

/** n rows of independent standard normal coordinates, seeded (stats/random.ts). O(n d). */
export function gaussianRows(n: number, d: number, seed: number): Points {
  const r = new Random(seed);
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) data[i] = r.normal();
  return { n, d, data };
}

export interface KnownTruth {
  readonly d: number;
  /** SPD matrix A, row-major d x d. */
  readonly A: Float64Array;
  /** Softplus directions w_k (row-major K x d), offsets b_k, positive weights c_k. */
  readonly W: Float64Array;
  readonly b: Float64Array;
  readonly c: Float64Array;
  /** grad phi applied to each row. */
  gradPhi(x: Points): Points;
  /** Source draw X ~ N(0, I_d). */
  source(n: number, seed: number): Points;
  /** Target draw grad phi(X') with X' ~ N(0, I_d). */
  target(n: number, seed: number): Points;
}

/**
 * The known-truth pair in d dimensions: A = Q diag(lambda) Q^T with Q a seeded
 * random rotation and lambda spread evenly over [0.5, 2]; 2d softplus terms with
 * w_k ~ N(0, 16 I / d), b_k ~ N(0, 1), c_k ~ U(2, 4): strong enough curvature that the best linear
 * map leaves an L2-UVP of about 7-8 % (measured by bench/accuracy.bench.ts).
 * @example knownTruth(2, 1).gradPhi(gaussianRows(3, 2, 5)) // 3 mapped rows
 */
export function knownTruth(d: number, seed = 1): KnownTruth {
  const g = gaussianRows(d * d + 2 * d * (d + 1), 1, seed).data;
  let p = 0;
  // Gram-Schmidt on a Gaussian matrix gives a random orthogonal Q.
  const Q = new Float64Array(d * d);
  for (let r = 0; r < d; r++) {
    for (let k = 0; k < d; k++) Q[r * d + k] = g[p++];
    for (let s = 0; s < r; s++) {
      let dot = 0;
      for (let k = 0; k < d; k++) dot += Q[r * d + k] * Q[s * d + k];
      for (let k = 0; k < d; k++) Q[r * d + k] -= dot * Q[s * d + k];
    }
    let norm = 0;
    for (let k = 0; k < d; k++) norm += Q[r * d + k] ** 2;
    norm = Math.sqrt(norm);
    for (let k = 0; k < d; k++) Q[r * d + k] /= norm;
  }
  const A = new Float64Array(d * d);
  for (let s = 0; s < d; s++) {
    const lambda = d === 1 ? 1.25 : 0.5 + (1.5 * s) / (d - 1);
    for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) A[i * d + j] += lambda * Q[s * d + i] * Q[s * d + j];
  }
  const K = 2 * d;
  const W = new Float64Array(K * d);
  const b = new Float64Array(K);
  const c = new Float64Array(K);
  const u = new Random(seed + 7919);
  for (let k = 0; k < K; k++) {
    for (let j = 0; j < d; j++) W[k * d + j] = (4 / Math.sqrt(d)) * g[p++];
    b[k] = g[p++];
    c[k] = 2 + 2 * u.uniform();
  }
  const gradPhi = (x: Points): Points => {
    const out = new Float64Array(x.n * d);
    for (let i = 0; i < x.n; i++) {
      const xi = x.data.subarray(i * d, (i + 1) * d);
      for (let r = 0; r < d; r++) {
        let s = 0;
        for (let k = 0; k < d; k++) s += A[r * d + k] * xi[k];
        out[i * d + r] = s;
      }
      for (let k = 0; k < K; k++) {
        let z = b[k];
        for (let j = 0; j < d; j++) z += W[k * d + j] * xi[j];
        const sig = 1 / (1 + Math.exp(-z));
        for (let j = 0; j < d; j++) out[i * d + j] += c[k] * sig * W[k * d + j];
      }
    }
    return { n: x.n, d, data: out };
  };
  return {
    d,
    A,
    W,
    b,
    c,
    gradPhi,
    source: (n, s) => gaussianRows(n, d, s),
    target: (n, s) => gradPhi(gaussianRows(n, d, s)),
  };
}

/** Total variance: the sum over columns of each column's variance (divided by n). O(n d). */
export function totalVariance(p: Points): number {
  const { n, d, data } = p;
  let total = 0;
  for (let k = 0; k < d; k++) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += data[i * d + k];
    mean /= n;
    let v = 0;
    for (let i = 0; i < n; i++) v += (data[i * d + k] - mean) ** 2;
    total += v / n;
  }
  return total;
}

/** L2-UVP in percent: 100 * mean |predicted - truth|^2 / targetVariance (Korotin et al. 2021). O(n d). */
export function l2uvp(predicted: Points, truth: Points, targetVariance: number): number {
  let s = 0;
  for (let i = 0; i < predicted.data.length; i++) s += (predicted.data[i] - truth.data[i]) ** 2;
  return (100 * s) / predicted.n / targetVariance;
}

/**
 * The cosine metric of Korotin et al. (2021): the cosine between the estimated
 * and the true displacement fields, E<T_hat(x) - x, T(x) - x> divided by
 * sqrt(E|T_hat(x) - x|^2 E|T(x) - x|^2); 1 is perfect. O(n d).
 */
export function cosineMetric(x: Points, predicted: Points, truth: Points): number {
  let dot = 0;
  let a = 0;
  let b = 0;
  for (let i = 0; i < x.data.length; i++) {
    const u = predicted.data[i] - x.data[i];
    const v = truth.data[i] - x.data[i];
    dot += u * v;
    a += u * u;
    b += v * v;
  }
  return dot / Math.sqrt(a * b);
}
