import { RemapError } from '../engine/errors';
import { getMethod, settingSpecs } from '../engine/methods';
import { normaliseName, type SettingSpec } from '../engine/settings';

/**
 * The time budget Remap enforces (seconds) for methods that have no
 * time_budget setting of their own: long enough for the largest entropic fit
 * the auto choice sends there (5,000 x 5,000 rows), short enough that a cell
 * never waits for ever. Methods with their own setting (gradient-net) stop
 * training at their budget and return the map with a warning instead.
 */
export const DEFAULT_TIME_BUDGET_SECONDS = 120;

/** The time_budget setting as the pane lists it for methods that lack their own. */
export const ENFORCED_TIME_BUDGET: SettingSpec = Object.freeze({
  name: 'time_budget',
  type: 'number',
  default: DEFAULT_TIME_BUDGET_SECONDS,
  min: 0,
  minExclusive: true,
  max: 86400,
  describe: 'Seconds the fit may run at most; past it the fit stops with an error saying so (checked by Remap for this method).',
});

/** True when the method declares a time_budget setting of its own (it then stops itself and keeps the map). */
export function hasOwnTimeBudget(method: string): boolean {
  return settingSpecs(getMethod(method)).some((s) => s.name === 'time_budget');
}

/**
 * Splits a time_budget out of the raw settings for a method without its own,
 * checking it as a number of seconds; the rest go to the engine unchanged.
 * O(#settings).
 * @throws RemapError naming `fn` for a budget that is not a number of seconds in (0, 86400].
 */
export function splitBudget(method: string, raw: Record<string, unknown>, fn: string): { settings: Record<string, unknown>; budget: number } {
  if (hasOwnTimeBudget(method)) return { settings: raw, budget: Infinity };
  const settings: Record<string, unknown> = Object.create(null);
  let budget = DEFAULT_TIME_BUDGET_SECONDS;
  for (const [k, v] of Object.entries(raw)) {
    if (normaliseName(k) !== 'time_budget') {
      settings[k] = v;
      continue;
    }
    const b = typeof v === 'number' ? v : typeof v === 'string' && v.trim() !== '' ? Number(v.trim()) : NaN;
    if (!(b > 0 && b <= 86400)) {
      throw new RemapError(`${fn}: the setting time_budget must be a number of seconds greater than 0 and at most 86400, not "${String(v)}".`);
    }
    budget = b;
  }
  return { settings, budget };
}

/** The error a fit stopped by its budget ends with: what ran out and what to do. */
export function budgetError(fn: string, method: string, sourceRows: number, targetRows: number, budgetSeconds: number): RemapError {
  const b = budgetSeconds;
  return new RemapError(
    `${fn}: the ${method} fit of ${sourceRows} x ${targetRows} rows was stopped when its time budget of ${b} s ran out. ` +
      `Give it more time with the setting time_budget (e.g. "time_budget=${Math.min(86400, Math.max(2 * b, 300))}"), ` +
      'fit on fewer rows, or choose a faster method such as linear.',
    'na',
  );
}
