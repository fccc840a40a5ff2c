import { BaseMap, sizeWarnings, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { CostReport, FitRecord, MapJSON, Mapped, Warning } from '../map';
import type { Points } from '../points';
import { divideColumns } from '../stats/column-scales';
import { RowLookup } from './row-lookup';
import { twoCycleCheck } from './two-cycle-check';

/** The fitted parameters of a pairs map as stored in JSON. */
export interface PairsParams {
  /** The source rows the map was fitted on, row by row. */
  readonly source: number[][];
  /** The target rows, row by row. */
  readonly target: number[][];
  /** permutation[i]: the target row (0-based) paired with source row i. */
  readonly permutation: number[];
}

/**
 * A fitted pairs map: the optimal one-to-one matching of n source rows to n
 * target rows. It maps the source rows only (and inverts the target rows
 * only): a matching says nothing about points it was not fitted on.
 *
 * Repeated rows. When a value occurs in several source rows, those rows may
 * be paired with different targets; `apply` on that value returns the average
 * of their targets (likewise `invert` on a repeated target value returns the
 * average of its sources). This keeps the map monotone: the support of an
 * optimal matching is cyclically monotone, so it lies in the subdifferential
 * of a convex function phi (Rockafellar, "Convex Analysis" (1970), Thm 24.8);
 * that subdifferential is convex at each point, so the average of the targets
 * of x lies in it too, and any selection of a subdifferential is cyclically
 * monotone. For a value that occurs once, the result is its matched row exactly.
 *
 * -0 is stored as 0 (so that the JSON, which cannot hold -0, restores the map
 * bit for bit).
 *
 * Cost: apply and invert take O(d) expected per row (a hash lookup); the map
 * holds both samples, O(n d) memory.
 *
 * @example
 * const m = fitPairs(sample([0, 10]), sample([11, 1]), { tails: 'clamp' });
 * m.apply(column([10, 0])).data // Float64Array [11, 1]
 * m.apply(column([5]))          // throws RemapError (kind 'na'): 5 is not a source row
 */
export class PairsMap extends BaseMap {
  private readonly source: Points;
  private readonly target: Points;
  private readonly match: Int32Array;
  private readonly sourceLookup: RowLookup;
  private readonly targetLookup: RowLookup;
  /** Image of each distinct source value (row g*d.. of this array is group g's). */
  private readonly forward: Float64Array;
  /** Pre-image of each distinct target value. */
  private readonly backward: Float64Array;

  private constructor(header: MapHeader, fitted: FitRecord, source: Points, target: Points, match: Int32Array) {
    super(header, fitted);
    this.source = source;
    this.target = target;
    this.match = match;
    this.sourceLookup = new RowLookup(source);
    this.targetLookup = new RowLookup(target);
    const inverse = new Int32Array(match.length);
    for (let i = 0; i < match.length; i++) inverse[match[i]] = i;
    this.forward = groupAverages(this.sourceLookup, match, target);
    this.backward = groupAverages(this.targetLookup, inverse, source);
  }

  /**
   * Builds the map from a matching found by `findPairs` (or any permutation:
   * the fit record then reports the 2-cycle check on it). Copies the rows.
   * Cost: O(n d) plus the 2-cycle check, O(min(n^2, 200,000) d).
   * @param source n rows; target n rows of the same d; match a permutation of 0..n-1.
   * @param header what the fit was (method 'pairs', d, settings, columns, n, dropped).
   * @param augmentations rows matched by augmenting paths, for the convergence record.
   * @param scales per-column divisors the pairing was optimal for (units = standardised: the pooled spreads), or
   *   null for raw units; the cost and the 2-cycle check are then read in those units.
   * @throws RemapError if `match` is not a permutation of 0..n-1 or the shapes disagree.
   */
  static fromMatch(source: Points, target: Points, match: Int32Array, header: MapHeader, augmentations = 0, scales: Float64Array | null = null): PairsMap {
    const fn = 'fit (pairs)';
    checkShapes(source, target, header, fn);
    const perm = checkPermutation(Array.from(match), source.n, fn);
    const s = copyPoints(source);
    const t = copyPoints(target);
    const fitted = fitRecord(s, t, perm, header, augmentations, scales);
    return new PairsMap(header, fitted, s, t, perm);
  }

  /**
   * Restores a map from `toJSON()` output (envelope already checked), bit for bit.
   * Cost: O(n d).
   * @throws RemapError saying which part of the params is wrong.
   */
  static fromJSON(json: MapJSON): PairsMap {
    const fn = 'load (pairs)';
    const p = json.params as Partial<PairsParams> | null;
    if (p === null || typeof p !== 'object') throw new RemapError(`${fn}: the saved map has no params; save the map again.`);
    const n = json.n.source;
    if (json.n.target !== n) throw new RemapError(`${fn}: the saved map has ${n} source and ${json.n.target} target rows; a pairs map needs the same number.`);
    const source = rowsToPoints(p.source, n, json.d, 'source', fn);
    const target = rowsToPoints(p.target, n, json.d, 'target', fn);
    const perm = checkPermutation(p.permutation, n, fn);
    const header: MapHeader = {
      method: 'pairs',
      d: json.d,
      settings: json.settings,
      columns: json.columns,
      n: json.n,
      dropped: json.dropped,
    };
    return new PairsMap(header, json.fitted, source, target, perm);
  }

  /**
   * The paired target row (0-based) of each source row; a copy. O(n).
   * @example fitPairs(sample([0, 10]), sample([11, 1]), { tails: 'clamp' }).pairs() // Int32Array [1, 0]
   */
  pairs(): Int32Array {
    return this.match.slice();
  }

  protected applyPoints(x: Points): Mapped {
    return this.lookUp(x, this.sourceLookup, this.forward, 'apply', 'source', 'maps the source rows only');
  }

  protected invertPoints(y: Points): Mapped {
    return this.lookUp(y, this.targetLookup, this.backward, 'invert', 'target', 'inverts the target rows only');
  }

  protected params(): PairsParams {
    return {
      source: toRowArrays(this.source),
      target: toRowArrays(this.target),
      permutation: Array.from(this.match),
    };
  }

  private lookUp(x: Points, lookup: RowLookup, images: Float64Array, verb: string, side: string, what: string): Mapped {
    const { d } = this;
    const out = new Float64Array(x.n * d);
    for (let r = 0; r < x.n; r++) {
      const g = lookup.find(x.data, r * d);
      if (g < 0) {
        const shown = Array.from(x.data.subarray(r * d, r * d + Math.min(d, 5))).join(', ') + (d > 5 ? ', ...' : '');
        throw new RemapError(
          `${verb} (pairs): row ${r + 1} of the values (${shown}) is not one of the ${lookup.n} ${side} rows the map was fitted on; the pairs method ${what}. To map new points, fit with the entropic or gradient-net method.`,
          'na',
        );
      }
      out.set(images.subarray(g * d, (g + 1) * d), r * d);
    }
    return { n: x.n, d, data: out, outside: 0 };
  }
}

/** Average of the partner rows of each group of identical rows (exact copy for a group of one). */
function groupAverages(lookup: RowLookup, partner: Int32Array, other: Points): Float64Array {
  const { d } = other;
  const out = new Float64Array(lookup.groups * d);
  for (let i = 0; i < lookup.n; i++) {
    const g = lookup.groupOf[i];
    const po = partner[i] * d;
    for (let k = 0; k < d; k++) out[g * d + k] += other.data[po + k];
  }
  for (let g = 0; g < lookup.groups; g++) {
    const m = lookup.groupSize[g];
    if (m > 1) for (let k = 0; k < d; k++) out[g * d + k] /= m;
  }
  return out;
}

function fitRecord(raw: Points, rawTarget: Points, match: Int32Array, header: MapHeader, augmentations: number, scales: Float64Array | null): FitRecord {
  // The cost and the monotonicity check in the units the pairing is optimal for.
  const source = scales ? divideColumns(raw, scales) : raw;
  const target = scales ? divideColumns(rawTarget, scales) : rawTarget;
  const { n, d } = source;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < d; k++) {
      const t = source.data[i * d + k] - target.data[match[i] * d + k];
      sum += t * t;
    }
  }
  const w2Squared = sum / n;
  const cost: CostReport = {
    kind: 'assignment',
    w2Squared,
    w2: Math.sqrt(w2Squared),
    units: scales ? 'standardised' : 'raw',
    note: scales
      ? 'Mean squared distance, in standardised units (each column divided by its pooled spread), between each source row and its partner in the optimal one-to-one matching: the exact squared 2-Wasserstein distance between the two samples for that weighted cost (equal sizes, equal weights).'
      : 'Mean squared distance between each source row and its partner in the optimal one-to-one matching: the exact squared 2-Wasserstein distance between the two samples (equal sizes, equal weights).',
  };
  const warnings: Warning[] = [...sizeWarnings(header)];
  warnings.push({
    code: 'source-rows-only',
    message: `The pairs map pairs the ${n} source rows with the ${n} target rows one to one; it maps those source rows only (and inverts those target rows only): any other value gives an error (#N/A) naming its row, never a guess.`,
    action: 'To map values that are not source rows, fit with the entropic or gradient-net method.',
  });
  const srcLook = new RowLookup(raw);
  const tgtLook = new RowLookup(rawTarget);
  if (srcLook.groups < n || tgtLook.groups < n) {
    warnings.push({
      code: 'ties',
      message: `Some rows repeat (${n - srcLook.groups} repeated source rows, ${n - tgtLook.groups} repeated target rows); repeated rows may be paired with different partners.`,
      action:
        'Applying the map to a repeated source value returns the average of its partners (inverting a repeated target value, the average of its sources); use the pairs table for row-by-row partners.',
    });
  }
  const check = twoCycleCheck(source, target, match);
  if (!check.passed) {
    const [i, j] = check.worst ?? [0, 0];
    warnings.push({
      code: 'not-converged',
      message: `The pairing failed a monotonicity check: for source rows ${i + 1} and ${j + 1}, <x_i - x_j, y_i - y_j> = ${check.smallest.toPrecision(4)} < 0 (beyond rounding, ${check.tolerance.toPrecision(2)}), so swapping their partners would lower the cost; the pairing is not optimal.`,
      action: 'Please report this with the data; meanwhile rescale the columns to similar ranges, or use the entropic method.',
    });
  }
  return {
    cost,
    convergence: {
      iterations: augmentations,
      finalError: Math.max(0, -check.smallest),
      converged: check.passed,
      criterion: `Exact assignment (iterations = rows matched by augmenting paths); error = largest violation of <x_i - x_j, y_i - y_j> >= 0 over ${check.pairs} ${check.exhaustive ? '' : 'sampled '}pairs of rows (0: none).`,
    },
    warnings,
  };
}

function checkShapes(source: Points, target: Points, header: MapHeader, fn: string): void {
  if (source.d !== target.d || source.d !== header.d) {
    throw new RemapError(`${fn}: the source has ${source.d} columns, the target ${target.d} and the header ${header.d}; they must agree.`);
  }
  if (source.n !== target.n) {
    throw new RemapError(
      `${fn}: the source has ${source.n} rows and the target ${target.n}; the pairs method needs the same number of rows in both (use the entropic method for unequal sizes).`,
    );
  }
  if (source.n < 1) throw new RemapError(`${fn}: the samples have no rows; give at least one row in each.`);
}

function checkPermutation(raw: unknown, n: number, fn: string): Int32Array {
  if (!Array.isArray(raw) || raw.length !== n) {
    throw new RemapError(`${fn}: the permutation must list ${n} target rows, one per source row; it has ${Array.isArray(raw) ? raw.length : 'none'}.`);
  }
  const seen = new Uint8Array(n);
  const out = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const j = raw[i] as unknown;
    if (typeof j !== 'number' || !Number.isInteger(j) || j < 0 || j >= n || seen[j]) {
      throw new RemapError(
        `${fn}: entry ${i + 1} of the permutation (${String(j)}) must be a whole number from 0 to ${n - 1} not used before; each target row is paired once.`,
      );
    }
    seen[j] = 1;
    out[i] = j;
  }
  return out;
}

function rowsToPoints(raw: unknown, n: number, d: number, name: string, fn: string): Points {
  if (!Array.isArray(raw) || raw.length !== n) {
    throw new RemapError(`${fn}: the saved ${name} rows must be a list of ${n} rows; found ${Array.isArray(raw) ? raw.length : 'none'}.`);
  }
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const row = raw[i] as unknown;
    if (!Array.isArray(row) || row.length !== d) {
      throw new RemapError(`${fn}: saved ${name} row ${i + 1} must hold ${d} numbers.`);
    }
    for (let k = 0; k < d; k++) {
      const v = row[k] as unknown;
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new RemapError(`${fn}: saved ${name} row ${i + 1}, column ${k + 1} is not a finite number (${String(v)}).`);
      }
      data[i * d + k] = v + 0;
    }
  }
  return { n, d, data };
}

function copyPoints(p: Points): Points {
  const data = new Float64Array(p.data.length);
  for (let t = 0; t < data.length; t++) data[t] = p.data[t] + 0; // -0 + 0 is +0
  return { n: p.n, d: p.d, data };
}

function toRowArrays(p: Points): number[][] {
  const rows: number[][] = new Array(p.n);
  for (let i = 0; i < p.n; i++) rows[i] = Array.from(p.data.subarray(i * p.d, (i + 1) * p.d));
  return rows;
}
