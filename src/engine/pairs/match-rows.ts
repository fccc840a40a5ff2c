import { RemapError } from '../errors';
import type { Progress } from '../map';
import type { Points } from '../points';
import { checkFinite } from '../validate';
import { solveAssignment } from './assignment';
import { auctionPrices } from './auction-prices';
import { squaredDistanceTable } from './cost-matrix';

/**
 * The most rows per sample the pairs method takes. Its cost table holds
 * n^2 doubles (5,000 rows: 200 MB), more than a spreadsheet host should be asked for.
 */
export const MAX_PAIRS_ROWS = 5000;
/** From this many rows the exact solver starts from auction prices (below it the cold start is as fast). */
const WARM_FROM = 64;

/** A matching of source rows to target rows with what it cost. */
export interface RowMatch {
  /** match[i] is the target row (0-based) paired with source row i; a permutation of 0..n-1. */
  readonly match: Int32Array;
  /** (1/n) sum_i |x_i - y_match[i]|^2, summed from the coordinates (not from the cost table). */
  readonly meanSquaredDistance: number;
  /** Rows matched by a shortest augmenting path (see solveAssignment). */
  readonly augmentations: number;
}

/**
 * The optimal one-to-one matching of equal-size samples under squared
 * Euclidean cost, with its mean squared distance, which is the exact squared
 * 2-Wasserstein distance between the two equal-weight empirical distributions:
 * an optimal plan between two uniform measures on n points may be taken to be
 * a permutation (Birkhoff-von Neumann: the extreme points of the doubly
 * stochastic matrices are the permutation matrices, and a linear cost attains
 * its minimum at an extreme point).
 *
 * Builds the n x n table of squared distances, finds near-optimal column
 * prices by the auction algorithm with epsilon-scaling (`auctionPrices`), then
 * solves the assignment problem exactly from them (Jonker & Volgenant 1987, see
 * solveAssignment); the exact solver's dual potentials still certify the optimum. The table is
 * built from each sample centred on its own mean and divided by its own
 * root-mean-square radius. This leaves the best permutation unchanged:
 * sum_i |x_i - y_s(i)|^2 = sum_i |x_i|^2 + sum_j |y_j|^2 - 2 sum_i <x_i, y_s(i)>,
 * centring adds to <x_i, y_j> terms in i alone or j alone (whose sum over a
 * permutation is fixed), and a positive scale multiplies the sum by a positive
 * number. It makes the two clouds overlap, which lets the solver's start-up
 * passes match most rows (a shifted target otherwise has every row wanting the
 * same few columns, and is ten times slower at n = 2,000). The reported cost is
 * computed from the original coordinates.
 *
 * Cost: O(n^2 d) to build the table, O(n^3) worst case to solve (about a
 * second for n = 2,000); 8 n^2 bytes of memory.
 *
 * @param source n rows, finite, 1 <= n <= MAX_PAIRS_ROWS. Not mutated.
 * @param target n rows with the same d, finite. Not mutated.
 * @param options signal (cancels with RemapError kind 'cancelled'), onProgress, caller (for messages), coldStart.
 * @throws RemapError if the sizes or column counts differ, a sample is empty, too large or not finite; or if cancelled.
 * @example
 * findPairs(column([0, 10]), column([11, 1])) // { match: Int32Array [1, 0], meanSquaredDistance: 1, ... }
 */
export function findPairs(
  source: Points,
  target: Points,
  options: {
    readonly signal?: { readonly aborted: boolean };
    readonly onProgress?: (p: Progress) => void;
    readonly caller?: string;
    /** Skip the auction prices and start the exact solver cold (for comparisons; the result is the same optimum). */
    readonly coldStart?: boolean;
  } = {},
): RowMatch {
  const fn = options.caller ?? 'findPairs';
  if (source.d !== target.d) {
    throw new RemapError(
      `${fn}: the source has ${source.d} column${source.d === 1 ? '' : 's'} and the target ${target.d}; give both the same columns in the same order.`,
    );
  }
  if (source.n !== target.n) {
    throw new RemapError(
      `${fn}: the source has ${source.n} rows and the target ${target.n}; the pairs method matches rows one to one and needs the same number of rows in both. Give samples of equal size, or use the entropic method, which takes samples of unequal sizes.`,
    );
  }
  const n = source.n;
  if (n < 1 || source.d < 1) {
    throw new RemapError(`${fn}: the samples are empty (${n} rows, ${source.d} columns); give at least one row of numbers in each.`);
  }
  if (n > MAX_PAIRS_ROWS) {
    throw new RemapError(
      `${fn}: ${n} rows in each sample is more than the ${MAX_PAIRS_ROWS} the pairs method takes (its table of distances grows as the square of the rows); use the entropic method for large samples, or match a random subset.`,
    );
  }
  checkFinite(source, 'source', fn);
  checkFinite(target, 'target', fn);
  const table = squaredDistanceTable(standardise(source), standardise(target), options.signal);
  // Auction prices first (epsilon-scaling), then the exact solver from them: on skewed and heavy-tailed data at
  // n = 2,000 (d = 3) this took the solve from 2.0-2.9 s of CPU to 0.5-0.6 s, with the same optimum (bench/pairs.bench.ts).
  const prices = n >= WARM_FROM && !options.coldStart ? auctionPrices(table, n, options.signal, fn, options.onProgress) : undefined;
  const a = solveAssignment(table, n, { signal: options.signal, onProgress: options.onProgress, caller: fn, prices });
  const { d } = source;
  const x = source.data;
  const y = target.data;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const xo = i * d;
    const yo = a.rowToCol[i] * d;
    for (let k = 0; k < d; k++) {
      const t = x[xo + k] - y[yo + k];
      sum += t * t;
    }
  }
  const meanSquaredDistance = sum / n;
  if (!Number.isFinite(meanSquaredDistance)) {
    throw new RemapError(
      `${fn}: the squared distances between the rows are too large to represent (the values reach about ${maxAbs(source, target).toExponential(1)}); rescale the columns (for example to thousands or millions) and fit again.`,
      'num',
    );
  }
  return { match: a.rowToCol, meanSquaredDistance, augmentations: a.augmentations };
}

/**
 * For each source row, the target row it is paired with in the optimal
 * one-to-one matching under squared Euclidean distance (0-based indices; a
 * permutation). This is what REMAP.PAIRS shows. See findPairs for the method.
 *
 * Cost: O(n^2 d) plus O(n^3) worst case; 8 n^2 bytes.
 *
 * @param source n rows, finite, 1 <= n <= MAX_PAIRS_ROWS. Not mutated.
 * @param target n rows with the same d. Not mutated.
 * @param signal optional; when `aborted` turns true the matching throws RemapError(kind 'cancelled').
 * @throws RemapError if the sizes or column counts differ, a sample is empty, too large or not finite; or if cancelled.
 * @example
 * matchRows(points([[0, 0], [5, 5]]), points([[6, 5], [1, 0]])) // Int32Array [1, 0]
 */
export function matchRows(source: Points, target: Points, signal?: { readonly aborted: boolean }): Int32Array {
  return findPairs(source, target, { signal, caller: 'matchRows' }).match;
}

/**
 * The sample divided by its largest absolute value, then centred on its mean
 * and divided by its root-mean-square distance from the mean (each step
 * skipped when its divisor is 0). The first step keeps the rest from
 * overflowing. A new Points; O(n d).
 */
function standardise(p: Points): Points {
  const { n, d, data } = p;
  let big = 0;
  for (let t = 0; t < data.length; t++) big = Math.max(big, Math.abs(data[t]));
  const pre = big > 0 ? big : 1;
  const out = new Float64Array(n * d);
  for (let t = 0; t < out.length; t++) out[t] = data[t] / pre;
  const mean = new Float64Array(d);
  for (let i = 0; i < n; i++) for (let k = 0; k < d; k++) mean[k] += out[i * d + k];
  for (let k = 0; k < d; k++) mean[k] /= n;
  let ss = 0;
  for (let t = 0; t < out.length; t++) {
    const a = out[t] - mean[t % d];
    out[t] = a;
    ss += a * a;
  }
  const radius = Math.sqrt(ss / n);
  if (radius > 0) for (let t = 0; t < out.length; t++) out[t] /= radius;
  return { n, d, data: out };
}

function maxAbs(a: Points, b: Points): number {
  let m = 0;
  for (const p of [a, b]) for (let t = 0; t < p.data.length; t++) m = Math.max(m, Math.abs(p.data[t]));
  return m;
}
