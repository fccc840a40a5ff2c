/**
 * For each value xs[r] (ascending), the largest k with sx[k] <= xs[r], or -1
 * when xs[r] lies below every sx: which stretch between distinct source values
 * each value falls in, found once so that every bootstrap replicate reads it.
 * One merge-like pass: O(xs.length + sx.length).
 * @example knotUnits(Float64Array.of(1, 2, 4), Float64Array.of(0, 2, 3, 9)) // Int32Array [-1, 1, 1, 2]
 */
export function knotUnits(sx: Float64Array, xs: Float64Array): Int32Array {
  const unit = new Int32Array(xs.length);
  let k = -1;
  for (let r = 0; r < xs.length; r++) {
    while (k + 1 < sx.length && sx[k + 1] <= xs[r]) k++;
    unit[r] = k;
  }
  return unit;
}
