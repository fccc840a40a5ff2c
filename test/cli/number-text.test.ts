import { NUMBER_TEXT_MAX, writeNumber } from '../../src/cli/number-text';

/** What writeNumber writes for x, or String(x) where it leaves the number to String (returns -1). */
function spelled(x: number, buf: Buffer): string | null {
  const end = writeNumber(x, buf, 0);
  return end < 0 ? null : buf.toString('latin1', 0, end);
}

/** A small seeded generator (a linear congruential one; only the spread of test values depends on it). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

describe('numbers written as bytes, as String(x) spells them', () => {
  // Source: ECMA-262, Number::toString (shortest round-trip digits, nearest to x; plain notation for
  // 1e-6 <= |x| < 1e21). The reference for every case is the JavaScript engine's own String(x).
  const buf = Buffer.alloc(64);
  const f64 = new Float64Array(1);
  const u32 = new Uint32Array(f64.buffer);

  /** Checks every value writeNumber writes; counts those it leaves to String(x) inside [1e-6, 1e21) in magnitude. */
  function expectSame(xs: Iterable<number>): { checked: number; left: number } {
    let checked = 0;
    let left = 0;
    const bad: string[] = [];
    for (const x of xs) {
      const s = spelled(x, buf);
      if (s === null) {
        if (Math.abs(x) >= 1e-6 && Math.abs(x) < 1e21) left++;
      } else {
        checked++;
        if (s !== String(x) && bad.length < 5) bad.push(`${String(x)} written as ${s}`);
      }
    }
    expect(bad).toEqual([]);
    return { checked, left };
  }

  test('hand-picked values: integers, short decimals, powers of ten and their neighbours, signs', () => {
    const xs = [0, -0, 1, -1, 0.1, 0.2 + 0.1, 1 / 3, -2 / 3, 100, 1e20, 123456789012345680000, 0.000001, 0.0000123, 1e-6, 2 ** 53 + 2, 2 ** 53, 2 ** 52 + 0.5];
    for (let e = -6; e <= 20; e++) {
      const p = Number(`1e${e}`);
      xs.push(p, -p, p * (1 + Number.EPSILON), p * (1 - Number.EPSILON / 2), (1 - 2 ** -52) * 10 * p, 5 * p, 2.5 * p);
    }
    const r = expectSame(xs);
    // Source: design choice: only the double nearest 1e-6 and its neighbours (scaled past 10^22 by the arithmetic) are left.
    expect(r.left).toBeLessThanOrEqual(4);
    // Source: ECMA-262 Number::toString (as above)
    expect(spelled(0.1 + 0.2, buf)).toBe('0.30000000000000004');
    expect(spelled(-0, buf)).toBe('0');
    expect(spelled(1e21, buf)).toBeNull(); // exponent notation: left to String(x)
    expect(spelled(NaN, buf)).toBeNull();
  });

  test('a million doubles of every kind in plain-notation range match String(x), and few are left to it', () => {
    const rnd = lcg(20261202);
    function* values(): Generator<number> {
      for (let i = 0; i < 300_000; i++) {
        // Random bits with an exponent in range: full 53-bit mantissas, the hard case.
        u32[0] = (rnd() * 4294967296) >>> 0;
        u32[1] = (((1023 - 20 + Math.floor(rnd() * 88)) << 20) | ((rnd() * 1048576) >>> 0)) >>> 0;
        yield rnd() < 0.5 ? f64[0] : -f64[0];
      }
      for (let i = 0; i < 300_000; i++) yield (rnd() - 0.5) * 10 ** (Math.floor(rnd() * 26) - 5);
      for (let i = 0; i < 200_000; i++) yield Math.round(rnd() * 1e7) / 10 ** Math.floor(rnd() * 8);
      for (let i = 0; i < 200_000; i++) yield Math.round(rnd() * 2 ** 53) * (rnd() < 0.5 ? 1 : 2 ** -20);
    }
    const r = expectSame(values());
    expect(r.checked).toBeGreaterThan(990_000);
    // Source: design choice (only values within 1e-9 of a half the arithmetic cannot settle are left: under 1 in 10,000)
    expect(r.left).toBeLessThan(100);
  });

  test('never writes more than NUMBER_TEXT_MAX bytes', () => {
    // Source: worked by hand: "-0.00000" and 17 digits is the longest plain form, 25 characters.
    const end = writeNumber(-0.0000012345678901234567, buf, 0);
    expect(end).toBeGreaterThan(0);
    expect(end).toBeLessThanOrEqual(NUMBER_TEXT_MAX);
    expect(buf.toString('latin1', 0, end)).toBe(String(-0.0000012345678901234567));
  });
});
