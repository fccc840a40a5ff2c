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
 * bound on the cost |x - y|^2 / 2 between any two of their rows, used as the
 * first eps of the schedule (at that eps every kernel entry is at least e^-1,
 * so the first stage cannot underflow). O((n + m) d).
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
