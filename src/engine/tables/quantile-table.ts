import { RemapError } from '../errors';

/**
 * A published table of quantiles: at probability p[k] the distribution's
 * quantile is v[k]. Remap reads the quantile function as the straight line
 * between consecutive points (linear interpolation in p), which is exact at the
 * points and errs in between by at most h^2/8 max|Q''| on a step of width h
 * (the error of linear interpolation; e.g. Burden & Faires, "Numerical
 * Analysis", Thm 3.3); `tableInterpolationError` estimates it from the table.
 */
export interface QuantileTable {
  /** Probabilities, strictly increasing, within [0, 1]. */
  readonly p: Float64Array;
  /** Quantiles, strictly increasing. */
  readonly v: Float64Array;
}

/**
 * Checks and copies a quantile table. Cost: O(K).
 * @param p probabilities (shares 0..1; percentages are refused, not guessed).
 * @param v the quantile at each probability.
 * @param where words for messages, e.g. "target table".
 * @throws RemapError naming the row for: fewer than 2 points, lengths that differ, a non-finite number,
 *   a probability outside [0, 1], probabilities or values not strictly increasing.
 * @example quantileTable([0.1, 0.5, 0.9], [-1.28, 0, 1.28], 'target table').p // Float64Array [0.1, 0.5, 0.9]
 */
export function quantileTable(p: ArrayLike<number>, v: ArrayLike<number>, where: string): QuantileTable {
  if (p.length !== v.length) throw new RemapError(`${where}: ${p.length} probabilities but ${v.length} values; give one value per probability.`);
  if (p.length < 2) throw new RemapError(`${where}: a quantile table needs at least 2 points (it has ${p.length}); give more rows.`);
  const P = Float64Array.from(p);
  const V = Float64Array.from(v);
  for (let k = 0; k < P.length; k++) {
    if (!Number.isFinite(P[k]) || !Number.isFinite(V[k])) throw new RemapError(`${where}: row ${k + 1} holds ${P[k]}, ${V[k]}; give finite numbers.`);
    if (P[k] < 0 || P[k] > 1) {
      throw new RemapError(`${where}: row ${k + 1} has probability ${P[k]}, outside 0..1; give probabilities as shares (0.25, not 25).`);
    }
    if (k > 0 && !(P[k] > P[k - 1]))
      throw new RemapError(
        `${where}: the probability in row ${k + 1} (${P[k]}) is not larger than the one before (${P[k - 1]}); sort the rows and remove repeated probabilities.`,
      );
    if (k > 0 && !(V[k] > V[k - 1])) {
      throw new RemapError(
        `${where}: the value in row ${k + 1} (${V[k]}) is not larger than the one before (${V[k - 1]}); a quantile table needs rising values. For a value many rows share (an atom), give the data as a frequency table, or keep one of the repeated rows.`,
      );
    }
  }
  return { p: P, v: V };
}
