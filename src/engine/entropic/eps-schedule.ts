/**
 * The epsilon-scaling schedule of the Sinkhorn solves: eps_k = target * 2^(K - k)
 * for k = 0..K, the smallest K with target * 2^K >= start (at most `maxStages`
 * halvings). Starting large and halving lets each stage warm-start from the
 * previous potentials, and an exact factor 2 lets the solver move the kernel
 * to the next stage by squaring it (exp(2z) = exp(z)^2) instead of calling
 * Math.exp n m times. Epsilon-scaling as in Schmitzer 2019, "Stabilized sparse
 * scaling algorithms for entropy regularized transport problems", section 3.2.
 * O(K).
 * @param target the final eps (> 0); start the first eps wanted (any number; values <= target give [target]).
 * @param maxStages the most halvings (>= 0).
 * @example epsSchedule(0.25, 1) // [1, 0.5, 0.25]
 */
export function epsSchedule(target: number, start: number, maxStages = 40): number[] {
  let k = 0;
  while (k < maxStages && target * 2 ** k < start) k++;
  const out: number[] = [];
  for (let s = k; s >= 0; s--) out.push(target * 2 ** s);
  return out;
}

/**
 * Half the squared diagonal of the box that holds both point sets: an upper
 * bound on the cost |x - y|^2 / 2 between any two of their rows (at that eps
 * every kernel entry is at least e^-1, so nothing can underflow). Callers may
 * pass it as the first eps of a schedule; the default start is a quarter of
 * `meanCost`. O((n + m) d).
 * @example halfSquaredDiameter(points([[0, 0]]), points([[3, 4]])) // 12.5
 */
export function halfSquaredDiameter(x: { n: number; d: number; data: Float64Array }, y: { n: number; d: number; data: Float64Array }): number {
  const d = x.d;
  let total = 0;
  for (let k = 0; k < d; k++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const p of [x, y]) {
      for (let i = 0, j = k; i < p.n; i++, j += d) {
        const v = p.data[j];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
    if (hi > lo) total += (hi - lo) * (hi - lo);
  }
  return total / 2;
}

/**
 * The mean cost between two weighted point sets, E |X - Y|^2 / 2 for independent
 * X ~ a, Y ~ b:
 *   sum_k (Var_a(x_k) + Var_b(y_k) + (mean_a(x_k) - mean_b(y_k))^2) / 2.
 * A quarter of it is the first eps of the default schedule: at that eps a pair
 * at the mean cost has kernel entry e^-4, so the first stage already sees the
 * shape of the data, while only pairs beyond about 175 times the mean cost
 * underflow (the recentred build and the column repair handle those). Starting
 * at the squared diameter instead spent one stage per halving on eps values
 * at which the plan is almost the product of the marginals, and far outliers
 * make that diameter huge (measured on bench/entropic.bench.ts and the
 * scenarios demo: 4-6 stages instead of 11-17, and 10-45 % fewer iterations).
 * O((n + m) d).
 * @param x, y the points; logA, logB their log-masses (each summing in exp to 1).
 * @example meanCost(points([[0], [2]]), logHalf, points([[5]]), Float64Array.of(0)) // (1 + 0 + 16) / 2 = 8.5
 */
export function meanCost(
  x: { n: number; d: number; data: Float64Array },
  logA: Float64Array,
  y: { n: number; d: number; data: Float64Array },
  logB: Float64Array,
): number {
  const d = x.d;
  let total = 0;
  for (let k = 0; k < d; k++) {
    const px = weightedMoments(x, logA, k);
    const py = weightedMoments(y, logB, k);
    total += px.variance + py.variance + (px.mean - py.mean) ** 2;
  }
  return total / 2;
}

/** Weighted mean and variance (two passes) of column k, masses exp(logW). O(n). */
function weightedMoments(p: { n: number; d: number; data: Float64Array }, logW: Float64Array, k: number): { mean: number; variance: number } {
  const { n, d, data } = p;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += Math.exp(logW[i]) * data[i * d + k];
  let variance = 0;
  for (let i = 0; i < n; i++) {
    const z = data[i * d + k] - mean;
    variance += Math.exp(logW[i]) * z * z;
  }
  return { mean, variance };
}
