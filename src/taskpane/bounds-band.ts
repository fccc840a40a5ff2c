import { column, type Sample } from '../engine/points';
import { weightedCdf, stepQuantile } from '../engine/stats/weighted-cdf';
import { bootstrapBounds } from '../engine/uncertainty/bootstrap-bounds';
import type { Band } from '../plots/band';

/** Methods the pane can draw bounds for (those the engine bounds). */
export const BANDED_METHODS: readonly string[] = ['quantile', 'step', 'ordinal'];

/**
 * The band "show 95 % bounds" draws on the quantile plot of a 1-D map: at the
 * probabilities (k - 1/2)/K, x is the target's quantile and the band runs
 * from the lower to the upper bootstrap bound of the source's quantile mapped
 * (bootstrapBounds, seeded, so the same data draws the same band). Null for a
 * map of several columns or a method without bounds.
 * Cost: `replicates` refits (about 1,000 x one fit), read at K values.
 */
export function boundsBand(
  method: string,
  source: Sample,
  target: Sample,
  settings: Readonly<Record<string, unknown>>,
  options: { level?: number; points?: number; replicates?: number; seed?: number; of?: string } = {},
): Band | null {
  if (source.d !== 1 || !BANDED_METHODS.includes(method)) return null;
  const K = options.points ?? 41;
  const level = options.level ?? 0.95;
  const sc = weightedCdf(source.data, source.weights);
  const tc = weightedCdf(target.data, target.weights);
  const xs: number[] = [];
  const at: number[] = [];
  for (let k = 1; k <= K; k++) {
    const p = (k - 0.5) / K;
    at.push(stepQuantile(sc, p));
    xs.push(stepQuantile(tc, p));
  }
  const b = bootstrapBounds(method, source, target, column(at), { level, replicates: options.replicates ?? 1000, seed: options.seed ?? 0, settings });
  return { name: `${Math.round(level * 1000) / 10} % bounds`, of: options.of, x: xs, lower: b.lower, upper: b.upper };
}
