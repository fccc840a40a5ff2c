/**
 * The over-relaxation to use next, given the error decay rate `rho` observed
 * under the current `omega` (both per iteration). For the linearised Sinkhorn
 * step the rate of the over-relaxed iteration follows Young's SOR relation
 * (Lehmann, von Renesse, Sambale & Uschmajew 2021, "A note on overrelaxation
 * in the Sinkhorn algorithm", Optimization Letters; the relation of their
 * Theorem 1): for omega below the optimum,
 *   sqrt(rho) = (omega mu + sqrt(omega^2 mu^2 - 4 (omega - 1))) / 2,
 * with mu^2 the rate of the plain iteration. Solving for mu gives
 *   mu = (rho + omega - 1) / (sqrt(rho) omega),
 * and the optimum is 2 / (1 + sqrt(1 - mu^2)). At or above the optimum
 * rho = omega - 1, so a rate within 0.02 of that (or no decay at all) leaves
 * omega as it is. Only ever raises omega, and never above `cap`. O(1).
 * Why: the first choice of omega comes from the first few plain iterations of
 * the last stage, whose decay is often faster than the slowest mode's; on the
 * scenarios demo this left the solve at a rate of 0.96 per iteration where
 * the re-estimated omega gives about 0.9.
 * @param omega the current over-relaxation (1 <= omega < 2).
 * @param rho the observed geometric decay of the marginal error per iteration.
 * @param cap the largest omega allowed (< 2).
 * @example raisedOmega(1.5, 0.9, 1.9) // about 1.69
 */
export function raisedOmega(omega: number, rho: number, cap: number): number {
  if (!(rho > omega - 1 + 0.02 && rho < 1)) return omega;
  const mu = (rho + omega - 1) / (Math.sqrt(rho) * omega);
  if (!(mu > 0 && mu < 1)) return omega;
  return Math.max(omega, Math.min(cap, 2 / (1 + Math.sqrt(1 - mu * mu))));
}
