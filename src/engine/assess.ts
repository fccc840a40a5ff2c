import type { Points } from './points';
import { energyDistance } from './stats/energy-distance';
import { ksStatistic } from './stats/ks';
import { columnOf } from './points';

/** Rows per side used for the fit-time energy distances when d > 1 (seeded subsample above this). */
export const COMPARISON_MAX_ROWS = 1000;
/** Seed of that subsample. */
export const COMPARISON_SEED = 0;

/** How close the mapped source came to the target, recorded at fit time. */
export interface Comparisons {
  readonly energyBefore: number;
  readonly energyAfter: number;
  readonly ksMaxAfter: number;
}

/**
 * Energy distance source vs target and mapped source vs target, and the
 * largest per-column Kolmogorov-Smirnov statistic of mapped source vs target,
 * all with the samples' weights. For d > 1 the energy distances use a seeded
 * subsample of at most COMPARISON_MAX_ROWS rows per side (the same rows before
 * and after, since the seed is fixed), so their cost does not grow with n.
 * Cost: O(d (n + m) log(n + m)) for KS, plus O(min(n, 1000)^2 d) for energy (O((n + m) log(n + m)) when d = 1).
 * @example compareFit(source, sourceWeights, mapped, target, targetWeights) // { energyBefore: 1.9, energyAfter: 0.01, ksMaxAfter: 0.03 }
 */
export function compareFit(
  source: Points,
  sourceWeights: Float64Array | null,
  mapped: Points,
  target: Points,
  targetWeights: Float64Array | null,
): Comparisons {
  const options = { maxRows: COMPARISON_MAX_ROWS, seed: COMPARISON_SEED };
  const energyBefore = energyDistance(source, target, sourceWeights, targetWeights, options).value;
  const energyAfter = energyDistance(mapped, target, sourceWeights, targetWeights, options).value;
  let ksMaxAfter = 0;
  for (let k = 0; k < mapped.d; k++) {
    ksMaxAfter = Math.max(ksMaxAfter, ksStatistic(columnOf(mapped, k), columnOf(target, k), sourceWeights, targetWeights));
  }
  return { energyBefore, energyAfter, ksMaxAfter };
}
