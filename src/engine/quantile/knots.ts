import { RemapError } from '../errors';
import type { ShareGrid } from './grid';

/** Knots of a monotone piecewise-linear map: xs and ys both non-decreasing, same length. */
export interface Knots {
  readonly xs: Float64Array;
  readonly ys: Float64Array;
}

/**
 * Composes two share grids into the knots of T = G^-1 o F, where F is the
 * source curve read from value to share and G^-1 the target curve read from
 * share to value. Knots sit at every share in the union of both grids, within
 * the shares both cover: x = F^-1(p), y = G^-1(p), each read by linear
 * interpolation between that grid's points. Between consecutive knots both
 * curves are straight lines in p, so T is exactly linear there.
 *
 * Where a grid has a jump at share p (a run of points with equal p), the
 * "smallest value whose cumulative share is above p" rule of equipercentile
 * equating picks the upper end: at such a p the knots are (x_lo, y_lo),
 * (x_lo, y_hi), (x_hi, y_hi), so reading the knots right-continuously (largest
 * knot with xs <= x) follows that rule.
 *
 * `strict`: keep xs and ys strictly increasing (the quantile map, whose grids
 * have no jumps). Two knots can then only collide through rounding in nearly
 * equal shares; the later one is dropped, except the last knot, which replaces
 * the ones it collides with, so the map still ends at the last shared share.
 * When both grids have the same shares (equal sizes and weights) the knots
 * are the grids' own value arrays, shared, not copied (nothing writes to them).
 * Cost: O(ks + kt).
 * @throws RemapError (kind 'num') if a share is NaN (hazenGrid and the ordinal grid never give one).
 * @param src,tgt grids with at least one point each.
 * @example buildKnots(hazenGrid(cdf([1, 2])), hazenGrid(cdf([10, 30])), true) // xs [1, 2], ys [10, 30]
 */
export function buildKnots(src: ShareGrid, tgt: ShareGrid, strict: boolean): Knots {
  const ps = src.p;
  const vs = src.v;
  const pt = tgt.p;
  const vt = tgt.v;
  const ns = ps.length;
  const nt = pt.length;
  if (strict && samePositions(ps, pt)) return { xs: vs, ys: vt };
  const pLo = Math.max(ps[0], pt[0]);
  const pHi = Math.min(ps[ns - 1], pt[nt - 1]);
  const cap = strict ? ns + nt : 3 * (ns + nt);
  const xs = new Float64Array(cap);
  const ys = new Float64Array(cap);
  let m = 0;
  let i = 0;
  let j = 0;
  while (i < ns && ps[i] < pLo) i++;
  while (j < nt && pt[j] < pLo) j++;
  // Each pass consumes at least one grid point, so at most ns + nt passes; the bound also
  // stops a grid holding NaN (which consumes nothing) from looping for ever.
  for (let pass = 0; (i < ns || j < nt) && pass <= ns + nt; pass++) {
    const p = Math.min(i < ns ? ps[i] : Infinity, j < nt ? pt[j] : Infinity);
    if (!(p === p))
      throw new RemapError('buildKnots: a share position is not a number (weights too large or too small to add up); rescale the weights.', 'num');
    if (p > pHi) break;
    let xa: number;
    let xb: number;
    if (i < ns && ps[i] === p) {
      xa = vs[i];
      while (i + 1 < ns && ps[i + 1] === p) i++;
      xb = vs[i];
      i++;
    } else {
      xa = xb = interpolate(ps, vs, i, p);
    }
    let ya: number;
    let yb: number;
    if (j < nt && pt[j] === p) {
      ya = vt[j];
      while (j + 1 < nt && pt[j + 1] === p) j++;
      yb = vt[j];
      j++;
    } else {
      ya = yb = interpolate(pt, vt, j, p);
    }
    const last = p === pHi;
    if (strict) {
      if (m === 0 || (xa > xs[m - 1] && ya > ys[m - 1])) {
        xs[m] = xa;
        ys[m++] = ya;
      } else if (last) {
        // Rounding made the last knot collide: it replaces the knots it collides with.
        while (m > 1 && !(xa > xs[m - 1] && ya > ys[m - 1])) m--;
        if (xa > xs[m - 1] && ya > ys[m - 1]) m++;
        xs[m - 1] = xa;
        ys[m - 1] = ya;
      }
    } else {
      m = pushRising(xs, ys, m, xa, ya);
      m = pushRising(xs, ys, m, xa, yb);
      m = pushRising(xs, ys, m, xb, yb);
    }
    if (last) break;
  }
  return { xs: xs.slice(0, m), ys: ys.slice(0, m) };
}

/** Appends (x, y) unless it repeats the last knot; never steps back (guards rounding). Returns the new length. */
function pushRising(xs: Float64Array, ys: Float64Array, m: number, x: number, y: number): number {
  if (m > 0) {
    if (x < xs[m - 1]) x = xs[m - 1];
    if (y < ys[m - 1]) y = ys[m - 1];
    if (x === xs[m - 1] && y === ys[m - 1]) return m;
  }
  xs[m] = x;
  ys[m] = y;
  return m + 1;
}

/** Same shares, strictly increasing: the common case of equal sizes and weights. */
function samePositions(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k] || (k > 0 && !(a[k] > a[k - 1]))) return false;
  return true;
}

/** Value of the grid at share p, with p strictly between p[i-1] and p[i] (i >= 1). Clamped to that segment. */
function interpolate(p: Float64Array, v: Float64Array, i: number, share: number): number {
  const p0 = p[i - 1];
  const v0 = v[i - 1];
  const v1 = v[i];
  const r = v0 + (v1 - v0) * ((share - p0) / (p[i] - p0));
  return r < v0 ? v0 : r > v1 ? v1 : r;
}
