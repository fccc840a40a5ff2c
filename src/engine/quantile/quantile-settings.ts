import type { SettingSpec } from '../settings';

/** Above this many knots the automatic choice (knots=0) compacts a quantile map. Design choice: about 200 KB of JSON. */
export const AUTO_COMPACT_ABOVE = 4096;

/**
 * The automatic tolerance: half of 1e-3 of the target's interquartile range, so
 * the largest difference from the full map stays below 1e-3 of it. Design choice.
 */
export const AUTO_TOLERANCE_IQR = 5e-4;

/** The quantile method's own settings beside `tails` (TAILS_SETTING, which oneColumnMethod adds to every 1-D method). */
export const QUANTILE_SETTINGS = [
  {
    name: 'knots',
    type: 'integer',
    default: 0,
    min: 0,
    max: 1e9,
    describe:
      "How many knots the map keeps. 0 (default): every knot up to 4,096, above that the fewest that stay within 5e-4 of the target's interquartile range of the full map; " +
      'a number K >= 4: at most K knots, as close to the full map as K allows. The report states the largest difference from the full map. Set it above the row count to keep every knot.',
  },
] as const satisfies readonly SettingSpec[];
