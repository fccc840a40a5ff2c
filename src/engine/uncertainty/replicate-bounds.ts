import { RemapError } from '../errors';
import type { Warning } from '../map';
import type { Points, Sample } from '../points';
import type { MappedBounds } from './mapped-bounds';
import { normalQuantile } from './normal-quantile';
import { prepareBounds } from './prepare-bounds';
import { replicateMultiplier, replicateVariance, type ReplicateScheme } from './replicate-variance';

/** Replicate weights of one sample: n rows by R columns (column r is replicate r's weight for every row), and their kind. */
export interface ReplicateWeights extends ReplicateScheme {
  readonly weights: Points;
}

/** Options of `replicateBounds`. */
export interface ReplicateOptions {
  /** The source's replicate weights; leave out to treat the source as fixed (no sampling error). */
  readonly source?: ReplicateWeights;
  /** The target's replicate weights; leave out for a target known without sampling error (a census, a published table). */
  readonly target?: ReplicateWeights;
  /**
   * True when both samples come from one survey with one set of replicates (the same R and kind):
   * replicate r refits with source and target replicate r together. False (default): the samples are
   * independent (two waves, two surveys), and the variance is the sum of the two sides' variances.
   */
  readonly shared?: boolean;
  /** Nominal coverage (default 0.95). */
  readonly level?: number;
  /** The method's settings, as for fitMap. */
  readonly settings?: Readonly<Record<string, unknown>>;
}

/**
 * Bounds on mapped values from replicate weights that a survey publishes:
 * each replicate refits the map with that replicate's weights, the variance of
 * each mapped value follows the formula of the replicates' kind
 * (`replicateMultiplier`: bootstrap, JK1 jackknife, BRR with Fay's factor, or a
 * documented multiplier; Wolter 2007), and the bounds are the normal
 * approximation estimate +- z se with z = Phi^-1((1 + level) / 2).
 * Independent samples add the two sides' variances (each side's replicates
 * refit with the other side at its full weights); `shared` pairs them.
 * Cost: (R_source + R_target) refits (see ReplicateFitter) plus O(n R) to read the weights.
 * @throws RemapError for another method, bad samples or values, weights of the wrong shape (naming the side and
 *   column), no replicate weights at all, or shared replicates whose counts or kinds differ.
 * @example replicateBounds('linear', src, tgt, column([2]), { source: { kind: 'jackknife', weights: jk } }).upper
 */
export function replicateBounds(method: string, source: Sample, target: Sample, values: Points, options: ReplicateOptions): MappedBounds {
  const fn = `bounds (${method}, replicate weights)`;
  const level = options.level ?? 0.95;
  if (!options.source && !options.target)
    throw new RemapError(`${fn}: no replicate weights were given; give them for the source, the target or both (or use bootstrap bounds).`);
  const rs = options.source ? checkWeights(options.source, source.n, 'source', fn) : 0;
  const rt = options.target ? checkWeights(options.target, target.n, 'target', fn) : 0;
  if (options.shared) {
    if (!options.source || !options.target || rs !== rt || options.source.kind !== options.target.kind) {
      throw new RemapError(
        `${fn}: shared replicates need the same number and kind of replicate weights on both sides (source ${rs} ${options.source?.kind ?? 'none'}, target ${rt} ${options.target?.kind ?? 'none'}); give matching sets, or treat the samples as independent.`,
      );
    }
  }
  const prep = prepareBounds(method, source, target, values, options.settings ?? {}, level, Math.max(rs, rt), fn);
  const { fitter, estimate, m } = prep;
  const fullS = fitter.fullWeights('source');
  const fullT = fitter.fullWeights('target');
  const variance = new Float64Array(m);
  let failed = 0;
  let used = 0;
  const run = (R: number, weightsOf: (r: number) => { s: Float64Array; t: Float64Array }, c: number) => {
    const reps = new Float64Array(R * m);
    const out = new Float64Array(m);
    for (let r = 0; r < R; r++) {
      const w = weightsOf(r);
      try {
        fitter.mapWith(w.s, w.t, out);
        reps.set(out, r * m);
        used++;
      } catch (e) {
        if (!(e instanceof RemapError)) throw e;
        reps.fill(NaN, r * m, (r + 1) * m);
        failed++;
      }
    }
    const v = replicateVariance(reps, R, m, estimate, c);
    for (let j = 0; j < m; j++) variance[j] += v[j];
  };
  const column = (rw: ReplicateWeights, r: number) => {
    const { n, d, data } = rw.weights;
    const col = new Float64Array(n);
    for (let i = 0; i < n; i++) col[i] = data[i * d + r];
    return col;
  };
  if (options.shared) {
    const c = replicateMultiplier(options.source!, rs, `${fn}: source replicate weights`);
    run(rs, (r) => ({ s: fitter.perUnit('source', column(options.source!, r)), t: fitter.perUnit('target', column(options.target!, r)) }), c);
  } else {
    if (options.source)
      run(
        rs,
        (r) => ({ s: fitter.perUnit('source', column(options.source!, r)), t: fullT }),
        replicateMultiplier(options.source, rs, `${fn}: source replicate weights`),
      );
    if (options.target)
      run(
        rt,
        (r) => ({ s: fullS, t: fitter.perUnit('target', column(options.target!, r)) }),
        replicateMultiplier(options.target, rt, `${fn}: target replicate weights`),
      );
  }
  const z = normalQuantile(0.5 + level / 2);
  const se = new Float64Array(m);
  const lower = new Float64Array(m);
  const upper = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    se[j] = Math.sqrt(variance[j]);
    lower[j] = estimate[j] - z * se[j];
    upper[j] = estimate[j] + z * se[j];
  }
  const warnings: Warning[] = [];
  for (const side of ['source', 'target'] as const) {
    if (!options[side]) {
      warnings.push({
        code: 'small-sample',
        message: `No replicate weights were given for the ${side}, so the bounds treat it as known without sampling error.`,
        action: `Give the ${side}'s replicate weights too, unless it is a census or a published table you take as exact.`,
      });
    }
  }
  if (failed > 0) {
    warnings.push({
      code: 'small-sample',
      message: `${failed} replicates could not be fitted and were left out, so the variance is understated.`,
      action: 'Check the replicate weight columns (a replicate that gives almost every row zero weight cannot be fitted).',
    });
  }
  const kinds = [options.source, options.target]
    .filter((x): x is ReplicateWeights => !!x)
    .map((x) => x.kind + (x.kind === 'brr' ? ` (Fay factor ${x.fay ?? 0})` : ''));
  return {
    n: values.n,
    d: values.d,
    estimate,
    lower,
    upper,
    standardError: se,
    level,
    how: 'replicate-normal',
    replicates: used,
    failed,
    note: `Normal-approximation bounds estimate +- ${z.toFixed(4)} x standard error; variance from ${kinds.join(' and ')} replicate weights (Wolter, "Introduction to Variance Estimation", 2007; Fay 1989; Rust & Rao 1996), ${options.shared ? 'one set of replicates shared by both samples' : 'independent samples, their variances added'}; bounds at ${100 * level} %.`,
    warnings,
  };
}

function checkWeights(rw: ReplicateWeights, n: number, side: string, fn: string): number {
  const { n: rows, d: R, data } = rw.weights;
  if (rows !== n)
    throw new RemapError(`${fn}: the ${side} replicate weights have ${rows} rows but the ${side} has ${n}; give one row of replicate weights per ${side} row.`);
  if (R < 2) throw new RemapError(`${fn}: ${R} ${side} replicate weight column given; give at least 2.`);
  for (let r = 0; r < R; r++) {
    let total = 0;
    for (let i = 0; i < n; i++) {
      const w = data[i * R + r];
      if (!Number.isFinite(w) || w < 0)
        throw new RemapError(`${fn}: ${side} replicate weight ${r + 1}, row ${i + 1} is ${w}; replicate weights must be finite and zero or more.`);
      total += w;
    }
    if (!(total > 0)) throw new RemapError(`${fn}: ${side} replicate weight column ${r + 1} is all zero; give each replicate some positive weight.`);
  }
  return R;
}
