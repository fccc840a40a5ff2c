import { RemapError } from '../errors';
import { weightedCdf, type WeightedCdf } from './weighted-cdf';

/**
 * Exact Wasserstein distances between two weighted 1-D samples. In one
 * dimension the optimal coupling pairs equal quantiles, so
 *   W_p^p = integral over u in (0,1) of |F^-1(u) - G^-1(u)|^p du
 * (Villani, "Topics in Optimal Transportation", Thm 2.18; Peyre & Cuturi,
 * "Computational Optimal Transport", arXiv:1803.00567, Remark 2.30).
 * Both quantile functions are step functions, so the integral is a finite sum
 * over the merged cumulative shares: no binning, no approximation.
 */

/**
 * The p-th power of W_p between two merged CDFs: the integral of
 * |F^-1(u) - G^-1(u)|^p over u in (0,1). Cost: O(ka + kb).
 * @param a,b merged CDFs (see `weightedCdf`).
 * @param p 1 or 2.
 * @example transportCost1d(weightedCdf([0, 1, 3]), weightedCdf([5, 6, 8]), 2) // 25
 */
export function transportCost1d(a: WeightedCdf, b: WeightedCdf, p: 1 | 2): number {
  const c = transportCosts1d(a, b);
  return p === 1 ? c.w1 : c.w2Squared;
}

/**
 * W1 and W2^2 between two merged CDFs in one merge walk over their cumulative
 * shares: on each stretch of shares where both step quantile functions are
 * constant, add (stretch length) x |gap| and x gap^2. Cost: O(ka + kb).
 * @example transportCosts1d(weightedCdf([0, 1]), weightedCdf([0, 2])) // { w1: 0.5, w2Squared: 0.5 }
 */
export function transportCosts1d(a: WeightedCdf, b: WeightedCdf): { w1: number; w2Squared: number } {
  const av = a.values;
  const bv = b.values;
  const ac = a.cumulative;
  const bc = b.cumulative;
  const aw = a.total;
  const bw = b.total;
  const ka = av.length;
  const kb = bv.length;
  let i = 0;
  let j = 0;
  let t = 0;
  let w1 = 0;
  let w2 = 0;
  let sa = ac[0] / aw;
  let sb = bc[0] / bw;
  const abs = Math.abs;
  // Each pass advances i or j (or both), so the loop runs at most ka + kb times.
  while (i < ka && j < kb) {
    const next = sa < sb ? sa : sb;
    const d = abs(av[i] - bv[j]);
    const dt = next - t;
    w1 += dt * d;
    w2 += dt * d * d;
    t = next;
    if (sa <= next && ++i < ka) sa = ac[i] / aw;
    if (sb <= next && ++j < kb) sb = bc[j] / bw;
  }
  return { w1, w2Squared: w2 };
}

/**
 * W_p between the empirical distributions of samples x and y, exactly, with
 * optional row weights (any positive scale; zero weights allowed for some rows).
 * Cost: O(n log n + m log m) for the sorts, O(n + m) after.
 * @param x,y non-empty lists of finite numbers.
 * @param wx,wy optional non-negative finite weights, one per value, not all zero.
 * @param p 1 or 2.
 * @returns W_p itself (for p = 2, the square root of the mean squared quantile gap).
 * @throws RemapError naming the bad argument (empty sample, non-finite value, bad weight, wrong p).
 * @example wasserstein1d([0, 1, 3], [5, 6, 8], null, null, 1) // 5
 */
export function wasserstein1d(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  wx: ArrayLike<number> | null | undefined,
  wy: ArrayLike<number> | null | undefined,
  p: 1 | 2,
): number {
  if (p !== 1 && p !== 2) throw new RemapError(`wasserstein1d: p is ${String(p)}; give 1 or 2.`);
  const a = weightedCdf(checked(x, wx, 'x', 'wx'), wx);
  const b = weightedCdf(checked(y, wy, 'y', 'wy'), wy);
  const c = transportCost1d(a, b, p);
  return p === 1 ? c : Math.sqrt(c);
}

function checked(v: ArrayLike<number>, w: ArrayLike<number> | null | undefined, name: string, wname: string): ArrayLike<number> {
  if (v.length === 0) throw new RemapError(`wasserstein1d: ${name} is empty; give at least one number.`);
  for (let i = 0; i < v.length; i++) {
    if (!Number.isFinite(v[i])) throw new RemapError(`wasserstein1d: ${name}[${i}] is ${v[i]}; give finite numbers only.`);
  }
  if (w != null) {
    if (w.length !== v.length)
      throw new RemapError(`wasserstein1d: ${wname} has ${w.length} weights for ${v.length} values in ${name}; give one weight per value.`);
    let total = 0;
    for (let i = 0; i < w.length; i++) {
      if (!(Number.isFinite(w[i]) && w[i] >= 0)) throw new RemapError(`wasserstein1d: ${wname}[${i}] is ${w[i]}; weights must be finite and zero or positive.`);
      total += w[i];
    }
    if (!(total > 0) || !Number.isFinite(total))
      throw new RemapError(`wasserstein1d: the weights ${wname} add up to ${total}; give at least one positive weight, with a finite total.`);
  }
  return v;
}
