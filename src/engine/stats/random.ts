/**
 * Seeded pseudo-random numbers: every random draw in Remap goes through here, so
 * the same seed gives bit-identical output on every platform. The generator is
 * sfc32 (Chris Doty-Humphrey's Small Fast Counting generator, from the PractRand
 * suite), seeded through splitmix32 so nearby seeds give unrelated streams.
 */
export class Random {
  private a: number;
  private b: number;
  private c: number;
  private d: number;
  private spare: number | null = null;

  /** @param seed any integer (taken modulo 2^32). */
  constructor(seed: number) {
    let s = seed >>> 0;
    const next = () => {
      s = (s + 0x9e3779b9) | 0;
      let z = s;
      z = Math.imul(z ^ (z >>> 16), 0x21f0aaad);
      z = Math.imul(z ^ (z >>> 15), 0x735a2d97);
      return (z ^ (z >>> 15)) >>> 0;
    };
    this.a = next();
    this.b = next();
    this.c = next();
    this.d = next();
    for (let i = 0; i < 12; i++) this.uint32();
  }

  /** A uniform 32-bit unsigned integer. */
  uint32(): number {
    const t = (((this.a + this.b) | 0) + this.d) | 0;
    this.d = (this.d + 1) | 0;
    this.a = this.b ^ (this.b >>> 9);
    this.b = (this.c + (this.c << 3)) | 0;
    this.c = (this.c << 21) | (this.c >>> 11);
    this.c = (this.c + t) | 0;
    return t >>> 0;
  }

  /** Uniform on [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.uint32() >>> 5;
    const lo = this.uint32() >>> 6;
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Standard normal by the Marsaglia polar method (exact, no tables). */
  normal(): number {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    for (;;) {
      const u = 2 * this.uniform() - 1;
      const v = 2 * this.uniform() - 1;
      const q = u * u + v * v;
      if (q > 0 && q < 1) {
        const f = Math.sqrt((-2 * Math.log(q)) / q);
        this.spare = v * f;
        return u * f;
      }
    }
  }

  /** A uniform integer in [0, n). Rejection sampling, so unbiased. */
  int(n: number): number {
    const limit = 4294967296 - (4294967296 % n);
    for (;;) {
      const x = this.uint32();
      if (x < limit) return x % n;
    }
  }

  /** A seeded Fisher-Yates permutation of 0..n-1. */
  permutation(n: number): Int32Array {
    const p = new Int32Array(n);
    for (let i = 0; i < n; i++) p[i] = i;
    for (let i = n - 1; i > 0; i--) {
      const j = this.int(i + 1);
      const t = p[i];
      p[i] = p[j];
      p[j] = t;
    }
    return p;
  }

  /**
   * k distinct indices out of 0..n-1, in increasing order (all of them when
   * k >= n), by a partial Fisher-Yates shuffle. O(n).
   * @example new Random(1).choose(5, 10) // Int32Array [0, 1, 2, 3, 4]
   */
  choose(n: number, k: number): Int32Array {
    const idx = new Int32Array(n);
    for (let i = 0; i < n; i++) idx[i] = i;
    if (k >= n) return idx;
    for (let i = 0; i < k; i++) {
      const j = i + this.int(n - i);
      const t = idx[i];
      idx[i] = idx[j];
      idx[j] = t;
    }
    return idx.slice(0, k).sort();
  }
}
