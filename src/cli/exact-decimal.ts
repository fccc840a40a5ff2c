/**
 * Exact arithmetic between decimals and doubles, shared by the CSV reader (numeric-csv.ts: digits to a double) and the
 * number writer (number-text.ts: a double to its shortest digits).
 */

/** 10^0 .. 10^22: every power of ten a double holds exactly. */
export const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

const SPLIT = 134217729; // 2^27 + 1, Dekker's splitting constant

/**
 * The rounding error of the last twoProd: a * b = product + tpErr[0] exactly. A typed-array slot: a module-level `let`
 * holding a double is a boxed number, and each write to it would allocate.
 */
export const tpErr = new Float64Array(1);

/**
 * a * b rounded, leaving the exact rounding error in tpErr[0] (Dekker, "A floating-point technique for extending the
 * available precision", 1971). O(1).
 * @example twoProd(0.1, 3) // 0.30000000000000004, tpErr[0] = 0.1 * 3 - 0.30000000000000004 exactly
 */
export function twoProd(a: number, b: number): number {
  const p = a * b;
  let t = SPLIT * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLIT * b;
  const bh = t - (t - b);
  const bl = b - bh;
  tpErr[0] = ah * bh - p + ah * bl + al * bh + al * bl;
  return p;
}

/**
 * The double nearest to (m * scale + ml) * 10^e10, for integers m, scale, ml with m, scale < 2^53, |ml| <= |m * scale|
 * (ml of either sign) and |e10| <= 22, or NaN when it cannot be sure. The integer is held exactly as a pair of doubles
 * (hi + lo, 106 bits); one product or quotient by the exact power of ten in pair arithmetic gives the value to about
 * 2^-100 of itself, A + B. The nearest double to A + B is the answer unless the true value and A + B lie on either side
 * of a rounding boundary: so A + B is moved by 2^-90 of itself either way, far more than its error, and when both
 * still round to the same double that is the answer; otherwise (a value within 2^-90 of a tie, rare) NaN, and the
 * caller decides another way. (Clinger, "How to read floating point numbers accurately", PLDI 1990, for why one
 * correctly rounded step suffices when the pair is that close.) O(1).
 * @example toDecimal(12345, 6789, 1e4, -8) // 1.23456789
 */
export function toDecimal(m: number, ml: number, scale: number, e10: number): number {
  // hi + lo = m * scale + ml exactly: the product is exact as a pair, and adding ml to it is an exact two-sum.
  const ph = twoProd(m, scale);
  const s = ph + ml;
  const t = ml - (s - ph) + tpErr[0];
  const hi = s + t;
  const lo = t - (hi - s);
  let A: number;
  let B: number;
  if (e10 >= 0) {
    const p = POW10[e10];
    A = twoProd(hi, p);
    B = tpErr[0] + lo * p;
  } else {
    const q = POW10[-e10];
    A = hi / q;
    const p1 = twoProd(A, q);
    B = (hi - p1 - tpErr[0] + lo) / q;
  }
  const v = A + B;
  const margin = Math.abs(A) * 8.077935669463161e-28; // 2^-90
  return A + (B + margin) === v && A + (B - margin) === v ? v : NaN;
}
