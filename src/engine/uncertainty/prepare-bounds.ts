import { RemapError } from '../errors';
import { asSample } from '../validate';
import { fitMapSync, getMethod, prepareFit } from '../methods';
import type { Points, Sample } from '../points';
import { ReplicateFitter, type BoundedMethod } from './replicate-fitter';

/** Largest values x replicates held at once (8 bytes each: 160 MB). */
export const MAX_BOUND_CELLS = 20_000_000;

/** What both kinds of bounds start from: the checked inputs, the full-sample estimate and a fitter. */
export interface PreparedBounds {
  readonly fitter: ReplicateFitter;
  readonly estimate: Float64Array;
  readonly level: number;
  readonly m: number;
}

/** Checks method, samples, values and level; fits the full-sample map and maps the values. */
export function prepareBounds(
  method: string,
  source: Sample,
  target: Sample,
  values: Points,
  settings: Readonly<Record<string, unknown>>,
  level: number,
  replicates: number,
  fn: string,
): PreparedBounds {
  const spec = getMethod(method);
  if (!['quantile', 'step', 'ordinal', 'linear'].includes(spec.name)) {
    throw new RemapError(`${fn}: bounds are made for the quantile, step, ordinal and linear methods, not ${spec.name}; choose one of those.`);
  }
  if (!(level > 0 && level < 1)) throw new RemapError(`${fn}: the level is ${level}; give a share between 0 and 1, such as 0.95 for 95 %.`);
  source = asSample(source, 'source', fn);
  target = asSample(target, 'target', fn);
  const resolved = prepareFit(spec, source, target, settings);
  if (values.d !== source.d) throw new RemapError(`${fn}: the values have ${values.d} columns but the samples ${source.d}; give values with the same columns.`);
  if (values.n < 1) throw new RemapError(`${fn}: there are no values to bound; give at least one.`);
  for (let i = 0; i < values.n * values.d; i++) {
    if (!Number.isFinite(values.data[i])) throw new RemapError(`${fn}: value ${Math.floor(i / values.d) + 1} is ${values.data[i]}; give finite numbers.`);
  }
  const m = values.n * values.d;
  if (m * replicates > MAX_BOUND_CELLS) {
    throw new RemapError(
      `${fn}: ${values.n} values x ${replicates} replicates is more than ${MAX_BOUND_CELLS} numbers to hold; bound fewer values (a grid such as the percentiles, reading between them) or use fewer replicates.`,
    );
  }
  const map = fitMapSync(spec.name, source, target, settings);
  const estimate = Float64Array.from(map.apply(values).data);
  const fitter = new ReplicateFitter(spec.name as BoundedMethod, source, target, values, resolved);
  return { fitter, estimate, level, m };
}

/**
 * The order statistic at position (R + 1) q among R sorted numbers, read
 * linearly between neighbours and held at the ends: the percentile-interval
 * end of Davison & Hinkley, "Bootstrap Methods and their Application" (1997), sec. 5.3.
 * @example percentileOf(Float64Array.of(1, 2, 3, 4), 0.5) // 2.5
 */
export function percentileOf(sorted: Float64Array, q: number): number {
  const R = sorted.length;
  if (R === 0) return NaN;
  const h = (R + 1) * q;
  if (h <= 1) return sorted[0];
  if (h >= R) return sorted[R - 1];
  const lo = Math.floor(h);
  return sorted[lo - 1] + (h - lo) * (sorted[lo] - sorted[lo - 1]);
}
