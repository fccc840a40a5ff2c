import { RemapError } from './errors';
import type { Points, Sample } from './points';

/**
 * A sample as the engine's own code reads it, from whatever a caller built: `n` and `d` whole numbers, `data` n x d
 * finite-or-not numbers (checked later), `weights` null when absent (a hand-built sample may leave the field out).
 * Returns the same object when it is already in that form, else a shallow copy (the data are never copied). O(1).
 * @throws RemapError when the shape is not that of a sample (what it lacks, and how to build one: `sample(rows)`).
 * @example asSample({ n: 2, d: 1, data: Float64Array.of(1, 2) }, 'source', 'fit (quantile)').weights // null
 */
export function asSample(s: Sample, name: string, fn: string): Sample {
  const bad = (what: string): never => {
    throw new RemapError(`${fn}: the ${name} ${what}; build samples with sample(rows) or give { n, d, data: Float64Array of n x d numbers, weights: null }.`);
  };
  if (typeof s !== 'object' || s === null) bad('is not a sample');
  if (!Number.isInteger(s.n) || s.n < 0 || !Number.isInteger(s.d) || s.d < 0) bad('has no whole-number row and column counts (n, d)');
  if (!s.data || typeof s.data.length !== 'number' || s.data.length !== s.n * s.d) bad(`data do not hold n x d = ${s.n * s.d} numbers`);
  if (s.weights !== null && s.weights !== undefined && typeof s.weights.length !== 'number') bad('weights are neither null nor a list of numbers');
  return s.weights === undefined ? { ...s, weights: null } : s;
}

/**
 * Checks a sample before fitting: finite values, weights non-negative, finite,
 * not all zero, at least `minRows` rows with positive weight. `name` ("source",
 * "target") goes into messages. O(n d).
 * @throws RemapError saying which value is wrong and what to do.
 */
export function checkSample(s: Sample, name: string, minRows: number, fn: string): void {
  checkFinite(s, name, fn);
  if (s.n < minRows) {
    throw new RemapError(`${fn}: the ${name} has ${s.n} usable row${s.n === 1 ? '' : 's'} but at least ${minRows} are needed; give more rows.`);
  }
  if (s.weights) {
    if (s.weights.length !== s.n) throw new RemapError(`${fn}: ${s.weights.length} ${name} weights for ${s.n} rows; give one weight per row.`);
    let total = 0;
    let positive = 0;
    for (let i = 0; i < s.n; i++) {
      const w = s.weights[i];
      if (!Number.isFinite(w)) throw new RemapError(`${fn}: ${name} weight in row ${i + 1} is not a finite number; weights must be finite and non-negative.`);
      if (w < 0) throw new RemapError(`${fn}: ${name} weight in row ${i + 1} is negative (${w}); weights must be zero or positive.`);
      total += w;
      if (w > 0) positive++;
    }
    if (!(total > 0)) throw new RemapError(`${fn}: all ${name} weights are zero; give at least one positive weight.`);
    if (!Number.isFinite(total)) throw new RemapError(`${fn}: the ${name} weights add up to more than the largest number; rescale them.`);
    if (positive < minRows) {
      throw new RemapError(`${fn}: only ${positive} ${name} row${positive === 1 ? ' has' : 's have'} positive weight but at least ${minRows} are needed.`);
    }
  }
}

/** @throws RemapError at the first non-finite coordinate. */
export function checkFinite(p: Points, name: string, fn: string): void {
  const { data, d } = p;
  for (let j = 0; j < data.length; j++) {
    if (!Number.isFinite(data[j])) {
      throw new RemapError(
        `${fn}: the ${name} has a non-finite number (${data[j]}) in row ${Math.floor(j / d) + 1}, column ${(j % d) + 1}; remove or replace it.`,
      );
    }
  }
}

/** @throws RemapError unless both samples have the same number of columns. */
export function checkSameColumns(source: Points, target: Points, fn: string): void {
  if (source.d !== target.d) {
    throw new RemapError(
      `${fn}: the source has ${source.d} column${source.d === 1 ? '' : 's'} and the target ${target.d}; give both the same columns in the same order.`,
    );
  }
}

/** Largest |value| a method built on squared distances accepts: squares stay far below the largest double. */
export const MAX_ABS_VALUE = 1e150;
/** Smallest spread (max - min) of a varying column such methods accept: squares stay far above the smallest normal double. */
export const MIN_SPREAD = 1e-140;

/**
 * Refuses data whose size methods built on squared distances (linear, pairs,
 * entropic, gradient-net) cannot handle in double precision: a value beyond
 * 1e150 (its square would overflow) or a column that varies by less than 1e-140
 * (its squared spread would underflow, and every point would look alike).
 * Cost: O(n d).
 * @throws RemapError (kind 'num') naming the sample and column, and saying to rescale.
 */
export function checkScale(p: Points, name: string, fn: string): void {
  const { n, d, data } = p;
  for (let k = 0; k < d; k++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = data[i * d + k];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    if (Math.max(Math.abs(lo), Math.abs(hi)) > MAX_ABS_VALUE) {
      throw new RemapError(
        `${fn}: column ${k + 1} of the ${name} holds values as large as ${(Math.abs(lo) > Math.abs(hi) ? lo : hi).toPrecision(3)}, too large to square in double precision; rescale the columns (for example to thousands or millions) and fit again.`,
        'num',
      );
    }
    if (hi > lo && hi - lo < MIN_SPREAD) {
      throw new RemapError(
        `${fn}: column ${k + 1} of the ${name} varies by only ${(hi - lo).toPrecision(3)}, too little to square in double precision; rescale the columns (for example multiply them by 1e6) and fit again.`,
        'num',
      );
    }
  }
}
