import type { MethodSpec } from '../method';
import { oneColumnMethod, type ColumnRecipe } from './fit-columns';
import { stepColumn, stepColumnFromParams } from './step-column';

const recipe: ColumnRecipe = {
  method: 'step',
  build: stepColumn,
  restore: stepColumnFromParams,
  warnTies: true,
};

/**
 * Method `step`: the exact inverse-CDF map of each column, T(x) = G^-1(F(x)),
 * whose results are target sample values (see `stepColumn`). Takes row
 * weights; at least 2 rows per sample and 2 distinct values per column.
 * Several columns are matched each on its own (marginals only).
 * Fit cost O(d (n log n + m log m)).
 * @example await fitMap('step', sample([1, 2, 3]), sample([10, 20, 40])) // apply([2.5]) gives [20]
 */
export const stepMethod: MethodSpec = oneColumnMethod(recipe, 'Exact inverse-CDF map of each column: every result is a target sample value.');
