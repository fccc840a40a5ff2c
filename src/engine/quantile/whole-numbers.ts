import { RemapError } from '../errors';

/** Largest score magnitude the ordinal method takes: k +- 0.5 must stay exact. */
export const MAX_WHOLE_SCORE = 2 ** 51;

/**
 * Checks that every value is a whole number (a test score, a count, a rating)
 * small enough that k +- 0.5 is exact. Cost: O(n).
 * @param values the column to check.
 * @param where words for the message, e.g. "fit (ordinal): source column 1".
 * @throws RemapError naming the row and the value, and pointing to method quantile.
 * @example checkWholeNumbers(Float64Array.of(0, 2, 5), 'source') // passes
 */
export function checkWholeNumbers(values: ArrayLike<number>, where: string): void {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isInteger(v)) {
      throw new RemapError(
        `${where}, row ${i + 1} holds ${v}, which is not a whole number; the ordinal method is for whole-number scores. Use method quantile for measured values.`,
      );
    }
    if (Math.abs(v) > MAX_WHOLE_SCORE) {
      throw new RemapError(
        `${where}, row ${i + 1} holds ${v}, larger than ${MAX_WHOLE_SCORE} in size; the ordinal method takes scores up to that size. Use method quantile for such values.`,
      );
    }
  }
}
