import type { ColumnUnits } from '../stats/column-scales';
import type { Points } from '../points';
import { gaussianDivergence } from './gaussian-divergence';

/**
 * The text beside the entropic cost. Twice the debiased Sinkhorn divergence is
 * biased DOWNWARD as an estimate of the squared 2-Wasserstein distance: it tends
 * to W2^2 as eps shrinks and to |mean difference|^2 as eps grows (then the
 * divergence is E c(X, Y) - (E c(X, X') + E c(Y, Y')) / 2 = |mean_a - mean_b|^2 / 2
 * for c = |x - y|^2 / 2; Feydy et al. 2019, section 3). How far down at the eps
 * used is estimated from the Gaussians with the samples' means and covariances
 * (closed form of Janati et al. 2020, see `gaussianDivergence`), and said in
 * the note. O((n + m) d^2 + d^3).
 * @param x, y the supports in fitted units (centred), logA, logB their log-masses.
 * @param meanGap the mean difference in fitted units, as a vector (length d).
 * @example costNote(0.05, 'standardised', x, logA, y, logB, gap, 2.1) // 'Debiased Sinkhorn divergence at smoothing 0.05, ...'
 */
export function costNote(
  eps: number,
  units: ColumnUnits,
  x: Points,
  logA: Float64Array,
  y: Points,
  logB: Float64Array,
  meanGap: Float64Array,
  w2Squared: number,
): string {
  const d = x.d;
  const where = units === 'standardised' ? 'in standardised units (each column divided by its pooled spread)' : "in the data's units";
  let bias = '';
  try {
    const g = gaussianDivergence(new Float64Array(d), covariance(x, logA), meanGap, covariance(y, logB), d, eps);
    if (g.w2Squared > 0) {
      const pct = (100 * (g.w2Squared - g.divergence2)) / g.w2Squared;
      bias = ` For Gaussians with these means and covariances it lies ${fmt(pct)} % below W2^2 at this smoothing (closed form of Janati et al. 2020).`;
    }
  } catch {
    bias = '';
  }
  return (
    `Twice the debiased Sinkhorn divergence at smoothing ${fmt(eps)}, ${where}: an estimate of W2^2 (${fmt(w2Squared)}) that is biased downward: ` +
    `it tends to the squared distance between the means as the smoothing grows and to W2^2 as it shrinks.${bias}`
  );
}

/** Weighted covariance of centred points (masses exp(logW)), row-major d x d. O(n d^2). */
function covariance(p: Points, logW: Float64Array): Float64Array {
  const { n, d, data } = p;
  const mean = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    const w = Math.exp(logW[i]);
    for (let k = 0; k < d; k++) mean[k] += w * data[i * d + k];
  }
  const out = new Float64Array(d * d);
  for (let i = 0; i < n; i++) {
    const w = Math.exp(logW[i]);
    for (let a = 0; a < d; a++) {
      const za = w * (data[i * d + a] - mean[a]);
      for (let b = a; b < d; b++) out[a * d + b] += za * (data[i * d + b] - mean[b]);
    }
  }
  for (let a = 0; a < d; a++) for (let b = 0; b < a; b++) out[a * d + b] = out[b * d + a];
  return out;
}

function fmt(v: number): string {
  return Number(v.toPrecision(3)).toString();
}
