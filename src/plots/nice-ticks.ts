/**
 * Tick positions and labels for a plot axis: "nice" steps of 1, 2 or 5 times a
 * power of ten (common practice, as in most plotting libraries), covering
 * [lo, hi].
 */

/** An axis range widened to nice ticks, and the ticks. */
export interface Ticks {
  /** Axis start and end (the first and last tick). */
  readonly lo: number;
  readonly hi: number;
  readonly step: number;
  readonly values: readonly number[];
}

/**
 * Nice ticks covering [lo, hi], about `count` of them (at least 2 intervals).
 * A zero-width or non-finite range is widened around its value (or to [0, 1]).
 * O(count).
 * @param lo,hi the data range (any order; non-finite gives [0, 1]).
 * @param count wanted number of intervals, 2..20 (clamped).
 * @example niceTicks(0.3, 9.2, 5) // { lo: 0, hi: 10, step: 2, values: [0, 2, 4, 6, 8, 10] }
 */
export function niceTicks(lo: number, hi: number, count = 5): Ticks {
  let a = Math.min(lo, hi);
  let b = Math.max(lo, hi);
  if (!Number.isFinite(a) || !Number.isFinite(b)) {
    a = 0;
    b = 1;
  }
  if (b - a <= Math.abs(a) * 1e-12 || b === a) {
    const pad = a === 0 ? 1 : Math.abs(a) * 0.1;
    a -= pad;
    b += pad;
  }
  const n = Math.max(2, Math.min(20, Math.round(count)));
  const raw = (b - a) / n;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  const step = (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * mag;
  const start = Math.floor(a / step + 1e-9) * step;
  const end = Math.ceil(b / step - 1e-9) * step;
  const values: number[] = [];
  const k = Math.round((end - start) / step);
  for (let i = 0; i <= k && i <= 200; i++) values.push(clean(start + i * step, step));
  return { lo: values[0], hi: values[values.length - 1], step, values };
}

/** Removes floating-point dust such as 0.30000000000000004 at the step's precision. */
function clean(v: number, step: number): number {
  const digits = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  return Number(v.toFixed(Math.min(15, digits)));
}

/**
 * A short label for tick value `v` on an axis with tick spacing `step`:
 * in thousands ("k") when the step is 1,000 or more, in millions ("M") when it
 * is 100,000 or more, and with no more decimals than the step needs.
 * O(1).
 * @example formatTick(25000, 5000) // '25k'
 * @example formatTick(0.25, 0.05) // '0.25'
 */
export function formatTick(v: number, step: number): string {
  if (v === 0) return '0';
  const abs = Math.abs(step);
  const fmt = (x: number, s: number) => x.toFixed(decimalsOf(s)).replace(/^-0(\.0+)?$/, '0');
  if (!Number.isFinite(v)) return String(v);
  if (abs >= 1e5) return fmt(v / 1e6, abs / 1e6) + 'M';
  if (abs >= 1e3) return fmt(v / 1e3, abs / 1e3) + 'k';
  return fmt(v, abs);
}

/** The fewest decimals that write every multiple of `step` exactly (0.25 -> 2, 5 -> 0), at most 10. O(1). */
export function decimalsOf(step: number): number {
  if (!Number.isFinite(step) || step <= 0) return 0;
  for (let d = 0; d <= 10; d++) {
    const scaled = step * Math.pow(10, d);
    if (Math.abs(scaled - Math.round(scaled)) < 1e-6 * Math.max(1, scaled)) return d;
  }
  return 10;
}
