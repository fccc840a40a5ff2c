import type { SettingSpec } from '../settings';
import { UNITS_SETTING } from '../stats/column-scales';

/**
 * The linear method's settings: `ridge`, and `units` (UNITS_SETTING). It takes
 * no `tails`: a linear map continues beyond the fitted range as the same affine map.
 */
export const LINEAR_SETTINGS = [
  {
    name: 'ridge',
    type: 'number',
    default: 0,
    min: 0,
    describe:
      "Added to every variance of both samples before fitting (default 0), in the fitted units: with units=standardised a share of each column's pooled variance (1e-6 is a good start), with units=raw the data's own squared units (about 1e-6 times the smallest column variance). Set it when a column is constant or columns are collinear.",
  },
  UNITS_SETTING,
] as const satisfies readonly SettingSpec[];
