import { RemapError } from './errors';
import type { Points, Sample } from './points';

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
      throw new RemapError(`${fn}: the ${name} has a non-finite number (${data[j]}) in row ${Math.floor(j / d) + 1}, column ${(j % d) + 1}; remove or replace it.`);
    }
  }
}

/** @throws RemapError unless both samples have the same number of columns. */
export function checkSameColumns(source: Points, target: Points, fn: string): void {
  if (source.d !== target.d) {
    throw new RemapError(`${fn}: the source has ${source.d} column${source.d === 1 ? '' : 's'} and the target ${target.d}; give both the same columns in the same order.`);
  }
}
