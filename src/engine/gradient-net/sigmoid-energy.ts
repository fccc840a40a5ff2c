/**
 * The activation of the closed-form one-hidden-layer gradient network.
 *
 * Input Convex Gradient Networks (Richter-Powell, Lorraine & Amos,
 * "Input Convex Gradient Networks", arXiv 2111.12187) define
 *   F(x) = integral_0^1 J(t x)^T J(t x) x dt,   J = diag(s'(W x + b)) W
 * for the hidden layer M(x) = s(W x + b). Since J^T J x = W^T diag(s'(Wx+b)^2) W x,
 * component j of the integrand is s'(t u_j + b_j)^2 u_j with u = W x, and
 *   d/dt h(t u_j + b_j) = h'(t u_j + b_j) u_j = s'(t u_j + b_j)^2 u_j   when h' = s'^2,
 * so the integral over t is h(u_j + b_j) - h(b_j) and
 *   F(x) = W^T [h(W x + b) - h(b)].
 * For the logistic sigmoid s, s' = s (1 - s) and du = ds / (s (1 - s)), hence
 *   h(u) = integral s^2 (1 - s)^2 du = integral s (1 - s) ds = s^2 / 2 - s^3 / 3.
 * Check by differentiation: d/du (s^2/2 - s^3/3) = (s - s^2) s' = s^2 (1 - s)^2 = s'^2.
 * h rises from 0 (u -> -inf) to 1/6 (u -> +inf); h' is a bump of height 1/16 at u = 0.
 */

// A local alias: a global lookup of Math in a hot loop is about 20 times slower under Jest's sandbox.
const { exp } = Math;

/** The logistic sigmoid 1 / (1 + e^-u), written to avoid overflow. O(1). @example sigmoid(0) // 0.5 */
export function sigmoid(u: number): number {
  if (u >= 0) return 1 / (1 + exp(-u));
  const e = exp(u);
  return e / (1 + e);
}

/**
 * h(u) = s^2/2 - s^3/3 with s = sigmoid(u): the antiderivative of s'(u)^2 that
 * vanishes at -infinity. O(1).
 * @example sigmoidEnergy(0) // 0.125 - 0.041666... = 0.083333...
 */
export function sigmoidEnergy(u: number): number {
  const s = sigmoid(u);
  return s * s * (0.5 - s / 3);
}

/**
 * h'(u) = s'(u)^2 = s^2 (1 - s)^2, the gain of hidden unit j in the Jacobian. O(1).
 * @example sigmoidEnergySlope(0) // 0.0625
 */
export function sigmoidEnergySlope(u: number): number {
  const s = sigmoid(u);
  const g = s * (1 - s);
  return g * g;
}
