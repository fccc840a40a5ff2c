import { RemapError } from '../errors';
import type { Points } from '../points';
import { Random } from '../stats/random';

/** The outcome of `twoCycleCheck`. */
export interface TwoCycleReport {
  /** The smallest <x_i - x_j, y_sigma(i) - y_sigma(j)> found (0 when fewer than two rows). */
  readonly smallest: number;
  /** The pair (i, j) where it was found, or null when no pair was checked. */
  readonly worst: readonly [number, number] | null;
  /** How many pairs were checked. */
  readonly pairs: number;
  /** True if every pair was checked (n(n-1)/2 <= maxPairs), false if a seeded sample was. */
  readonly exhaustive: boolean;
  /** Values down to -tolerance count as rounding: 1e-9 times the squared diameter of all the rows. */
  readonly tolerance: number;
  /** smallest >= -tolerance. */
  readonly passed: boolean;
}

/** Fixed so that the same pairs always give the same report. */
const DEFAULT_SEED = 20240607;

/**
 * Checks a matching for the 2-cycle form of cyclical monotonicity: for source
 * rows i, j matched to target rows sigma(i), sigma(j),
 *   <x_i - x_j, y_sigma(i) - y_sigma(j)> >= 0,
 * which is the same as saying that swapping the two partners does not lower
 * |x_i - y_sigma(i)|^2 + |x_j - y_sigma(j)|^2. Every optimal matching under
 * squared Euclidean cost passes (its support is cyclically monotone: Knott &
 * Smith, "On the optimal mapping of distributions", J. Optim. Theory Appl. 43
 * (1984); Rockafellar, "Convex Analysis" (1970), Thm 24.8), so a failure beyond
 * rounding means the matching is not optimal.
 *
 * All pairs are checked when n(n-1)/2 <= maxPairs; otherwise maxPairs pairs
 * are drawn with a seeded generator (stats/random.ts), so the report is reproducible.
 *
 * Cost: O(min(n^2, maxPairs) d) time, O(1) extra memory.
 *
 * @param source n rows x_i. Not mutated.
 * @param target rows y_j with the same d (at least n of them). Not mutated.
 * @param match match[i] is the target row of source row i, each in 0..target.n-1.
 * @param options maxPairs (a whole number >= 1, default 200,000) and seed (a whole number, default fixed).
 * @throws RemapError if the columns differ, `match` has the wrong length or an entry out of range.
 * @example
 * twoCycleCheck(column([0, 1]), column([5, 7]), Int32Array.from([1, 0])).smallest // -2
 */
export function twoCycleCheck(
  source: Points,
  target: Points,
  match: Int32Array,
  options: { readonly maxPairs?: number; readonly seed?: number } = {},
): TwoCycleReport {
  const fn = 'twoCycleCheck';
  const maxPairs = options.maxPairs ?? 200000;
  if (!Number.isInteger(maxPairs) || maxPairs < 1) {
    throw new RemapError(`${fn}: maxPairs must be a whole number of at least 1, not ${String(maxPairs)}.`);
  }
  if (source.d !== target.d) {
    throw new RemapError(`${fn}: the source has ${source.d} columns and the target ${target.d}; give both the same columns.`);
  }
  const { n, d } = source;
  if (match.length !== n) {
    throw new RemapError(`${fn}: the matching has ${match.length} entries for ${n} source rows; give one target row per source row.`);
  }
  for (let i = 0; i < n; i++) {
    const j = match[i];
    if (!(j >= 0 && j < target.n)) {
      throw new RemapError(`${fn}: entry ${i + 1} of the matching is ${j}, outside the target rows 0..${target.n - 1}.`);
    }
  }
  const tolerance = 1e-9 * squaredDiameter(source, target);
  const x = source.data;
  const y = target.data;
  const value = (i: number, j: number): number => {
    const xi = i * d;
    const xj = j * d;
    const yi = match[i] * d;
    const yj = match[j] * d;
    let s = 0;
    for (let k = 0; k < d; k++) s += (x[xi + k] - x[xj + k]) * (y[yi + k] - y[yj + k]);
    return s;
  };
  let smallest = Infinity;
  let worst: [number, number] | null = null;
  let pairs = 0;
  const all = (n * (n - 1)) / 2;
  const exhaustive = all <= maxPairs;
  if (exhaustive) {
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        const s = value(i, j);
        pairs++;
        if (s < smallest) {
          smallest = s;
          worst = [i, j];
        }
      }
    }
  } else {
    const random = new Random(options.seed ?? DEFAULT_SEED);
    while (pairs < maxPairs) {
      const i = random.int(n);
      const j = random.int(n);
      if (i === j) continue; // n >= 2 here, so this ends (expected extra draws 1/(n-1) per pair)
      const s = value(i, j);
      pairs++;
      if (s < smallest) {
        smallest = s;
        worst = i < j ? [i, j] : [j, i];
      }
    }
  }
  if (pairs === 0) smallest = 0;
  return { smallest, worst, pairs, exhaustive, tolerance, passed: smallest >= -tolerance };
}

/** sum_k (max_k - min_k)^2 over the rows of both samples. */
function squaredDiameter(a: Points, b: Points): number {
  let s = 0;
  for (let k = 0; k < a.d; k++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const p of [a, b]) {
      for (let i = 0, t = k; i < p.n; i++, t += p.d) {
        const v = p.data[t];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
    if (hi > lo) s += (hi - lo) * (hi - lo);
  }
  return s;
}
