import type { QuantileTable } from './quantile-table';

/** The estimated error of reading a quantile table linearly between its points. */
export interface InterpolationError {
  /** Estimated largest |Q(p) - linear reading| on each step between points k and k+1 (length K - 1). */
  readonly perStep: Float64Array;
  /** The largest of them, and the step it is on. */
  readonly largest: number;
  readonly at: { readonly from: number; readonly to: number };
}

/**
 * Estimates how far the straight line between a quantile table's points may
 * lie from the true quantile function. Linear interpolation on a step of
 * width h errs by at most h^2/8 max|Q''| (Burden & Faires, "Numerical
 * Analysis", Thm 3.3). The table does not give Q'', so it is estimated by
 * twice the second divided difference at each inner point, 2 Q[p_{k-1}, p_k, p_{k+1}]
 * (which equals Q''(xi) for some xi in that span when Q is smooth); each step
 * takes the largest estimate at its two ends. An end step has only one inner
 * neighbour, and quantile functions bend fastest in the tails, so an estimate
 * from further in would understate it: the end step takes that neighbour's
 * curvature grown once more by the ratio to the next one in, c1^2 / c2 when
 * c1 > c2 (geometric growth towards the end), else twice c1 (design choice).
 * A table of 2 points gives no curvature: the estimate
 * is 0 and says nothing. It is an estimate, not a guarantee: a curve that bends
 * sharply between two points shows no trace in the table.
 * Cost: O(K).
 * @example tableInterpolationError(quantileTable([0, 0.5, 1], [0, 1, 4], 't')).largest
 * // 0.5 ((0.5)^2/8 * 2 * 8: the end-step rule doubles the only curvature 8)
 */
export function tableInterpolationError(t: QuantileTable): InterpolationError {
  const { p, v } = t;
  const K = p.length;
  const curv = new Float64Array(K); // |Q''| estimate at inner points; 0 at the ends
  for (let k = 1; k + 1 < K; k++) {
    const d1 = (v[k] - v[k - 1]) / (p[k] - p[k - 1]);
    const d2 = (v[k + 1] - v[k]) / (p[k + 1] - p[k]);
    curv[k] = Math.abs((2 * (d2 - d1)) / (p[k + 1] - p[k - 1]));
  }
  const perStep = new Float64Array(Math.max(0, K - 1));
  let largest = 0;
  let at = { from: p[0], to: p[K - 1] };
  for (let k = 0; k + 1 < K; k++) {
    const h = p[k + 1] - p[k];
    let c = Math.max(curv[k], curv[k + 1]);
    if (K > 2 && k === 0) c = endCurvature(curv[1], K > 3 ? curv[2] : 0);
    else if (K > 2 && k === K - 2) c = endCurvature(curv[K - 2], K > 3 ? curv[K - 3] : 0);
    perStep[k] = (h * h * c) / 8;
    if (perStep[k] > largest) {
      largest = perStep[k];
      at = { from: p[k], to: p[k + 1] };
    }
  }
  return { perStep, largest, at };
}

/** Curvature at an end: the nearest inner estimate c1 grown by c1 / c2 when it grows towards the end, else 2 c1. */
function endCurvature(c1: number, c2: number): number {
  return c2 > 0 && c1 > c2 ? (c1 * c1) / c2 : 2 * c1;
}
