import { RemapError } from '../errors';
import { affineApply } from '../linear/affine-apply';
import { covarianceCondition } from '../linear/covariance-condition';
import { gaussianTransport } from '../linear/gaussian-transport';
import { checkLinearScale } from '../linear/scale-check';
import { LINEAR_SETTINGS } from '../linear/settings';
import type { Points, Sample } from '../points';
import { settingsOf, type Settings } from '../settings';
import { countMoments } from './count-moments';
import { symmetricEigen } from '../stats/symmetric-eigen';

/**
 * The linear method's map refitted with other row weights (bootstrap counts
 * or replicate weights) and applied to fixed values, without the rest of a
 * fit (header, warnings, costs, comparisons, a map object): the weighted
 * moments of both samples, the pooled column scales, the covariance checks
 * and the Knott-Smith matrix A = S1^-1/2 (S1^1/2 S2 S1^1/2)^1/2 S1^-1/2, in
 * the order `fitLinear` takes them, so the mapped values are those of the
 * refitted map to rounding (the moments are summed in another order: see
 * `countMoments`). A row with count c weighs as c copies of it.
 * One column takes the closed form A = sqrt(c2 / c1) (c the variances, in fitted units, plus the ridge).
 * Cost per call: O((n + m) d^2 + d^3 + v d^2).
 * @example new LinearRefit(src, tgt, values, { ridge: 0, units: 'standardised' }).map(counts1, counts2, out)
 */
export class LinearRefit {
  private readonly source: Sample;
  private readonly target: Sample;
  private readonly values: Points;
  private readonly ridge: number;
  private readonly standardised: boolean;

  /**
   * @param source,target validated samples with the same d.
   * @param values the values to map (d columns).
   * @param settings the linear method's resolved settings.
   */
  constructor(source: Sample, target: Sample, values: Points, settings: Settings) {
    this.source = source;
    this.target = target;
    this.values = values;
    const { ridge, units } = settingsOf(LINEAR_SETTINGS, settings, 'linear');
    this.ridge = ridge;
    this.standardised = units === 'standardised';
  }

  /**
   * Writes the v * d mapped values to `out` for row weights `sw` (source) and `tw` (target).
   * @throws RemapError as fitLinear would: a singular covariance (too few distinct rows drawn), or data beyond double precision.
   */
  map(sw: Float64Array, tw: Float64Array, out: Float64Array): void {
    const fn = 'bounds (linear)';
    const d = this.source.d;
    const ridge = this.ridge;
    const mom1 = countMoments(this.source, sw, fn);
    const mom2 = countMoments(this.target, tw, fn);
    const varies1 = Array.from(mom1.min, (lo, k) => mom1.max[k] > lo);
    const varies2 = Array.from(mom2.min, (lo, k) => mom2.max[k] > lo);
    const var1 = diagonal(mom1.cov, d);
    const var2 = diagonal(mom2.cov, d);
    checkLinearScale(var1, var2, varies1, varies2, fn);
    const scales = this.standardised ? pooledScales(var1, var2) : null;
    const cov1 = scales ? scaled(mom1.cov, scales, d) : Float64Array.from(mom1.cov);
    const cov2 = scales ? scaled(mom2.cov, scales, d) : Float64Array.from(mom2.cov);
    for (let k = 0; k < d; k++) {
      cov1[k * d + k] += ridge;
      cov2[k * d + k] += ridge;
    }
    if (ridge > 0) checkLinearScale(diagonal(cov1, d), diagonal(cov2, d), varies1, varies2, fn);
    let matrix: Float64Array;
    if (d === 1) {
      // One column: covarianceCondition refuses exactly a variance that is not positive, or a constant column without a
      // ridge, and A = (c1^-1/2 (c1^1/2 c2 c1^1/2)^1/2 c1^-1/2) = sqrt(c2 / c1), to rounding (Knott & Smith 1984).
      for (const [c, varies, which] of [
        [cov1[0], varies1[0], 'source'],
        [cov2[0], varies2[0], 'target'],
      ] as const) {
        if (!(c > 0) || (!varies && !(ridge > 0)))
          throw new RemapError(
            `${fn}: every ${which} row with positive weight holds the same value, so its variance is 0; a linear map needs data that varies.`,
            'num',
          );
      }
      const a = Math.sqrt(cov2[0] / cov1[0]);
      matrix = Float64Array.of((scales ? (scales[0] * a) / scales[0] : a) + 0);
    } else {
      const units = this.standardised ? 'standardised' : 'raw';
      covarianceCondition(cov1, d, { which: 'source', columns: null, rows: positive(sw), ridge, fn, units, varies: varies1 });
      covarianceCondition(cov2, d, { which: 'target', columns: null, rows: positive(tw), ridge, fn, units, varies: varies2 });
      const gt = gaussianTransport(symmetricEigen(cov1, d), cov1, cov2);
      // As the map object stores them: `+ 0` turns -0 into 0.
      matrix = Float64Array.from(scales ? conjugate(gt.matrix, scales, d) : gt.matrix, (v) => v + 0);
    }
    const from = Float64Array.from(mom1.mean, (v) => v + 0);
    const to = Float64Array.from(mom2.mean, (v) => v + 0);
    const lo = Float64Array.from(mom1.min, (v) => v + 0);
    const hi = Float64Array.from(mom1.max, (v) => v + 0);
    const mapped = affineApply(this.values, from, matrix, to, lo, hi, 'apply');
    if (mapped.data.length !== out.length) throw new RemapError(`${fn}: ${mapped.data.length} mapped numbers for ${out.length} places.`);
    out.set(mapped.data);
  }
}

/** s_k = sqrt((var1_k + var2_k) / 2), 1 where that is 0 or not finite: pooledColumnScales from the variances in hand. */
function pooledScales(var1: Float64Array, var2: Float64Array): Float64Array {
  const out = new Float64Array(var1.length);
  for (let k = 0; k < out.length; k++) {
    const s = Math.sqrt((var1[k] + var2[k]) / 2);
    out[k] = s > 0 && s < Infinity ? s : 1;
  }
  return out;
}

function diagonal(cov: ArrayLike<number>, d: number): Float64Array {
  const out = new Float64Array(d);
  for (let k = 0; k < d; k++) out[k] = cov[k * d + k];
  return out;
}

/** D C D with D = diag(1 / s), as fitLinear scales a covariance. O(d^2). */
function scaled(cov: ArrayLike<number>, s: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) out[k * d + l] = cov[k * d + l] / (s[k] * s[l]);
  return out;
}

/** S M S^-1 with S = diag(s), as fitLinear returns a matrix to raw units. O(d^2). */
function conjugate(m: ArrayLike<number>, s: Float64Array, d: number): Float64Array {
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) for (let l = 0; l < d; l++) out[k * d + l] = (s[k] * m[k * d + l]) / s[l];
  return out;
}

function positive(w: Float64Array): number {
  let c = 0;
  for (let i = 0; i < w.length; i++) if (w[i] > 0) c++;
  return c;
}
