import type { MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitContext } from '../map';
import type { MethodSpec } from '../method';
import type { Sample } from '../points';
import type { SettingSpec, Settings } from '../settings';
import { divideColumns, pooledColumnScales, UNITS_SETTING } from '../stats/column-scales';
import { settingsOf } from '../settings';
import { findPairs } from './match-rows';
import { PairsMap } from './pairs-map';

/**
 * Fits a pairs map: the exact optimal one-to-one matching of the source rows
 * to the target rows under squared Euclidean distance (see findPairs), whose
 * cost is the exact squared 2-Wasserstein distance between the two samples.
 *
 * Cost: O(n^2 d) to build the distance table, O(n^3) worst case to solve
 * (about a second at n = 2,000); 8 n^2 bytes of memory.
 *
 * @param source n rows, finite, no weights, 1 <= n <= 5,000. Not mutated.
 * @param target n rows (the same n) with the same columns. Not mutated.
 * @param settings resolved settings: units (standardised, the default, or raw).
 * @param ctx dropped rows, column names, progress callback and cancellation signal.
 * @throws RemapError if the sizes differ (suggesting the entropic method), weights are given,
 *   the samples are too large, or the fit is cancelled (kind 'cancelled').
 * @example
 * fitPairs(sample([0, 10]), sample([11, 1]), { tails: 'clamp' }).apply(column([10])).data // Float64Array [11]
 */
export function fitPairs(source: Sample, target: Sample, settings: Settings, ctx: FitContext = {}): PairsMap {
  const fn = 'fit (pairs)';
  if (source.weights || target.weights) {
    throw new RemapError(
      `${fn}: the pairs method does not take row weights (it pairs rows one to one); leave the weights out, or use the entropic method, which takes them.`,
    );
  }
  // units = standardised (default): pair the rows for the cost that divides each column by its pooled spread.
  const units = settingsOf(PAIRS_SETTINGS, settings, 'pairs').units;
  const scales = units === 'standardised' ? pooledColumnScales(source, target) : null;
  const x = scales ? divideColumns(source, scales) : source;
  const y = scales ? divideColumns(target, scales) : target;
  const found = findPairs(x, y, { signal: ctx.signal, onProgress: ctx.onProgress, caller: fn });
  const header: MapHeader = {
    method: 'pairs',
    d: source.d,
    settings: Object.freeze({ ...settings, units }),
    columns: ctx.columns ?? null,
    n: { source: source.n, target: target.n },
    dropped: ctx.dropped ?? { source: 0, target: 0 },
  };
  return PairsMap.fromMatch(source, target, found.match, header, found.augmentations, scales);
}

/** The pairs method's settings: the shared `units` choice only. */
export const PAIRS_SETTINGS = [UNITS_SETTING] as const satisfies readonly SettingSpec[];

/** The pairs method, as methods.ts lists it. */
export const pairsMethod: MethodSpec = {
  name: 'pairs',
  summary: 'Exact optimal one-to-one pairing of source and target rows (samples of equal size); maps the source rows only.',
  shape: 'joint',
  settings: PAIRS_SETTINGS,
  minRows: () => 1,
  weights: false,
  fit: fitPairs,
  fromJSON: (json) => PairsMap.fromJSON(json),
};
