import { RemapError } from '../errors';
import { kishRows } from '../groups/effective-rows';
import type { Sample } from '../points';
import { AliasTable } from './alias-table';
import { cumulateCounts, differences } from './cumulative-shares';
import type { ReplicateFitter } from './replicate-fitter';
import { ResampleStream } from './resample-stream';

/** R replicates of m mapped values (replicate r at reps[r * m .. r * m + m - 1]; NaN where it could not be fitted). */
export interface BootstrapReplicates {
  readonly reps: Float64Array;
  readonly failed: number;
}

/**
 * Draws R bootstrap replicates of the mapped values: each replicate draws
 * both samples again with replacement, independently (source first, then
 * target, from one `ResampleStream`), as counts, and refits.
 * An unweighted sample draws n rows uniformly, counted by sorted position
 * (1-D) or by row (linear); a weighted one draws its Kish effective size
 * (sum w)^2 / sum w^2 of rows with probability proportional to weight (alias
 * method), counted by distinct value (1-D) or row. `way` 'fast' refits by the
 * fitter's fast readers (`mapCumulative`, `mapWith`); 'refit' by the method's
 * own general refit with the same counts, to check the fast way against.
 * The same seed gives the same counts, so the same replicates, bit for bit.
 * Cost: O(R (n + m)) draws plus R refits (see ReplicateFitter).
 * @throws RemapError only from the fitter's own errors other than a failed refit (those are counted as failed).
 */
export function bootstrapReplicates(
  fitter: ReplicateFitter,
  source: Sample,
  target: Sample,
  R: number,
  m: number,
  seed: number,
  way: 'fast' | 'refit',
): BootstrapReplicates {
  const stream = new ResampleStream(seed);
  const oneD = fitter.method !== 'linear';
  const sides = (['source', 'target'] as const).map((side) => {
    const s = side === 'source' ? source : target;
    const full = fitter.fullWeights(side);
    const ends = oneD && !s.weights ? fitter.sides![side].ends : null;
    const table = s.weights ? new AliasTable(full) : null;
    const cells = table ? full.length : s.n;
    const draws = s.weights ? Math.max(2, Math.round(kishRows(s.n, s.weights))) : s.n;
    return { table, ends, cells, draws, counts: new Int32Array(cells), cum: new Float64Array(full.length), weights: new Float64Array(full.length) };
  });
  const reps = new Float64Array(R * m);
  const out = new Float64Array(m);
  let failed = 0;
  for (let r = 0; r < R; r++) {
    for (const s of sides) {
      s.counts.fill(0);
      if (s.table) stream.aliasCounts(s.table, s.draws, s.counts);
      else stream.uniformCounts(s.cells, s.draws, s.counts);
      if (oneD) {
        cumulateCounts(s.counts, s.ends, s.cum);
        if (way === 'refit') differences(s.cum, s.weights);
      } else {
        for (let i = 0; i < s.cells; i++) s.weights[i] = s.counts[i];
      }
    }
    const [a, b] = sides;
    try {
      if (way === 'refit') fitter.refit(a.weights, b.weights, out);
      else if (oneD) fitter.mapCumulative(a.cum, b.cum, out);
      else fitter.mapWith(a.weights, b.weights, out);
      reps.set(out, r * m);
    } catch (e) {
      if (!(e instanceof RemapError)) throw e;
      reps.fill(NaN, r * m, (r + 1) * m);
      failed++;
    }
  }
  return { reps, failed };
}
