import { RemapError } from '../errors';

/**
 * The standard normal distribution function Phi(x). For |x| < 3 by its power
 * series Phi(x) = 1/2 + phi(x) sum_k x^(2k+1) / (1 3 5 ... (2k+1)) (Abramowitz &
 * Stegun 1964, 26.2.11); beyond, the upper tail by its continued fraction
 * Q(x) = phi(x) / (x + 1/(x + 2/(x + 3/(x + ...)))) (A&S 26.2.14), evaluated
 * from the bottom up, so tails keep their relative accuracy. About 1e-15.
 * Cost: O(1) (at most ~90 terms).
 * @example normalCdf(1.959963984540054) // 0.975
 */
export function normalCdf(x: number): number {
  if (x !== x) return NaN;
  if (x < -3) return upperTail(-x);
  if (x > 3) return 1 - upperTail(x);
  const x2 = x * x;
  let term = x;
  let sum = x;
  for (let k = 1; k < 200; k++) {
    term *= x2 / (2 * k + 1);
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return 0.5 + density(x) * sum;
}

/** phi(x) = exp(-x^2/2) / sqrt(2 pi). */
function density(x: number): number {
  return Math.exp(-0.5 * x * x) / 2.5066282746310002;
}

/** Q(x) = 1 - Phi(x) for x >= 3, by the continued fraction, 120 levels deep (converged to double precision there). */
function upperTail(x: number): number {
  let f = x;
  for (let k = 120; k >= 1; k--) f = x + k / f;
  return density(x) / f;
}

/**
 * The standard normal quantile Phi^-1(p): Newton's method on `normalCdf`
 * (working in the nearer tail), from a start of 0. About 1e-15 relative.
 * Cost: O(1) (a few dozen evaluations at most).
 * @param p in (0, 1).
 * @throws RemapError for p outside (0, 1).
 * @example normalQuantile(0.975) // 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RemapError(`normalQuantile: p is ${p}; give a probability strictly between 0 and 1.`);
  if (p > 0.5) return -normalQuantile(1 - p);
  // Lower tail: solve Phi(x) = p for x <= 0; start from the tail's leading term when far out.
  let x = p < 1e-3 ? -Math.sqrt(-2 * Math.log(p * Math.sqrt(2 * Math.PI) * Math.sqrt(-2 * Math.log(p)))) : 0;
  for (let i = 0; i < 100; i++) {
    const f = normalCdf(x) - p;
    const step = f / density(x);
    const next = x - step;
    if (!Number.isFinite(next)) break;
    if (Math.abs(next - x) <= 1e-15 * Math.max(1, Math.abs(next))) return next;
    x = next;
  }
  return x;
}
