/**
 * A 1-D sample seen as a curve from cumulative share to value: points
 * (p[k], v[k]) with v strictly increasing and p non-decreasing. Between points
 * the curve is a straight line; a run of equal p values is a jump in v (a gap
 * the distribution puts no weight on). Hazen positions and continuised scores
 * are both written this way, so one routine (`buildKnots`) composes any two.
 */
export interface ShareGrid {
  readonly p: Float64Array;
  readonly v: Float64Array;
}
