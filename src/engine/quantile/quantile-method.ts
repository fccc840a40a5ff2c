import type { MethodSpec } from '../method';
import { oneColumnMethod, type ColumnRecipe } from './fit-columns';
import { quantileColumn, quantileColumnFromParams } from './quantile-column';
import { QUANTILE_SETTINGS } from './quantile-settings';
import { settingsOf } from '../settings';

const recipe: ColumnRecipe = {
  method: 'quantile',
  build: (src, tgt, where, settings) => quantileColumn(src, tgt, where, settingsOf(QUANTILE_SETTINGS, settings, 'quantile').knots),
  settings: QUANTILE_SETTINGS,
  restore: quantileColumnFromParams,
  warnTies: true,
};

/**
 * Method `quantile`: the continuous monotone map of each column, linear between
 * matched quantiles (Hazen positions, ties merged; see `quantileColumn`).
 * Takes row weights; at least 2 rows per sample and 2 distinct values per
 * column. Several columns are matched each on its own (marginals only).
 * Setting `knots` makes large maps compact (see quantileColumn).
 * Fit cost O(d (n log n + m log m)); apply O(n d) for large or sorted input.
 * @example await fitMap('quantile', sample([1, 2, 3]), sample([10, 20, 40])) // apply([2]) gives [20]
 */
export const quantileMethod: MethodSpec = oneColumnMethod(
  recipe,
  'Continuous monotone map of each column: matches quantiles and interpolates linearly between them.',
);
