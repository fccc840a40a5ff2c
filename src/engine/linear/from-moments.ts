import type { MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitContext } from '../map';
import { resolveSettings } from '../settings';
import { linearMapFromSummaries, type LinearSummary } from './fit';
import type { LinearMap } from './linear-map';
import { LINEAR_SETTINGS } from './settings';

/** A sample summarised by its means and covariance (and, when known, its size and range). */
export interface GivenMoments {
  /** Column means, length d. */
  readonly mean: ArrayLike<number>;
  /** Covariance, row-major d x d, divided by the number of rows (or total weight), not by n - 1. */
  readonly cov: ArrayLike<number>;
  /** Rows (or total weight) the summary came from; used for the small-sample warning. */
  readonly n: number;
  /** Per-column smallest and largest value, when known (else rows are never counted as outside). */
  readonly min?: ArrayLike<number>;
  readonly max?: ArrayLike<number>;
}

/**
 * Fits the linear (Gaussian) map T(x) = m2 + A (x - m1) from summaries instead
 * of rows: the same formula as `fitLinear` (Knott & Smith 1984, via
 * gaussianTransport), the same checks (covariance condition, ridge), so for the
 * means and covariances of two samples it gives the map fitted from the
 * samples, to the rounding of the summaries. The map has no source or target
 * rows behind it, so its report has no energy distance or KS statistic.
 * Cost: O(d^3).
 * @param source, target summaries with the same d; covariances symmetric (to 1e-9 of their scale) and, with the ridge, positive definite.
 * @param rawSettings `ridge` (>= 0) and `units`, as for the linear method.
 * @param ctx column names for messages and the map.
 * @throws RemapError for mismatched lengths, a value that is not finite, a non-symmetric covariance, n below 1,
 *   or a singular covariance (naming the side, as the linear fit does).
 * @example fitLinearFromMoments({ mean: [0], cov: [1], n: 100 }, { mean: [10], cov: [4], n: 100 }).apply(column([1])).data // [12]
 */
export function fitLinearFromMoments(
  source: GivenMoments,
  target: GivenMoments,
  rawSettings: Readonly<Record<string, unknown>> = {},
  ctx: FitContext = {},
): LinearMap {
  const fn = 'fit (linear, from means and covariances)';
  const settings = resolveSettings('linear', LINEAR_SETTINGS, rawSettings);
  const d = source.mean.length;
  if (d < 1) throw new RemapError(`${fn}: the source means are empty; give one mean per column.`);
  const summary = (m: GivenMoments, side: string): LinearSummary => {
    const c = checked(m, d, side, fn);
    const varies = Array.from({ length: d }, (_, k) => c.cov[k * d + k] > 0);
    return { mean: c.mean, cov: c.cov, min: c.min, max: c.max, varies, rows: Math.round(m.n), effectiveSize: m.n };
  };
  const s = summary(source, 'source');
  const t = summary(target, 'target');
  const header: MapHeader = {
    method: 'linear',
    d,
    settings,
    columns: ctx.columns ?? null,
    n: { source: Math.round(source.n), target: Math.round(target.n) },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  return linearMapFromSummaries(s, t, settings, header, fn);
}

interface Checked {
  readonly mean: Float64Array;
  readonly cov: Float64Array;
  readonly min: Float64Array;
  readonly max: Float64Array;
}

function checked(m: GivenMoments, d: number, side: string, fn: string): Checked {
  const vec = (v: ArrayLike<number> | undefined, len: number, what: string, fill: number): Float64Array => {
    if (v === undefined) return new Float64Array(len).fill(fill);
    if (v.length !== len)
      throw new RemapError(`${fn}: the ${side} ${what} has ${v.length} numbers; give ${len}${len === d ? ' (one per column)' : ` (a ${d} x ${d} matrix)`}.`);
    const out = Float64Array.from(v);
    out.forEach((x, i) => {
      if (!Number.isFinite(x)) throw new RemapError(`${fn}: entry ${i + 1} of the ${side} ${what} is ${x}; give finite numbers.`);
    });
    return out;
  };
  if (!(m.n >= 1) || !Number.isFinite(m.n))
    throw new RemapError(`${fn}: the ${side} row count is ${m.n}; give the number of rows the summary came from (at least 1).`);
  const mean = vec(m.mean, d, 'means', 0);
  const cov = vec(m.cov, d * d, 'covariance', 0);
  let scale = 0;
  for (let k = 0; k < d; k++) scale = Math.max(scale, Math.abs(cov[k * d + k]));
  for (let i = 0; i < d; i++) {
    for (let k = i + 1; k < d; k++) {
      const a = cov[i * d + k];
      const b = cov[k * d + i];
      if (Math.abs(a - b) > 1e-9 * scale)
        throw new RemapError(
          `${fn}: the ${side} covariance is not symmetric (row ${i + 1}, column ${k + 1} is ${a} but row ${k + 1}, column ${i + 1} is ${b}); give a covariance matrix.`,
        );
      // Summaries from a database may differ in the last digit: take the mean of the two.
      cov[i * d + k] = cov[k * d + i] = 0.5 * (a + b);
    }
  }
  const min = vec(m.min, d, 'minimums', -Number.MAX_VALUE);
  const max = vec(m.max, d, 'maximums', Number.MAX_VALUE);
  for (let k = 0; k < d; k++)
    if (!(min[k] <= max[k]))
      throw new RemapError(`${fn}: the ${side} minimum of column ${k + 1} (${min[k]}) is above its maximum (${max[k]}); check the summary.`);
  return { mean, cov, min, max };
}
