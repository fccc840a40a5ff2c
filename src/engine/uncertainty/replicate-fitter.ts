import { RemapError } from '../errors';
import { fitLinear } from '../linear/fit';
import type { Points, Sample } from '../points';
import type { ColumnMap } from '../quantile/column-map';
import type { Tails } from '../quantile/one-way-map';
import { ordinalColumn } from '../quantile/ordinal-column';
import { quantileColumn } from '../quantile/quantile-column';
import { stepColumn } from '../quantile/step-column';
import { checkWholeNumbers } from '../quantile/whole-numbers';
import type { Settings } from '../settings';
import { sortWithOrder } from '../stats/sort';
import type { WeightedCdf } from '../stats/weighted-cdf';
import { cumulateWeights, differences } from './cumulative-shares';
import { LinearRefit } from './linear-refit';
import { QuantileAtValues } from './quantile-at-values';
import { sortSide, type SortedSide } from './sorted-side';
import { StepAtValues } from './step-at-values';

/** The methods whose mapped values get bounds: the 1-D ones and linear. */
export type BoundedMethod = 'quantile' | 'step' | 'ordinal' | 'linear';

/**
 * Refits a map from the same rows with other weights, many times over, as
 * cheaply as the method allows, and maps a fixed set of values each time.
 * For the 1-D methods both samples are sorted once (`sortSide`) and a refit
 * takes weights per distinct value. Quantile and step then read the refitted
 * map at the values only (`QuantileAtValues`, `StepAtValues`): O(K_s + K_t)
 * to add up the weights plus O(v log K_t), no knots built, the same numbers as
 * the method's own refit. Ordinal builds its (small) grids with the method's
 * own column builder. Linear recomputes the weighted moments (`LinearRefit`),
 * O((n + m) d^2 + d^3 + v d^2). `refit` is the general way (the method's own
 * fit on the reweighted samples), kept to check the fast ones against.
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
  private readonly tails: Tails;
  private readonly build: ((s: WeightedCdf, t: WeightedCdf, where: string) => ColumnMap) | null;
  private readonly quantile: QuantileAtValues | null = null;
  private readonly step: StepAtValues | null = null;
  private readonly linear: LinearRefit | null = null;
  /** Buffers for cumulative weights (1-D) and weights taken back from them. */
  private readonly cumS: Float64Array;
  private readonly cumT: Float64Array;
  private readonly wS: Float64Array;
  private readonly wT: Float64Array;

  /**
   * @param source,target validated samples (see prepareFit); one column for the 1-D methods.
   * @param values the values to map (d columns).
   * @param settings resolved settings of the method.
   * @throws RemapError for a 1-D method given several columns, or ordinal scores that are not whole numbers.
   */
  constructor(method: BoundedMethod, source: Sample, target: Sample, values: Points, settings: Settings) {
    this.method = method;
    this.d = source.d;
    this.source = source;
    this.target = target;
    this.values = values;
    this.settings = settings;
    this.tails = settings.tails === 'linear' ? 'linear' : 'clamp';
    if (method === 'linear') {
      this.sides = null;
      this.sortedValues = null;
      this.valueOrder = null;
      this.build = null;
      this.linear = new LinearRefit(source, target, values, settings);
      this.cumS = this.cumT = this.wS = this.wT = new Float64Array(0);
      return;
    }
    if (source.d !== 1) throw new RemapError(`bounds (${method}): bounds for the ${method} method are for one column; give one column, or use method linear.`);
    if (method === 'ordinal') {
      checkWholeNumbers(source.data.subarray(0, source.n), 'bounds (ordinal): source');
      checkWholeNumbers(target.data.subarray(0, target.n), 'bounds (ordinal): target');
    }
    const sides = (this.sides = { source: sortSide(source), target: sortSide(target) });
    const sv = sortWithOrder(values.data.subarray(0, values.n));
    this.sortedValues = sv.sorted;
    this.valueOrder = sv.order;
    this.build = method === 'quantile' ? quantileColumn : method === 'step' ? stepColumn : (s, t) => ordinalColumn(s, t);
    if (method === 'quantile') this.quantile = new QuantileAtValues(sides.source.distinct, sides.target.distinct, sv.sorted, sv.order);
    if (method === 'step') this.step = new StepAtValues(sides.source.distinct, sides.target.distinct, sv.sorted, sv.order);
    this.cumS = new Float64Array(sides.source.distinct.length);
    this.cumT = new Float64Array(sides.target.distinct.length);
    this.wS = new Float64Array(sides.source.distinct.length);
    this.wT = new Float64Array(sides.target.distinct.length);
  }

  /**
   * The mapped values under the map fitted with weights `sw` and `tw`: per
   * distinct value for the 1-D methods, per row for linear. Writes v * d
   * numbers to `out`. Cost: see the class.
   * @throws RemapError when the weights leave a side unable to fit (one distinct value, a singular covariance).
   */
  mapWith(sw: Float64Array, tw: Float64Array, out: Float64Array): void {
    if (this.linear) return this.linear.map(sw, tw, out);
    if (this.method === 'ordinal' || !cumulateWeights(sw, this.cumS) || !cumulateWeights(tw, this.cumT)) return this.refit(sw, tw, out);
    if (!this.readAtValues(this.cumS, this.cumT, out)) this.refit(sw, tw, out);
  }

  /**
   * As `mapWith` for the 1-D methods, from whole-number weights given as
   * running totals over the distinct values (cs[k] = weight of rows with value
   * at most distinct[k]; see cumulative-shares.ts), as the bootstrap draws them.
   * @throws RemapError as `mapWith`.
   */
  mapCumulative(cs: Float64Array, ct: Float64Array, out: Float64Array): void {
    if (this.method !== 'ordinal' && this.readAtValues(cs, ct, out)) return;
    differences(cs, this.wS);
    differences(ct, this.wT);
    this.refit(this.wS, this.wT, out);
  }

  /** The fast readers; false where the quantile reader declines (see QuantileAtValues). */
  private readAtValues(cs: Float64Array, ct: Float64Array, out: Float64Array): boolean {
    if (this.step) {
      this.step.map(cs, ct, this.tails, out);
      return true;
    }
    return this.quantile!.map(cs, ct, this.tails, out);
  }

  /**
   * The general refit: the method's own column builder on the reweighted
   * merged CDFs (1-D), or fitLinear on the reweighted samples. Same arguments as `mapWith`.
   * Cost: O(K_s + K_t + v) with allocation (1-D), O((n + m) d^2 + d^3 + v d^2) plus a fit's overhead (linear).
   */
  refit(sw: Float64Array, tw: Float64Array, out: Float64Array): void {
    if (this.method === 'linear') {
      const map = fitLinear({ ...this.source, weights: sw }, { ...this.target, weights: tw }, this.settings, {}, { compare: false });
      out.set(map.apply(this.values).data);
      return;
    }
    const sides = this.sides!;
    const column = this.build!(cdfOf(sides.source.distinct, sw), cdfOf(sides.target.distinct, tw), 'bounds');
    column.forward.evaluateAscending(this.sortedValues!, out, this.tails, null, this.valueOrder);
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
