/**
 * A 53-bit non-cryptographic fingerprint of numbers and text, used to derive a
 * fitted map's handle from its data and settings: the same inputs always give
 * the same handle, so a recalculation with unchanged inputs finds the fit it
 * already has. Hashes the exact bits of each double (so 0.1 + 0.2 and 0.3
 * differ, as they should). Mixing after the cyrb53 construction (public domain,
 * bryc 2018). O(total length).
 */
export class Fingerprint {
  private h1 = 0xdeadbeef;
  private h2 = 0x41c6ce57;
  private readonly scratch = new Float64Array(1);
  private readonly words = new Uint32Array(this.scratch.buffer);

  /** Mixes a 32-bit word in. */
  word(w: number): this {
    this.h1 = Math.imul(this.h1 ^ w, 2654435761);
    this.h2 = Math.imul(this.h2 ^ w, 1597334677);
    return this;
  }

  /** Mixes the bits of each double in, then the count. */
  numbers(xs: ArrayLike<number> | null): this {
    if (xs === null) return this.word(0x9e3779b9);
    for (let i = 0; i < xs.length; i++) {
      this.scratch[0] = xs[i];
      this.word(this.words[0]).word(this.words[1]);
    }
    return this.word(xs.length);
  }

  text(s: string): this {
    for (let i = 0; i < s.length; i++) this.word(s.charCodeAt(i));
    return this.word(s.length);
  }

  /** 14 hex digits (53 bits). */
  hex(): string {
    let h1 = this.h1;
    let h2 = this.h2;
    h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
    h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
    const v = 4294967296 * (2097151 & h2) + (h1 >>> 0);
    return v.toString(16).padStart(14, '0');
  }
}
