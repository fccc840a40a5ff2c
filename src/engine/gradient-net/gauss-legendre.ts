import { RemapError } from '../errors';

/**
 * Gauss-Legendre quadrature on [0, 1]: nodes t_i and weights w_i such that
 * sum_i w_i f(t_i) is exact for polynomials of degree <= 2k - 1. The nodes are the
 * roots of the Legendre polynomial P_k, found by Newton's method from the
 * Chebyshev-like guess cos(pi (i - 1/4) / (k + 1/2)) (Press et al., "Numerical
 * Recipes", 3rd ed., sec. 4.6, gauleg), P_k evaluated by the three-term recurrence
 * (j+1) P_{j+1} = (2j+1) x P_j - j P_{j-1}; weights 2 / ((1 - x^2) P_k'(x)^2),
 * then mapped from [-1, 1] to [0, 1]. Used to check the closed-form network against
 * its defining integral and to time an integral-based variant. O(k^2) per Newton sweep.
 * @param k number of nodes, 1 <= k <= 200.
 * @throws RemapError if k is out of range.
 * @example gaussLegendre01(1) // { nodes: [0.5], weights: [1] }
 */
export function gaussLegendre01(k: number): { nodes: Float64Array; weights: Float64Array } {
  if (!Number.isInteger(k) || k < 1 || k > 200) {
    throw new RemapError(`gaussLegendre01: the number of nodes k must be a whole number from 1 to 200, not ${k}.`);
  }
  const nodes = new Float64Array(k);
  const weights = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (k + 0.5));
    let dp = 1;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let j = 1; j < k; j++) {
        const p2 = ((2 * j + 1) * x * p1 - j * p0) / (j + 1);
        p0 = p1;
        p1 = p2;
      }
      const pk = k === 1 ? x : p1;
      const pkm1 = k === 1 ? 1 : p0;
      dp = (k * (x * pk - pkm1)) / (x * x - 1);
      const dx = pk / dp;
      x -= dx;
      if (Math.abs(dx) <= 1e-16) break;
    }
    nodes[k - 1 - i] = (1 + x) / 2;
    weights[k - 1 - i] = 1 / ((1 - x * x) * dp * dp);
  }
  return { nodes, weights };
}
