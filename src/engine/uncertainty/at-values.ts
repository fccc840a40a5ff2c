import { RemapError } from '../errors';
import { CumulativeWeights } from './cumulative-shares';
import { knotUnits } from './knot-units';

/**
 * What the readers of a refitted 1-D map at fixed values share (QuantileAtValues, StepAtValues): the distinct source and
 * target values, the values to map with where each result goes, each value's place among the source values, and the
 * cumulative weights of a replicate with its first and last weighted value on each side. O(v + K) to build.
 */
export abstract class AtValues {
  protected readonly sx: Float64Array;
  protected readonly ty: Float64Array;
  protected readonly xs: Float64Array;
  protected readonly order: Uint32Array;
  /** unit[r] = largest k with sx[k] <= xs[r] (-1 if none). */
  protected readonly unit: Int32Array;
  protected readonly S = new CumulativeWeights();
  protected readonly T = new CumulativeWeights();
  /** The first and last weighted source value (fs, ls) and target value (ft, lt) of the replicate `start` loaded. */
  protected fs = 0;
  protected ls = 0;
  protected ft = 0;
  protected lt = 0;

  /**
   * @param sx,ty the distinct source and target values, ascending.
   * @param xs the values to map, ascending; `order[r]` is where the result for xs[r] goes.
   */
  constructor(sx: Float64Array, ty: Float64Array, xs: Float64Array, order: Uint32Array) {
    this.sx = sx;
    this.ty = ty;
    this.xs = xs;
    this.order = order;
    this.unit = knotUnits(sx, xs);
  }

  /**
   * Loads a replicate's cumulative weights `cs` (source) and `ct` (target) and finds each side's first and last
   * weighted value. O(1) amortised.
   * @param needs the end of the message when a side holds a single weighted value (what the method needs, and what to do).
   * @throws RemapError (as the refit would) when a side has no weight or a single weighted value.
   */
  protected start(cs: Float64Array, ct: Float64Array, needs: string): void {
    const { S, T } = this;
    S.reset(cs);
    T.reset(ct);
    if (!(S.total > 0) || !(T.total > 0)) throw new RemapError('bounds: a replicate gives no row a positive weight.');
    this.fs = S.after(-1);
    this.ls = S.atOrBefore(cs.length - 1);
    this.ft = T.after(-1);
    this.lt = T.atOrBefore(ct.length - 1);
    if (this.fs === this.ls) throw single('source', this.sx[this.fs], needs);
    if (this.ft === this.lt) throw single('target', this.ty[this.ft], needs);
  }
}

function single(side: string, value: number, needs: string): RemapError {
  return new RemapError(`bounds: every ${side} row with positive weight holds the same value (${value}); ${needs}`, 'num');
}
