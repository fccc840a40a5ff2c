import { settingsOf, type SettingSpec, type Settings } from '../settings';
import { UNITS_SETTING, type ColumnUnits } from '../stats/column-scales';

/** The entropic method's settings (it takes no `tails`: its results stay inside the target's convex hull, see EntropicMap). */
export const ENTROPIC_SETTINGS = [
  {
    name: 'smoothing',
    type: 'number',
    default: 0,
    min: 0,
    describe:
      'The entropic regularisation epsilon, in squared units of the fitted data (standardised columns by default; the cost is |x - y|^2 / 2): smaller follows the data more closely but needs more iterations. 0 (the default) chooses (d / 32, kept within 1/16..1/4) x the mean variance of a column x n^(-2/(d+4)); the diagnostics show the value used.',
  },
  {
    name: 'max_iterations',
    type: 'integer',
    default: 1000,
    min: 1,
    max: 100000,
    describe: 'The most Sinkhorn iterations per solve (a fit runs three: source to target, and each sample onto itself for the debiased cost).',
  },
  {
    name: 'tolerance',
    type: 'number',
    default: 1e-4,
    min: 0,
    minExclusive: true,
    max: 0.5,
    describe:
      "Stop when the L1 error of the plan's marginals is below this. The default 1e-4 moves the fitted map by less than 1e-6 % of the target variance against 1e-6, with a sixth to a third fewer iterations.",
  },
  {
    name: 'seed',
    type: 'integer',
    default: 1,
    min: 0,
    max: 4294967295,
    describe: "Seed for the (at most 200) source rows on which the Jacobian's smallest eigenvalue is checked.",
  },
  UNITS_SETTING,
] as const satisfies readonly SettingSpec[];

/** The entropic settings as numbers. */
export interface EntropicSettings {
  /** epsilon; 0 = choose from the data. */
  readonly smoothing: number;
  readonly maxIterations: number;
  readonly tolerance: number;
  readonly seed: number;
  readonly units: ColumnUnits;
}

/**
 * Reads the entropic settings from resolved settings, filling defaults for
 * missing ones (so direct engine calls may pass `{}`). O(1).
 * @throws RemapError for a value outside its range (resolveSettings normally caught it already).
 * @example readEntropicSettings({ smoothing: 0.5 }) // { smoothing: 0.5, maxIterations: 1000, tolerance: 1e-4, seed: 1, units: 'standardised' }
 */
export function readEntropicSettings(s: Settings): EntropicSettings {
  const v = settingsOf(ENTROPIC_SETTINGS, s, 'entropic');
  return { smoothing: v.smoothing, maxIterations: v.max_iterations, tolerance: v.tolerance, seed: v.seed, units: v.units as ColumnUnits };
}
