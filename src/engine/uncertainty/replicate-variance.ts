import { RemapError } from '../errors';

/**
 * The kinds of replicate weights official surveys publish, and the variance
 * formula each implies for an estimate theta from replicate estimates theta_r
 * (r = 1..R), all centred on the full-sample estimate theta:
 * - bootstrap: v = (1/R) sum (theta_r - theta)^2, the mean squared deviation
 *   (Wolter, "Introduction to Variance Estimation", 2nd ed. 2007, ch. 5;
 *   Rao, Wu & Yue, Survey Methodology 18, 1992, for survey bootstrap weights);
 * - jackknife (JK1, delete one group): v = ((R-1)/R) sum (theta_r - theta)^2 (Wolter 2007, ch. 4);
 * - brr (balanced repeated replication, with Fay's factor k, 0 <= k < 1; k = 0 is plain BRR):
 *   v = 1/(R (1-k)^2) sum (theta_r - theta)^2 (McCarthy 1969; Fay 1989, Proc. Survey Research
 *   Methods Section, ASA; Judkins, J. Official Statistics 6, 1990; Rust & Rao, Stat. Methods Med. Res. 5, 1996);
 * - custom: v = c sum (theta_r - theta)^2 with the multiplier c the survey's documentation gives
 *   (e.g. 4/80 for the successive-difference replicates of the American Community Survey).
 */
export type ReplicateKind = 'bootstrap' | 'jackknife' | 'brr' | 'custom';

/** What a user says about a set of replicate weights. */
export interface ReplicateScheme {
  readonly kind: ReplicateKind;
  /** Fay's factor k for kind brr (default 0). */
  readonly fay?: number;
  /** The multiplier c for kind custom. */
  readonly multiplier?: number;
}

/**
 * The multiplier c with v = c sum_r (theta_r - theta)^2 for R replicates of `scheme`.
 * @throws RemapError naming a bad kind, Fay factor or multiplier, or too few replicates.
 * @example replicateMultiplier({ kind: 'brr', fay: 0.5 }, 4) // 1 / (4 * 0.25) = 1
 */
export function replicateMultiplier(scheme: ReplicateScheme, R: number, where = 'replicate weights'): number {
  if (!(R >= 2)) throw new RemapError(`${where}: ${R} replicate${R === 1 ? '' : 's'} given; give at least 2 replicate weight columns.`);
  switch (scheme.kind) {
    case 'bootstrap':
      return 1 / R;
    case 'jackknife':
      return (R - 1) / R;
    case 'brr': {
      const k = scheme.fay ?? 0;
      if (!(k >= 0 && k < 1))
        throw new RemapError(`${where}: Fay's factor is ${k}; give a number from 0 (plain BRR) up to but not including 1 (0.5 is common).`);
      return 1 / (R * (1 - k) * (1 - k));
    }
    case 'custom': {
      const c = scheme.multiplier;
      if (c === undefined || !(c > 0) || !Number.isFinite(c))
        throw new RemapError(`${where}: the custom kind needs the multiplier from the survey's documentation (a positive number), not ${String(c)}.`);
      return c;
    }
    default:
      throw new RemapError(
        `${where}: the kind "${String((scheme as { kind: unknown }).kind)}" is not one Remap knows; choose bootstrap, jackknife, brr or custom.`,
      );
  }
}

/**
 * v = c sum_r (theta_r - theta)^2 for each of `m` estimates: `reps` holds the R
 * replicate estimates of estimate j at reps[r * m + j]. Replicates that are
 * NaN (could not be fitted) are left out and counted; c is that of the
 * replicates given (leaving some out understates the variance, which the caller reports).
 * Cost: O(R m).
 * @example replicateVariance(Float64Array.of(1, 3), 2, 1, Float64Array.of(2), 0.5) // Float64Array [1]
 */
export function replicateVariance(reps: Float64Array, R: number, m: number, full: Float64Array, c: number): Float64Array {
  const v = new Float64Array(m);
  for (let r = 0; r < R; r++) {
    for (let j = 0; j < m; j++) {
      const d = reps[r * m + j] - full[j];
      if (d === d) v[j] += d * d;
    }
  }
  for (let j = 0; j < m; j++) v[j] *= c;
  return v;
}
