import { listMethods } from './methods';
import { normaliseName, settingsOf } from './settings';
import { GRADIENT_NET_SETTINGS } from './gradient-net/settings';
import type { MethodName } from './map';
import type { Points } from './points';

/** The method `auto` picked, and why, in plain words. */
export interface MethodChoice {
  readonly method: MethodName;
  readonly reason: string;
}

/** Above this many source x target pairs the entropic method's dense plan gets slow (about 5,000 x 5,000). */
export const ENTROPIC_MAX_PAIRS = 25_000_000;
/** Above this many columns the entropic map's accuracy degrades quickly (curse of dimension). */
export const ENTROPIC_MAX_D = 20;

/**
 * Chooses a method from the shape of the data and the time the user allows.
 * With `explicit` false (no method given) one column gets `quantile` and
 * several get `linear`, the fast closed forms. With `explicit` true (method
 * "auto") several columns get a map that matches the whole joint shape when the
 * data can support it:
 *  - one column: quantile (exact optimal map in 1-D);
 *  - fewer than 10 rows per column on either side: linear (too few rows to
 *    estimate more than means and covariances; common practice);
 *  - up to 5,000 x 5,000 pairs and 20 columns: entropic (seconds, no training);
 *  - larger, when gradient-net is available and the time budget is at least
 *    10 s: gradient-net (minibatch training scales with rows);
 *  - otherwise linear.
 * O(1).
 * @example chooseMethod({ n: 500, d: 3, data }, { n: 500, d: 3, data }, {}, true) // { method: 'entropic', reason: '...' }
 */
export function chooseMethod(source: Points, target: Points, settings: Readonly<Record<string, unknown>>, explicit: boolean): MethodChoice {
  const d = source.d;
  const n = Math.min(source.n, target.n);
  if (d === 1) return { method: 'quantile', reason: 'One column: exact quantile matching is the optimal monotone map.' };
  if (!explicit) {
    return {
      method: 'linear',
      reason:
        'Several columns and no method given: the linear (Gaussian) map, which matches means and covariances; choose entropic or gradient-net to match the whole joint shape.',
    };
  }
  const has = (m: MethodName) => listMethods().some((s) => s.name === m);
  if (n < 10 * d) {
    return {
      method: 'linear',
      reason: `Only ${n} rows for ${d} columns (fewer than 10 per column): the linear map, since there are too few rows to estimate more than means and covariances.`,
    };
  }
  if (has('entropic') && source.n * target.n <= ENTROPIC_MAX_PAIRS && d <= ENTROPIC_MAX_D) {
    return { method: 'entropic', reason: `${source.n} x ${target.n} rows in ${d} columns: the entropic map fits in seconds and matches the joint shape.` };
  }
  const budget = timeBudgetOf(settings);
  if (has('gradient-net') && budget >= 10) {
    return {
      method: 'gradient-net',
      reason: `${source.n} x ${target.n} rows${d > ENTROPIC_MAX_D ? ` in ${d} columns` : ''} is too large for the entropic method: a gradient network trained in minibatches (time budget ${budget} s).`,
    };
  }
  return { method: 'linear', reason: 'The data is too large for the entropic method and there is no time budget for training: the linear map.' };
}

/**
 * The gradient network's time budget in the user's raw settings, however the
 * name is written (`Time_Budget`, `time-budget`), read and checked through its
 * spec; the spec's default when absent. O(#settings).
 * @throws RemapError when the value is not a number in the allowed range.
 */
function timeBudgetOf(settings: Readonly<Record<string, unknown>>): number {
  for (const [k, v] of Object.entries(settings)) {
    if (normaliseName(k) === 'time_budget') return settingsOf(GRADIENT_NET_SETTINGS, { time_budget: v }, 'gradient-net').time_budget;
  }
  return settingsOf(GRADIENT_NET_SETTINGS, {}, 'gradient-net').time_budget;
}
