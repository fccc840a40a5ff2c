import { RemapError } from '../errors';

/**
 * Readers for the numbers a saved map stores. A map file may have been edited
 * by hand or cut short, so every array is checked (finite numbers, order,
 * length) before a map is rebuilt from it.
 */

/** A saved value that must be an object (a column's fitted numbers). @throws RemapError if it is not one. */
export function readRecord(value: unknown, where: string): Readonly<Record<string, unknown>> {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new RemapError(`${where}: expected an object of fitted numbers; the saved map is damaged. Fit the map again.`);
  }
  return value as Record<string, unknown>;
}

/**
 * The field `key` of `rec` as a Float64Array of finite numbers, in the given
 * order ('strict' increasing, 'rising' non-decreasing, or 'any'), at least
 * `minLength` long. Cost: O(n).
 * @throws RemapError naming the field and the first bad entry.
 * @example readNumbers({ xs: [1, 2] }, 'xs', 'load', 'strict', 2) // Float64Array [1, 2]
 */
export function readNumbers(
  rec: Readonly<Record<string, unknown>>,
  key: string,
  where: string,
  order: 'strict' | 'rising' | 'any',
  minLength: number,
): Float64Array {
  const raw = rec[key];
  if (!Array.isArray(raw))
    throw new RemapError(`${where}: the field "${key}" is missing or not a list of numbers; the saved map is damaged. Fit the map again.`);
  if (raw.length < minLength)
    throw new RemapError(
      `${where}: the field "${key}" has ${raw.length} numbers but needs at least ${minLength}; the saved map is damaged. Fit the map again.`,
    );
  const out = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) {
    const v = raw[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new RemapError(`${where}: entry ${i + 1} of "${key}" is ${JSON.stringify(v)}, not a finite number; the saved map is damaged. Fit the map again.`);
    }
    if (i > 0 && ((order === 'strict' && !(v > out[i - 1])) || (order === 'rising' && v < out[i - 1]))) {
      throw new RemapError(`${where}: entry ${i + 1} of "${key}" (${v}) is out of order; the saved map is damaged. Fit the map again.`);
    }
    out[i] = v;
  }
  return out;
}

/** Checks two arrays have the same length. @throws RemapError otherwise. */
export function sameLength(a: Float64Array, b: Float64Array, names: string, where: string): void {
  if (a.length !== b.length)
    throw new RemapError(`${where}: ${names} have ${a.length} and ${b.length} numbers; they must match. The saved map is damaged; fit the map again.`);
}

/** Plain number array for JSON. */
export function plain(a: Float64Array): number[] {
  return Array.from(a);
}
