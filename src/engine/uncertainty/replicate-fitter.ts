import { RemapError } from '../errors';
import { fitLinear } from '../linear/fit';
import type { Points, Sample } from '../points';
import type { ColumnMap } from '../quantile/column-map';
import { ordinalColumn } from '../quantile/ordinal-column';
import { quantileColumn } from '../quantile/quantile-column';
import { stepColumn } from '../quantile/step-column';
import { checkWholeNumbers } from '../quantile/whole-numbers';
import type { Settings } from '../settings';
import { sortWithOrder } from '../stats/sort';
import type { WeightedCdf } from '../stats/weighted-cdf';

/** The methods whose mapped values get bounds: the 1-D ones and linear. */
export type BoundedMethod = 'quantile' | 'step' | 'ordinal' | 'linear';

/** One side sorted once: its distinct values, and for each row the index of its value. */
export interface SortedSide {
  readonly distinct: Float64Array;
  /** distinctOf[i] = index into `distinct` of row i's value. */
  readonly distinctOf: Int32Array;
  /** Full-sample weight of each distinct value (row weights, or 1 per row, added up). */
  readonly weight: Float64Array;
}

/** Sorts one column once and merges ties. O(n log n) (O(n) above 4,096 rows). */
export function sortSide(s: Sample): SortedSide {
  const col = s.data.length === s.n ? s.data : s.data.subarray(0, s.n);
  const { sorted, order } = sortWithOrder(col);
  const n = s.n;
  const distinctOf = new Int32Array(n);
  const tmp = new Float64Array(n);
  const w = new Float64Array(n);
  let k = -1;
  for (let i = 0; i < n; i++) {
    if (k < 0 || sorted[i] !== tmp[k]) tmp[++k] = sorted[i];
    distinctOf[order[i]] = k;
    w[k] += s.weights ? s.weights[order[i]] : 1;
  }
  return { distinct: tmp.slice(0, k + 1), distinctOf, weight: w.slice(0, k + 1) };
}

/**
 * Refits a map from the same rows with other weights, many times over, as
 * cheaply as the method allows, and maps a fixed set of values each time.
 * For the 1-D methods both samples are sorted once (`sortSide`) and a refit
 * takes weights per distinct value: O(k_s + k_t + v), no sort, the same
 * column builders as the method itself (so weights equal to the sample's give
 * the fitted map's own numbers). For linear a refit recomputes the weighted
 * moments, O((n + m) d^2 + d^3 + v d^2).
 */
export class ReplicateFitter {
  readonly method: BoundedMethod;
  readonly d: number;
  readonly source: Sample;
  readonly target: Sample;
  readonly sides: { readonly source: SortedSide; readonly target: SortedSide } | null;
  private readonly values: Points;
  private readonly sortedValues: Float64Array | null;
  private readonly valueOrder: Uint32Array | null;
  private readonly settings: Settings;
  private readonly build: ((s: WeightedCdf, t: WeightedCdf, where: string) => ColumnMap) | null;

  /**
   * @param source,target validated samples (see prepareFit); one column for the 1-D methods.
   * @param values the values to map (d columns).
   * @param settings resolved settings of the method.
   */
  constructor(method: BoundedMethod, source: Sample, target: Sample, values: Points, settings: Settings) {
    this.method = method;
    this.d = source.d;
    this.source = source;
    this.target = target;
    this.values = values;
    this.settings = settings;
    if (method === 'linear') {
      this.sides = null;
      this.sortedValues = null;
      this.valueOrder = null;
      this.build = null;
      return;
    }
    if (source.d !== 1) throw new RemapError(`bounds (${method}): bounds for the ${method} method are for one column; give one column, or use method linear.`);
    if (method === 'ordinal') {
      checkWholeNumbers(source.data.subarray(0, source.n), 'bounds (ordinal): source');
      checkWholeNumbers(target.data.subarray(0, target.n), 'bounds (ordinal): target');
    }
    this.sides = { source: sortSide(source), target: sortSide(target) };
    const sv = sortWithOrder(values.data.subarray(0, values.n));
    this.sortedValues = sv.sorted;
    this.valueOrder = sv.order;
    this.build = method === 'quantile' ? quantileColumn : method === 'step' ? stepColumn : (s, t) => ordinalColumn(s, t);
  }

  /**
   * The mapped values under the map fitted with weights `sw` and `tw`: per
   * distinct value for the 1-D methods, per row for linear. Writes v * d
   * numbers to `out`. Cost: see the class.
   * @throws RemapError when the weights leave a side unable to fit (one distinct value, a singular covariance).
   */
  mapWith(sw: Float64Array, tw: Float64Array, out: Float64Array): void {
    if (this.method === 'linear') {
      const map = fitLinear({ ...this.source, weights: sw }, { ...this.target, weights: tw }, this.settings, {}, { compare: false });
      out.set(map.apply(this.values).data);
      return;
    }
    const sides = this.sides!;
    const column = this.build!(cdfOf(sides.source.distinct, sw), cdfOf(sides.target.distinct, tw), 'bounds');
    column.forward.evaluateAscending(this.sortedValues!, out, this.settings.tails === 'linear' ? 'linear' : 'clamp', null, this.valueOrder);
  }

  /** Row weights aggregated to distinct values (1-D methods), or copied (linear). O(n). */
  perUnit(side: 'source' | 'target', rowWeights: ArrayLike<number>): Float64Array {
    const s = side === 'source' ? this.source : this.target;
    if (this.method === 'linear') return Float64Array.from(rowWeights);
    const sd = side === 'source' ? this.sides!.source : this.sides!.target;
    const out = new Float64Array(sd.distinct.length);
    for (let i = 0; i < s.n; i++) out[sd.distinctOf[i]] += rowWeights[i];
    return out;
  }

  /** For each row, the unit its weight goes to in `mapWith` (its distinct value for 1-D, itself for linear). */
  unitOfRow(side: 'source' | 'target'): Int32Array {
    const s = side === 'source' ? this.source : this.target;
    if (this.method === 'linear') return Int32Array.from({ length: s.n }, (_, i) => i);
    return side === 'source' ? this.sides!.source.distinctOf : this.sides!.target.distinctOf;
  }

  /** The full-sample weights in the unit `mapWith` takes. */
  fullWeights(side: 'source' | 'target'): Float64Array {
    const s = side === 'source' ? this.source : this.target;
    if (this.method === 'linear') return s.weights ? Float64Array.from(s.weights) : new Float64Array(s.n).fill(1);
    return Float64Array.from(side === 'source' ? this.sides!.source.weight : this.sides!.target.weight);
  }
}

/** The merged CDF of distinct ascending values with weights (zero weights left out). O(k). */
function cdfOf(distinct: Float64Array, w: Float64Array): WeightedCdf {
  const k = distinct.length;
  let m = 0;
  for (let i = 0; i < k; i++) if (w[i] > 0) m++;
  const values = new Float64Array(m);
  const cumulative = new Float64Array(m);
  let total = 0;
  let j = 0;
  for (let i = 0; i < k; i++) {
    const wi = w[i];
    if (wi > 0) {
      total += wi;
      values[j] = distinct[i];
      cumulative[j++] = total;
    }
  }
  if (m === 0) throw new RemapError('bounds: a replicate gives no row a positive weight.');
  return { values, cumulative, total, rows: m, tiedRows: 0 };
}
