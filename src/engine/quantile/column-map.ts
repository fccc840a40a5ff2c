import type { OneWayMap } from './one-way-map';

/**
 * A fitted map of one column: both directions, and the numbers that restore it
 * from JSON. The quantile, step and ordinal methods differ only in how they
 * build this; everything else (several columns, outside counts, JSON, costs)
 * is shared.
 */
export interface ColumnMap {
  readonly forward: OneWayMap;
  readonly inverse: OneWayMap;
  /** Plain JSON (finite numbers, plain arrays) from which the column is rebuilt bit-identically; built on demand (O(k)). */
  params(): Readonly<Record<string, unknown>>;
  /** Set when the fit kept fewer knots than the full map (see compact-knots.ts): how many, and the largest difference each way. */
  readonly compaction?: { readonly knots: number; readonly fullKnots: number; readonly largestError: number; readonly largestErrorInverse: number };
  /** Set on freshly fitted one-column maps (not restored ones): see `FittedSource`. */
  readonly fittedSource?: FittedSource;
}

/**
 * The source column a map was fitted on and its mapped values, kept because
 * mapping the fitted source itself is the commonest use. The fit has already
 * sorted the source, so it maps the rows by one merge walk (the same
 * arithmetic as any apply, hence the same bits) and keeps the result; apply
 * then recognises the same values in the same order by one O(n) comparison
 * and returns a copy instead of searching the knots for every row.
 */
export interface FittedSource {
  readonly values: Float64Array;
  readonly mapped: Float64Array;
  readonly outside: number;
}
