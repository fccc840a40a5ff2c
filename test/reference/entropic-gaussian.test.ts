/**
 * The entropic cost against the closed form for entropic transport between Gaussians
 * (Janati, Muzellec, Peyre & Cuturi 2020, "Entropic optimal transport between unbalanced Gaussian
 * measures has a closed form", NeurIPS, Theorem 1, balanced case; the formula is also in Mallasto,
 * Gerolin & Minh 2021, "Entropy-regularized 2-Wasserstein distance between Gaussian measures").
 * In one dimension with N(m_a, a^2), N(m_b, b^2), cost |x - y|^2 and regularisation 2 s KL:
 *   OT_s = (m_a - m_b)^2 + a^2 + b^2 - D + s log(D + s) + s (1 - log 2s),  D = sqrt(4 a^2 b^2 + s^2),
 * and the Sinkhorn divergence is S_s = OT_s(a, b) - (OT_s(a, a) + OT_s(b, b)) / 2. The project's cost
 * is |x - y|^2 / 2 with eps KL, so its reported w2Squared (2 x its divergence) is S_s at s = eps.
 * The samples are quantile grids of the two Gaussians (x_i = m + sd * probit((i + 0.5) / n), simple-statistics).
 */
import { probit } from 'simple-statistics';
import { fitEntropic } from '../../src/engine/entropic/fit';
import { gaussianDivergence } from '../../src/engine/entropic/gaussian-divergence';
import type { Sample } from '../../src/engine/points';

function ot1d(ma: number, a: number, mb: number, b: number, s: number): number {
  const D = Math.sqrt(4 * a * a * b * b + s * s);
  return (ma - mb) ** 2 + a * a + b * b - D + s * Math.log(D + s) + s * (1 - Math.log(2 * s));
}
function divergence1d(ma: number, a: number, mb: number, b: number, s: number): number {
  return ot1d(ma, a, mb, b, s) - (ot1d(ma, a, ma, a, s) + ot1d(mb, b, mb, b, s)) / 2;
}
function grid(n: number, mean: number, sd: number): Sample {
  return { n, d: 1, data: Float64Array.from({ length: n }, (_, i) => mean + sd * probit((i + 0.5) / n)), weights: null };
}

describe('reference: entropic cost between Gaussians', () => {
  // N(0, 1) to N(1, 2^2): W2^2 = (0 - 1)^2 + (1 - 2)^2 = 2 (Gelbrich's formula in one dimension).
  const source = grid(1500, 0, 1);
  const target = grid(1500, 1, 2);
  // The grids' own standard deviations (slightly below 1 and 2: the quantile grid trims the tails).
  const sd = (s: Sample): number => {
    const m = s.data.reduce((t, v) => t + v, 0) / s.n;
    return Math.sqrt(s.data.reduce((t, v) => t + (v - m) ** 2, 0) / s.n);
  };
  const a = sd(source);
  const b = sd(target);

  test.each([0.1, 0.5, 2])('at eps = %p (raw units) 2 x the Sinkhorn divergence matches the closed form to 1 %', (eps) => {
    const map = fitEntropic(source, target, { smoothing: eps, units: 'raw', tolerance: 1e-8, max_iterations: 20000 });
    const expected = divergence1d(0, a, 1, b, eps);
    expect(Math.abs(map.cost().w2Squared - expected) / expected).toBeLessThan(0.01);
  });

  test('the bias is downward: below W2^2 = 2 at every eps, falling towards the squared mean gap 1 as eps grows', () => {
    // Source: closed form above; and as eps grows S_s tends to E c(X, Y) - (E c(X, X') + E c(Y, Y')) / 2 = (m_a - m_b)^2
    // (Feydy et al. 2019, "Interpolating between optimal transport and MMD using Sinkhorn divergences", section 3).
    const w2 = (0 - 1) ** 2 + (a - b) ** 2;
    let previous = w2;
    for (const eps of [0.05, 0.5, 5, 50]) {
      const got = fitEntropic(source, target, { smoothing: eps, units: 'raw', tolerance: 1e-8, max_iterations: 20000 }).cost().w2Squared;
      expect(got).toBeLessThan(previous);
      previous = got;
    }
    expect(previous).toBeGreaterThan(1);
    expect(previous).toBeLessThan(1.1);
  });

  test('gaussianDivergence (the d-dimensional form the cost note uses) agrees with the one-dimensional formula and with Gelbrich in 2-D', () => {
    const one = gaussianDivergence(Float64Array.of(0), Float64Array.of(1), Float64Array.of(1), Float64Array.of(4), 1, 0.5);
    expect(one.divergence2).toBeCloseTo(divergence1d(0, 1, 1, 2, 0.5), 12);
    expect(one.w2Squared).toBeCloseTo(2, 12);
    // Source: diagonal covariances split into independent coordinates, so the 2-D value is the sum of two 1-D ones.
    const two = gaussianDivergence(Float64Array.of(0, 0), Float64Array.of(1, 0, 0, 9), Float64Array.of(1, -2), Float64Array.of(4, 0, 0, 1), 2, 0.5);
    expect(two.divergence2).toBeCloseTo(divergence1d(0, 1, 1, 2, 0.5) + divergence1d(0, 3, -2, 1, 0.5), 10);
    // Source: Gelbrich (1990): |m_a - m_b|^2 + (1 - 2)^2 + (3 - 1)^2 = 5 + 1 + 4.
    expect(two.w2Squared).toBeCloseTo(10, 10);
  });

  test('the fitted map reports the downward bias in its cost note', () => {
    const note = fitEntropic(source, target, { smoothing: 0.5, units: 'raw' }).cost().note;
    expect(note).toMatch(/biased downward/);
    // Source: closed form above: (2 - S_0.5) / 2 in percent, with the grid's own a and b.
    const pct = (100 * (a * a + b * b - 2 * a * b + 1 - divergence1d(0, a, 1, b, 0.5))) / (1 + (a - b) ** 2);
    expect(note).toContain(`${Number(pct.toPrecision(3))} % below W2^2`);
  });
});
