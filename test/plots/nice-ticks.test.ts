import { decimalsOf, formatTick, niceTicks } from '../../src/plots/nice-ticks';

describe('niceTicks', () => {
  test('steps are 1, 2 or 5 times a power of ten and the ticks cover the data range', () => {
    // Source: common practice (nice numbers for graph labels)
    const t = niceTicks(0.3, 9.2, 5);
    expect(t.step).toBe(2);
    expect(t.values).toEqual([0, 2, 4, 6, 8, 10]);
    for (const [lo, hi, n] of [
      [-123.4, 5678.9, 6],
      [0.0012, 0.0097, 4],
      [1e6, 3.2e6, 5],
      [-5, -4.99, 3],
    ] as const) {
      const r = niceTicks(lo, hi, n);
      expect(r.lo).toBeLessThanOrEqual(lo);
      expect(r.hi).toBeGreaterThanOrEqual(hi);
      const mant = r.step / Math.pow(10, Math.floor(Math.log10(r.step) + 1e-12));
      expect([1, 2, 5, 10].some((m) => Math.abs(mant - m) < 1e-9)).toBe(true);
    }
  });
  test('a zero-width or non-finite range still gives at least two ticks', () => {
    // Source: common practice
    expect(niceTicks(5, 5).values.length).toBeGreaterThanOrEqual(2);
    expect(niceTicks(NaN, Infinity).lo).toBe(0);
    expect(niceTicks(NaN, Infinity).hi).toBe(1);
  });
  test('tick values carry no floating-point dust', () => {
    // Source: common practice (0.1 + 0.2 is not 0.3 in binary floating point)
    expect(niceTicks(0, 0.9, 9).values).toContain(0.3);
  });
});

describe('formatTick', () => {
  test('uses k and M for thousands and millions, and only the decimals the step needs', () => {
    // Source: common practice
    expect(formatTick(25000, 5000)).toBe('25k');
    expect(formatTick(5000, 5000)).toBe('5k');
    expect(formatTick(1500000, 500000)).toBe('1.5M');
    expect(formatTick(0.25, 0.25)).toBe('0.25');
    expect(formatTick(0.5, 0.25)).toBe('0.50');
    expect(formatTick(-20, 10)).toBe('-20');
    expect(formatTick(0, 0.1)).toBe('0');
  });
  test('decimalsOf(step) is the fewest decimals that write multiples of step exactly', () => {
    // Source: common practice
    expect(decimalsOf(0.25)).toBe(2);
    expect(decimalsOf(5)).toBe(0);
    expect(decimalsOf(0.001)).toBe(3);
  });
});
