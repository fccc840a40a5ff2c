import type { Warning } from '../map';

/** Lower and upper bounds on each mapped value, with the point estimate. */
export interface MappedBounds {
  /** Rows and columns of the values (each array holds n * d numbers, row-major). */
  readonly n: number;
  readonly d: number;
  /** The values mapped by the map fitted on the full samples. */
  readonly estimate: Float64Array;
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** The standard error behind normal-approximation bounds (replicate weights); null for percentile bounds. */
  readonly standardError: Float64Array | null;
  /** The nominal coverage, e.g. 0.95. */
  readonly level: number;
  readonly how: 'bootstrap-percentile' | 'replicate-normal';
  /** Replicates used, and those that could not be fitted (left out). */
  readonly replicates: number;
  readonly failed: number;
  /** One paragraph saying how the bounds were made and where the formula comes from. */
  readonly note: string;
  readonly warnings: readonly Warning[];
}
