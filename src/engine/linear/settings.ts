import type { SettingSpec } from '../settings';

/** The linear method's own settings (the common `tails` setting is added by methods.ts and has no effect here). */
export const LINEAR_SETTINGS = [
  {
    name: 'ridge',
    type: 'number',
    default: 0,
    min: 0,
    describe: 'Added to every variance of both samples before fitting (default 0). Set a small value, e.g. 1e-6 times a typical variance, when a column is constant or columns are collinear.',
  },
] as const satisfies readonly SettingSpec[];
