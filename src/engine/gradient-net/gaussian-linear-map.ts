import { symmetricFunction } from './jacobi-eigen';

/**
 * The optimal linear map between two Gaussians with covariances S (source) and
 * T (target) for the squared Euclidean cost:
 *   A = S^-1/2 (S^1/2 T S^1/2)^1/2 S^-1/2,
 * symmetric positive definite, the Jacobian of the Bures-Wasserstein map
 * (Dowson & Landau 1982; Olkin & Pukelsheim 1982). Used as the warm start of the
 * gradient network's linear part. A small ridge (1e-9 of the mean variance)
 * keeps singular covariances invertible. O(d^3).
 * @param s, t covariance matrices d x d, row-major.
 * @example gaussianLinearMap(Float64Array.of(1, 0, 0, 1), Float64Array.of(4, 0, 0, 9), 2) // [2, 0, 0, 3]
 */
export function gaussianLinearMap(s: Float64Array, t: Float64Array, d: number): Float64Array {
  let tr = 0;
  for (let i = 0; i < d; i++) tr += s[i * d + i] + t[i * d + i];
  const ridge = 1e-9 * (tr / (2 * d)) + 1e-300;
  const sr = Float64Array.from(s);
  const trg = Float64Array.from(t);
  for (let i = 0; i < d; i++) {
    sr[i * d + i] += ridge;
    trg[i * d + i] += ridge;
  }
  const sHalf = symmetricFunction(sr, d, (l) => Math.sqrt(Math.max(l, 0)));
  const sInvHalf = symmetricFunction(sr, d, (l) => 1 / Math.sqrt(Math.max(l, ridge)));
  const mid = symmetricFunction(mul(mul(sHalf, trg, d), sHalf, d), d, (l) => Math.sqrt(Math.max(l, 0)));
  const a = mul(mul(sInvHalf, mid, d), sInvHalf, d);
  for (let i = 0; i < d; i++) {
    for (let k = i + 1; k < d; k++) {
      const m = (a[i * d + k] + a[k * d + i]) / 2;
      a[i * d + k] = m;
      a[k * d + i] = m;
    }
  }
  return a;
}

/** Weighted covariance (divisor: total weight) of standardised rows. O(n d^2). */
export function covarianceOf(data: Float64Array, n: number, d: number, weights: Float64Array | null): Float64Array {
  const mean = new Float64Array(d);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    total += w;
    for (let k = 0; k < d; k++) mean[k] += w * data[i * d + k];
  }
  for (let k = 0; k < d; k++) mean[k] /= total;
  const c = new Float64Array(d * d);
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (w === 0) continue;
    for (let k = 0; k < d; k++) {
      const ek = w * (data[i * d + k] - mean[k]);
      for (let l = k; l < d; l++) c[k * d + l] += ek * (data[i * d + l] - mean[l]);
    }
  }
  for (let k = 0; k < d; k++) {
    for (let l = k; l < d; l++) {
      c[k * d + l] /= total;
      c[l * d + k] = c[k * d + l];
    }
  }
  return c;
}

function mul(a: Float64Array, b: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      let s = 0;
      for (let r = 0; r < d; r++) s += a[i * d + r] * b[r * d + k];
      out[i * d + k] = s;
    }
  }
  return out;
}
