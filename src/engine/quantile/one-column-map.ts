import { BaseMap, type MapHeader } from '../base';
import type { FitRecord, Mapped } from '../map';
import type { Points } from '../points';
import type { ColumnMap } from './column-map';
import type { Tails } from './one-way-map';

/**
 * A fitted map that treats each column on its own (the quantile, step and
 * ordinal methods): column k of the output depends only on column k of the
 * input. A row counts as outside when any of its values lies outside that
 * column's fitted data range (apply: the source range; invert: the target range).
 * Built by `fitOneColumnMap` / `restoreOneColumnMap`, not directly.
 * @example (await fitMap('quantile', sample([[0, 0], [1, 10]]), sample([[5, 1], [6, 2]]))).apply(points([[0.5, 10]])) // [[5.5, 2]]
 */
export class OneColumnMap extends BaseMap {
  readonly columnMaps: readonly ColumnMap[];
  readonly tails: Tails;

  /**
   * @param header what the map was fitted on (d = columns.length).
   * @param fitted fit-time cost, warnings and slope certificate.
   * @param columns one fitted column map per column.
   */
  constructor(header: MapHeader, fitted: FitRecord, columns: readonly ColumnMap[]) {
    super(header, fitted);
    this.columnMaps = columns;
    this.tails = header.settings.tails === 'linear' ? 'linear' : 'clamp';
  }

  protected applyPoints(x: Points): Mapped {
    return this.run(x, true);
  }

  protected invertPoints(y: Points): Mapped {
    return this.run(y, false);
  }

  protected params(): unknown {
    return { columns: this.columnMaps.map((c) => c.params()) };
  }

  /** O(n d) plus the searches (see `OneWayMap.evaluate`). Never mutates x. */
  private run(x: Points, forward: boolean): Mapped {
    const { n, d } = x;
    const data = new Float64Array(n * d);
    if (d === 1) {
      const c = this.columnMaps[0];
      const input = x.data.length === n ? x.data : x.data.subarray(0, n);
      if (forward && c.fittedSource && sameValues(input, c.fittedSource.values)) {
        data.set(c.fittedSource.mapped);
        return { n, d, data, outside: c.fittedSource.outside };
      }
      const outside = (forward ? c.forward : c.inverse).evaluate(input, data, this.tails, null);
      return { n, d, data, outside };
    }
    const flags = new Uint8Array(n);
    const col = new Float64Array(n);
    const res = new Float64Array(n);
    for (let k = 0; k < d; k++) {
      const m = forward ? this.columnMaps[k].forward : this.columnMaps[k].inverse;
      for (let i = 0, j = k; i < n; i++, j += d) col[i] = x.data[j];
      m.evaluate(col, res, this.tails, flags);
      for (let i = 0, j = k; i < n; i++, j += d) data[j] = res[i];
    }
    let outside = 0;
    for (let i = 0; i < n; i++) outside += flags[i];
    return { n, d, data, outside };
  }
}

/** Same length and the same numbers in the same order (-0 equals 0, which maps alike). O(n), stops at the first difference. */
function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
