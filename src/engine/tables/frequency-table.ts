import { RemapError } from '../errors';
import type { Sample } from '../points';

/**
 * A published frequency table: each value with its count (or share) of the
 * population. It is exactly a weighted sample, one row per value weighted by
 * its amount, so every 1-D method reads it the way it reads the same values
 * written out row by row.
 */
export interface FrequencyTable {
  readonly values: Float64Array;
  readonly amounts: Float64Array;
  /** True when every amount is a whole number (counts), so the total is a row count. */
  readonly counts: boolean;
}

/**
 * Checks and copies a frequency table. Values may come in any order and repeat (their amounts add up).
 * Cost: O(K).
 * @param values the values (finite).
 * @param amounts counts or shares, one per value: finite, >= 0, with a positive total.
 * @param where words for messages.
 * @throws RemapError naming the row for lengths that differ, a non-finite number, a negative amount, or no positive amount.
 * @example frequencyTable([0, 1, 2], [5, 3, 2], 'target table').counts // true
 */
export function frequencyTable(values: ArrayLike<number>, amounts: ArrayLike<number>, where: string): FrequencyTable {
  if (values.length !== amounts.length) throw new RemapError(`${where}: ${values.length} values but ${amounts.length} counts or shares; give one per value.`);
  if (values.length === 0) throw new RemapError(`${where}: the frequency table is empty; give rows of value and count (or share).`);
  const V = Float64Array.from(values);
  const A = Float64Array.from(amounts);
  let total = 0;
  let counts = true;
  for (let k = 0; k < V.length; k++) {
    if (!Number.isFinite(V[k]) || !Number.isFinite(A[k])) throw new RemapError(`${where}: row ${k + 1} holds ${V[k]}, ${A[k]}; give finite numbers.`);
    if (A[k] < 0) throw new RemapError(`${where}: the count or share in row ${k + 1} is negative (${A[k]}); give zero or more.`);
    if (!Number.isInteger(A[k])) counts = false;
    total += A[k];
  }
  if (!(total > 0)) throw new RemapError(`${where}: every count or share is zero; give at least one positive amount.`);
  return { values: V, amounts: A, counts };
}

/** The table as a weighted sample (values as rows, amounts as weights). O(K), copies. */
export function frequencySample(t: FrequencyTable): Sample {
  return { n: t.values.length, d: 1, data: Float64Array.from(t.values), weights: Float64Array.from(t.amounts) };
}

/** Total of the amounts (a row count when `counts`). O(K). */
export function frequencyTotal(t: FrequencyTable): number {
  let s = 0;
  for (let k = 0; k < t.amounts.length; k++) s += t.amounts[k];
  return s;
}
