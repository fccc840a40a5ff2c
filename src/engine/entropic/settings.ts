import { RemapError } from '../errors';
import type { SettingSpec, Settings } from '../settings';

/** The entropic method's own settings (the common `tails` setting is added by the registry and not used: see EntropicMap). */
export const ENTROPIC_SETTINGS: readonly SettingSpec[] = [
  {
    name: 'eps',
    type: 'number',
    default: 0,
    min: 0,
    describe:
      'Entropic regularisation, in the units of the cost |x - y|^2 / 2: smaller follows the data more closely but needs more iterations. 0 (the default) chooses 0.125 x the mean variance of a column x n^(-2/(d+4)); the diagnostics show the value used.',
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
      'Stop when the L1 error of the plan\'s marginals is below this. The default 1e-4 moves the fitted map by less than 1e-6 % of the target variance against 1e-6, with a sixth to a third fewer iterations.',
  },
  {
    name: 'seed',
    type: 'integer',
    default: 1,
    min: 0,
    max: 4294967295,
    describe: 'Seed for the (at most 200) source rows on which the Jacobian\'s smallest eigenvalue is checked.',
  },
];

/** The entropic settings as numbers. */
export interface EntropicSettings {
  /** 0 = choose from the data. */
  readonly eps: number;
  readonly maxIterations: number;
  readonly tolerance: number;
  readonly seed: number;
}

/**
 * Reads the entropic settings from resolved settings, filling defaults for
 * missing ones (so direct engine calls may pass `{}`). O(1).
 * @throws RemapError for a value outside its range (resolveSettings normally caught it already).
 * @example readEntropicSettings({ eps: 0.5 }) // { eps: 0.5, maxIterations: 1000, tolerance: 1e-4, seed: 1 }
 */
export function readEntropicSettings(s: Settings): EntropicSettings {
  const num = (name: string): number => {
    const spec = ENTROPIC_SETTINGS.find((x) => x.name === name) as SettingSpec;
    const v = s[name] ?? spec.default;
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new RemapError(`fit (entropic): setting ${name} must be a finite number, not "${String(v)}".`);
    if ((spec.min !== undefined && (spec.minExclusive ? v <= spec.min : v < spec.min)) || (spec.max !== undefined && v > spec.max)) {
      throw new RemapError(`fit (entropic): setting ${name} is ${v}, outside its allowed range; see the method's settings.`);
    }
    if (spec.type === 'integer' && !Number.isInteger(v)) throw new RemapError(`fit (entropic): setting ${name} must be a whole number, not ${v}.`);
    return v;
  };
  return { eps: num('eps'), maxIterations: num('max_iterations'), tolerance: num('tolerance'), seed: num('seed') };
}
