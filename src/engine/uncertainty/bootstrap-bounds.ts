import { RemapError } from '../errors';
import type { Warning } from '../map';
import type { Points, Sample } from '../points';
import { bootstrapReplicates } from './bootstrap-replicates';
import type { MappedBounds } from './mapped-bounds';
import { percentileOf, prepareBounds } from './prepare-bounds';

/** Options of `bootstrapBounds`. */
export interface BootstrapOptions {
  /** Nominal coverage, between 0 and 1 (default 0.95). */
  readonly level?: number;
  /** Bootstrap replicates, 20 to 100,000 (default 1,000). */
  readonly replicates?: number;
  /** Seed of the resampling (default 0): the same seed gives bit-identical bounds. */
  readonly seed?: number;
  /** The method's settings (tails, ridge), as for fitMap. */
  readonly settings?: Readonly<Record<string, unknown>>;
}

/**
 * Bounds on mapped values by the bootstrap (Efron, "Bootstrap methods: another
 * look at the jackknife", Ann. Statist. 7, 1979): each replicate resamples both
 * samples independently with replacement, refits the map and maps the values;
 * the bounds are the percentile interval of the replicates' results at `level`
 * (Davison & Hinkley 1997, sec. 5.3). Weighted rows are drawn with probability
 * proportional to their weight, and a weighted sample is redrawn at its Kish
 * effective size (sum w)^2 / sum w^2 (Kish 1965), so unequal weights widen the
 * bounds as they widen a survey's variance; this treats the rows as drawn
 * independently and ignores clusters and strata, for which the survey's
 * replicate weights (`replicateBounds`) are the right tool.
 * For the 1-D methods both samples are sorted once and a replicate is a
 * vector of multinomial counts on the sorted values (`bootstrapReplicates`),
 * added up into cumulative weights; quantile and step then read the refitted
 * map at the values only (no sort, no knots: `QuantileAtValues`,
 * `StepAtValues`), with the numbers of a full refit on the resampled rows.
 * Linear refits the moments from the counts (`LinearRefit`).
 * Cost: O(R (n + m + v log m)) for 1-D, O(R ((n + m) d^2 + d^3 + v d^2)) linear, plus O(R v log R) for the percentiles.
 * (R = 199 or 999 puts the 95 % ends exactly on order statistics, since (R + 1) 0.025 is then whole.)
 * @param method quantile, step, ordinal or linear.
 * @param values the values whose mapped value is bounded (same columns as the samples).
 * @throws RemapError for another method, bad samples, values or options, or too many values x replicates.
 * @example bootstrapBounds('quantile', src, tgt, column([1.5]), { seed: 1 }).lower // Float64Array [a lower bound for T(1.5)]
 */
export function bootstrapBounds(method: string, source: Sample, target: Sample, values: Points, options: BootstrapOptions = {}): MappedBounds {
  const fn = `bounds (${method}, bootstrap)`;
  const R = options.replicates ?? 1000;
  const seed = options.seed ?? 0;
  if (!Number.isInteger(R) || R < 20 || R > 100_000)
    throw new RemapError(`${fn}: replicates is ${R}; give a whole number from 20 to 100000 (1000 is usual for 95 % bounds).`);
  if (!Number.isInteger(seed) || seed < 0 || seed > 4294967295) throw new RemapError(`${fn}: the seed is ${seed}; give a whole number from 0 to 4294967295.`);
  const level = options.level ?? 0.95;
  const prep = prepareBounds(method, source, target, values, options.settings ?? {}, level, R, fn);
  const { fitter, estimate, m } = prep;
  const { reps, failed } = bootstrapReplicates(fitter, source, target, R, m, seed, 'fast');
  if (failed > R / 2)
    throw new RemapError(`${fn}: ${failed} of ${R} replicates could not be fitted (too few distinct values in a resample); give larger samples.`);
  const lower = new Float64Array(m);
  const upper = new Float64Array(m);
  const alpha = 1 - level;
  const col = new Float64Array(R - failed);
  for (let j = 0; j < m; j++) {
    let c = 0;
    for (let r = 0; r < R; r++) {
      const v = reps[r * m + j];
      if (v === v) col[c++] = v;
    }
    col.sort();
    lower[j] = percentileOf(col, alpha / 2);
    upper[j] = percentileOf(col, 1 - alpha / 2);
  }
  const warnings: Warning[] = [];
  if (failed > 0) {
    warnings.push({
      code: 'small-sample',
      message: `${failed} of ${R} bootstrap replicates could not be fitted (a resample had too few distinct values) and were left out; the bounds may be too narrow.`,
      action: 'Give larger samples, or read these bounds as rough.',
    });
  }
  if (source.weights || target.weights) {
    warnings.push({
      code: 'small-sample',
      message:
        'Weighted rows were resampled as if drawn independently (with probability proportional to weight, at the Kish effective size); clusters and strata of a survey design are not reflected.',
      action: 'If the survey publishes replicate weights, use them (replicate bounds) for bounds that follow its design.',
    });
  }
  return {
    n: values.n,
    d: values.d,
    estimate,
    lower,
    upper,
    standardError: null,
    level,
    how: 'bootstrap-percentile',
    replicates: R - failed,
    failed,
    note: `Percentile bootstrap (Efron 1979; Davison & Hinkley 1997, sec. 5.3): ${R} replicates, seed ${seed}, each resampling both samples with replacement${source.weights || target.weights ? ' (weighted rows drawn in proportion to weight, at the Kish effective size)' : ''} and refitting the ${fitter.method} map; bounds at ${100 * level} %.`,
    warnings,
  };
}
