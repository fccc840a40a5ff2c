/**
 * The seeded random numbers of the gradient-net method: initial weights and
 * batch order. One small generator (Mulberry32: a 32-bit state advanced by the
 * golden-ratio constant and mixed by two multiply-xorshift rounds; public
 * domain, T. Ettinger 2017) so that the same seed gives the same draws in every
 * JavaScript engine, independent of the tensor backend.
 */
export interface Prng {
  /** A uniform number in [0, 1) with 32 random bits. */
  next(): number;
  /** A standard normal number (Box-Muller, one draw per pair of uniforms). */
  normal(): number;
  /** A whole number in [0, k) for 1 <= k <= 2^32. */
  below(k: number): number;
}

/**
 * A seeded generator. Cost O(1) per draw.
 * @param seed any finite number; its 32 low bits of the integer part are used.
 * @example makePrng(7).next() // 0.5090..., the same on every run
 */
export function makePrng(seed: number): Prng {
  let state = (Math.trunc(seed) ^ 0x9e3779b9) >>> 0;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    normal(): number {
      // 1 - u keeps the log argument in (0, 1].
      const u = 1 - next();
      const v = next();
      return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    },
    below(k: number): number {
      return Math.min(k - 1, Math.floor(next() * k));
    },
  };
}
