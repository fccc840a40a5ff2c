import { POW10 as SHARED_POW10, toDecimal as sharedToDecimal, tpErr as sharedTpErr, twoProd as sharedTwoProd } from './exact-decimal';

/**
 * Numbers written as bytes, exactly as `String(x)` writes them, without making a string.
 *
 * ECMAScript's Number::toString (ECMA-262, "Number::toString", the shortest round-trip form) writes the fewest
 * significant digits k whose decimal s x 10^(n-k) reads back as x, and among those the decimal nearest x. For
 * k <= 15 at most one k-digit decimal reads back as x (decimals of 15 digits are at least 1e-15 of x apart, a
 * double's rounding interval at most 2.2e-16 of x wide), so the nearest 15-digit decimal reads back exactly when
 * some decimal of 15 digits or fewer does, and dropping its trailing zeros gives the shortest. Failing that, the
 * nearest 16-digit decimal, then the nearest 17-digit one (which always reads back), is what toString writes.
 *
 * The nearest k-digit decimal is found in double-double arithmetic: x * 10^p is held exactly as a pair (Dekker's
 * product, "A floating-point technique for extending the available precision", 1971), so rounding it to an integer
 * is exact unless it lies within 1e-9 of a half. Reading back uses Clinger's exact case ("How to read floating point
 * numbers accurately", PLDI 1990: an integer below 2^53 times or over an exact power of ten is one correctly rounded
 * operation), or for larger integers the pair with a margin that says when it cannot be sure. Whenever a step
 * cannot be sure (a near-half, a value within 2^-90 of a rounding boundary), or the value is outside
 * [1e-6, 1e21) in magnitude (toString's exponent form) or not finite, `writeNumber` returns -1 and the caller
 * writes String(x) instead; the output is then String(x) for every double. Test: test/cli/number-text.test.ts
 * compares with String(x) on millions of doubles.
 * Cost: O(1) per number, about a third of String(x) plus copying its characters.
 */

// Bound once: the compiled module would otherwise read them off the other module's exports at every number.
const POW10 = SHARED_POW10;
const toDecimal = sharedToDecimal;
const tpErr = sharedTpErr;
const twoProd = sharedTwoProd;
const TWO52 = 4503599627370496;
const TWO53 = 9007199254740992;
/** The longest text writeNumber writes: a sign, "0.00000", 17 digits. */
export const NUMBER_TEXT_MAX = 26;

// Scratch of the number being written. Doubles live in a typed array: a module-level `let` holding a double is a
// boxed number, and each write to it would allocate.
const reg = new Float64Array(3);
/** reg[HI] + reg[LO]: the integer s (both integers, LO small) of the last `nearest`, and reg[DELTA] = x * 10^p - s (to about 1e-16). */
const HI = 0;
const LO = 1;
const DELTA = 2;
/** 2^(i - 100), for the half-spacing of doubles in [1e-6, 1e21). */
const POW2 = Float64Array.from({ length: 200 }, (_, i) => Math.pow(2, i - 100));
const digits = new Uint8Array(17);
/** The two digits of 0..99: TENS_UNIT[2r] and TENS_UNIT[2r + 1]. */
const TENS_UNIT = Uint8Array.from({ length: 200 }, (_, i) => (i % 2 === 0 ? Math.floor(i / 20) : (i >> 1) % 10));

/**
 * The integer nearest x * 10^p (the even one at an exact half), into reg; false when x * 10^p is within 1e-9 of a half
 * and the arithmetic cannot tell which side (the caller gives up).
 * x > 0, |p| <= 22, x * 10^p < 1e18.
 */
function nearest(x: number, p: number): boolean {
  let hi: number;
  let lo: number;
  if (p >= 0) {
    hi = twoProd(x, POW10[p]);
    lo = tpErr[0];
  } else {
    const q = POW10[-p];
    hi = x / q;
    const ph = twoProd(hi, q);
    // x - hi * q is a double (the remainder of a rounded quotient), so these two subtractions are exact.
    lo = (x - ph - tpErr[0]) / q;
  }
  if (hi < TWO52) {
    const f = Math.floor(hi);
    const frac = hi - f + lo;
    const off = Math.abs(frac) - 0.5;
    if (off < 1e-9 && off > -1e-9) return false;
    const sh = frac > 0.5 ? f + 1 : frac < -0.5 ? f - 1 : f;
    reg[HI] = sh;
    reg[LO] = 0;
    reg[DELTA] = hi - sh + lo;
    return true;
  }
  // hi >= 2^52 is an integer; lo is at most half its spacing.
  let r = Math.round(lo);
  const frac = lo - Math.trunc(lo);
  if (p >= 0 && (frac === 0.5 || frac === -0.5)) {
    // An exact half (the product pair is exact for p >= 0): Number::toString takes the even one of the two.
    r = Math.floor(lo);
    // hi + r may not be a double above 2^53; hi itself is even there.
    const odd = hi >= TWO53 ? Math.abs(r) % 2 : Math.abs(hi + r) % 2;
    if (odd !== 0) r++;
  } else {
    const off = Math.abs(frac) - 0.5;
    if (off < 1e-9 && off > -1e-9) return false;
  }
  reg[HI] = hi;
  reg[LO] = r;
  reg[DELTA] = lo - r;
  return true;
}

const bits = new Float64Array(1);
// Little-endian (every platform Node and browsers run on): the high word holds the sign, exponent and top of the mantissa.
const bitsHigh = new Int32Array(bits.buffer, 4, 1);
const bitsLow = new Int32Array(bits.buffer, 0, 1);

/**
 * The e with 10^e <= v < 10^(e+1) exactly, for v in [1e-6, 1e21): the guess floor(e2 log10(2)) from the binary
 * exponent e2 is e or e - 1, settled by one comparison with the next power of ten (BELOW_NEXT).
 */
function decimalExponent(v: number): number {
  bits[0] = v;
  const e2 = ((bitsHigh[0] >> 20) & 0x7ff) - 1023;
  const e = Math.floor(e2 * 0.3010299956639812);
  const i = e + 1 + TEN_AT;
  return v < TEN[i] || (v === TEN[i] && TEN_BELOW[i] === 1) ? e : e + 1;
}

/** Whether v < 10^e exactly, for -22 <= e <= 22 (10^-e times v held exactly as a pair when e < 0). */
function below(v: number, e: number): boolean {
  if (e >= 0) return v < POW10[e];
  const hi = twoProd(v, POW10[-e]);
  return hi < 1 || (hi === 1 && tpErr[0] < 0);
}

/** Index of 10^0 in TEN. */
const TEN_AT = 10;
/** 10^e as the nearest double, for e = -10..22. */
const TEN = Float64Array.from({ length: 33 }, (_, i) => (i >= TEN_AT ? POW10[i - TEN_AT] : 1 / POW10[TEN_AT - i]));
/**
 * 1 where that double lies below the true 10^e (then v < 10^e exactly when v <= TEN), 0 where it is 10^e itself or lies
 * above (then v < 10^e exactly when v < TEN): decided exactly by `below`.
 */
const TEN_BELOW = Uint8Array.from({ length: 33 }, (_, i) => (i < TEN_AT && below(TEN[i], i - TEN_AT) ? 1 : 0));

/** Whether the decimal (sHi + sLo) x 10^-p reads back as x: 1 yes, 0 no, -1 cannot be sure. */
function readsBack(x: number, p: number, sHi: number, sLo: number): number {
  const s = sHi + sLo;
  if (s < TWO53 && s - sHi === sLo) {
    // Clinger's exact case: one correctly rounded operation on exact doubles.
    const v = p >= 0 ? s / POW10[p] : s * POW10[-p];
    return v === x ? 1 : 0;
  }
  const v = toDecimal(sHi, sLo, 1, -p);
  if (v !== v) return -1;
  return v === x ? 1 : 0;
}

/**
 * The k digits of hi * 10^lowDigits + lo (0 <= lo < 10^lowDigits, both below 2^31) into `digits`, with the number
 * below 10^k; returns how many remain after trailing zeros are dropped.
 */
function spell(k: number, hi: number, lo: number, lowDigits: number): number {
  let at = k;
  let i = 0;
  // Two digits per division where it can.
  for (; i + 2 <= lowDigits; i += 2) {
    const q = (lo / 100) | 0;
    const r = lo - q * 100;
    digits[--at] = TENS_UNIT[2 * r + 1];
    digits[--at] = TENS_UNIT[2 * r];
    lo = q;
  }
  if (i < lowDigits) {
    const q = (lo / 10) | 0;
    digits[--at] = lo - q * 10;
  }
  while (at > 1) {
    const q = (hi / 100) | 0;
    const r = hi - q * 100;
    digits[--at] = TENS_UNIT[2 * r + 1];
    digits[--at] = TENS_UNIT[2 * r];
    hi = q;
  }
  if (at === 1) digits[0] = hi % 10;
  let len = k;
  while (len > 1 && digits[len - 1] === 0) len--;
  return len;
}

/**
 * Whether the k-digit decimal c x 10^-p (c = hi * 10^lowDigits + lo), at distance dist from v x 10^p, reads back as v:
 * 1 yes, 0 no, -1 cannot be sure. It does when nearer v than half the spacing of doubles there, and not when farther;
 * only near that boundary (or at a power of two, where the spacing below is narrower) is it read back.
 */
function check(v: number, p: number, hi: number, lo: number, lowDigits: number, dist: number, halfUlp: number, powerOfTwo: boolean): number {
  const limit = p >= 0 ? halfUlp * POW10[p] : halfUlp / POW10[-p];
  if (!powerOfTwo && Math.abs(dist - limit) > 1e-6 * limit) return dist < limit ? 1 : 0;
  return readsBack(v, p, hi * POW10[lowDigits], lo);
}

/**
 * Writes x into out at `at` exactly as String(x) spells it, and returns the position after it; returns -1 (writing
 * nothing useful) when the caller must write String(x) itself: x not finite, |x| outside [1e-6, 1e21), or a rare
 * case this arithmetic cannot settle. out needs NUMBER_TEXT_MAX bytes of room from `at`.
 * @example writeNumber(0.1, buf, 0) // 3: buf holds "0.1"
 */
export function writeNumber(x: number, out: Uint8Array, at: number): number {
  if (x === 0) {
    out[at] = 48; // String(-0) is "0" too
    return at + 1;
  }
  let v = x;
  if (v < 0) {
    out[at++] = 45;
    v = -v;
  }
  if (!(v >= 1e-6 && v < 1e21)) return -1;
  const e = decimalExponent(v);
  // Half the spacing of doubles at v.
  const e2 = ((bitsHigh[0] >> 20) & 0x7ff) - 1023;
  const powerOfTwo = (bitsHigh[0] & 0xfffff) === 0 && bitsLow[0] === 0;
  const halfUlp = POW2[e2 - 53 + 100];
  // The nearest 17-digit decimal s17 x 10^-p, and delta = v x 10^p - s17 (|delta| <= 1/2).
  const p = 16 - e;
  if (p > 22 || !nearest(v, p)) return -1;
  const sHi = reg[HI];
  const sLo = reg[LO];
  // A decimal rounded up to 10^(e+1) (a carry) reads back only when v is the double nearest 10^(e+1): "1" then zeros.
  const power = TEN[e + 1 + TEN_AT];
  if (sHi - 1e17 + sLo >= 0) return v === power ? writeOne(out, at, e + 2) : -1;
  const delta = reg[DELTA];
  // s17 = a * 1e9 + b with 0 <= b < 1e9: a * 1e9 is exact (a multiple of 2^9 with a mantissa below 2^53).
  let a = Math.floor(sHi / 1e9);
  let b = sHi - a * 1e9 + sLo;
  while (b < 0) {
    a--;
    b += 1e9;
  }
  while (b >= 1e9) {
    a++;
    b -= 1e9;
  }
  const ai = a | 0;
  const bi = b | 0;
  let len = 0;
  // The nearest 15- and 16-digit decimals follow from s17 and delta: v x 10^(p-j) = floor(s17 / 10^j) + f with
  // f = (s17 mod 10^j + delta) / 10^j, rounded to the nearer integer (a near-half is left to String(x)).
  for (let j = 2; j >= 1 && len === 0; j--) {
    const unit = j === 2 ? 100 : 10;
    const q = (bi / unit) | 0;
    const rest = bi - q * unit;
    const num = rest + delta;
    const f = num / unit;
    let up = f > 0.5 ? 1 : 0;
    if (Math.abs(f - 0.5) < 1e-9) {
      // Two candidates about equally near: when neither can read back (half the grid step is beyond half the spacing of
      // doubles), go on to more digits; at an exact half (delta is exact for p >= 0) where both do, the even one.
      const limit = p - j >= 0 ? halfUlp * POW10[p - j] : halfUlp / POW10[j - p];
      if (0.5 > limit * (1 + 1e-6) && !powerOfTwo) continue;
      if (p < 0 || 2 * num !== unit) return -1;
      up = q % 2 === 0 ? 0 : 1;
    }
    let hi = ai;
    let lo = q + up;
    const lowDigits = 9 - j;
    if (lo === POW10[lowDigits]) {
      lo = 0;
      hi++;
      if (hi === POW10[8]) {
        if (v === power) return writeOne(out, at, e + 2);
        continue;
      }
    }
    const back = check(v, p - j, hi, lo, lowDigits, Math.abs(f - up), halfUlp, powerOfTwo);
    if (back < 0) return -1;
    if (back === 1) len = spell(17 - j, hi, lo, lowDigits);
  }
  if (len === 0) {
    const back = check(v, p, ai, bi, 9, Math.abs(delta), halfUlp, powerOfTwo);
    if (back !== 1) return -1; // the nearest 17-digit decimal always reads back: anything else is left to String(x)
    len = spell(17, ai, bi, 9);
  }
  return writeDigits(out, at, len, e + 1);
}

/** 10^(n-1) as Number::toString lays it out. */
function writeOne(out: Uint8Array, at: number, n: number): number {
  digits[0] = 1;
  return writeDigits(out, at, 1, n);
}

/** The first len of `digits` with n of them before the point, laid out as Number::toString does for -6 < n <= 21. */
function writeDigits(out: Uint8Array, at: number, len: number, n: number): number {
  // Layout of Number::toString for -6 < n <= 21 (n digits before the point).
  if (n >= len) {
    for (let i = 0; i < len; i++) out[at++] = 48 + digits[i];
    for (let i = len; i < n; i++) out[at++] = 48;
  } else if (n > 0) {
    for (let i = 0; i < n; i++) out[at++] = 48 + digits[i];
    out[at++] = 46;
    for (let i = n; i < len; i++) out[at++] = 48 + digits[i];
  } else {
    out[at++] = 48;
    out[at++] = 46;
    for (let i = n; i < 0; i++) out[at++] = 48;
    for (let i = 0; i < len; i++) out[at++] = 48 + digits[i];
  }
  return at;
}
