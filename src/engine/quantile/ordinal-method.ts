import type { MethodSpec } from '../method';
import { oneColumnMethod, type ColumnRecipe } from './fit-columns';
import { ordinalColumn, ordinalColumnFromParams } from './ordinal-column';
import { checkWholeNumbers } from './whole-numbers';

const recipe: ColumnRecipe = {
  method: 'ordinal',
  build: (src, tgt) => ordinalColumn(src, tgt),
  check: checkWholeNumbers,
  restore: ordinalColumnFromParams,
  warnTies: false,
};

/**
 * Method `ordinal`: equipercentile equating of whole-number scores by
 * percentile ranks (Kolen & Brennan, "Test Equating, Scaling, and Linking",
 * ch. 2; see `ordinalColumn`). Fitting data must be whole numbers (else a
 * RemapError pointing to method quantile). Takes row weights (frequencies);
 * at least 2 rows per sample. Several columns are matched each on its own.
 * Fit cost O(d (n log n + m log m)).
 * @example await fitMap('ordinal', sample([0, 1]), sample([0, 2])) // apply([0, 1]) gives [0, 2]
 */
export const ordinalMethod: MethodSpec = oneColumnMethod(
  recipe,
  'Equipercentile map of whole-number scores (percentile ranks, each score spread over its unit interval).',
);
