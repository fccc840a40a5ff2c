import { RemapError } from '../errors';
import { psdEigen } from '../stats/sqrtm';
import { spectralFunction } from '../stats/symmetric-eigen';
import { product3 } from './gaussian-transport';

/** A d x d matrix as rows (`[[1, 0], [0, 1]]`) or flat row-major numbers (`[1, 0, 0, 1]`). */
export type MatrixInput = ReadonlyArray<ArrayLike<number>> | ArrayLike<number>;

/** Relative asymmetry |c_kl - c_lk| / max|c| accepted in a given covariance (typed or rounded values). */
export const COVARIANCE_SYMMETRY_TOLERANCE = 1e-8;

/**
 * The squared 2-Wasserstein distance between two Gaussians N(mean1, cov1) and
 * N(mean2, cov2), in closed form:
 *   W2^2 = |m1 - m2|^2 + tr(S1 + S2 - 2 (S1^1/2 S2 S1^1/2)^1/2)
 * (Dowson & Landau, "The Frechet distance between multivariate normal
 * distributions", J. Multivariate Anal. 12, 1982; Olkin & Pukelsheim, "The
 * distance between two random vectors with given dispersion matrices", Linear
 * Algebra Appl. 48, 1982; Knott & Smith, "On the optimal mapping of
 * distributions", J. Optim. Theory Appl. 43, 1984). The trace term is the
 * squared Bures distance between the covariances. Singular covariances are
 * allowed (the formula holds for any positive semidefinite S1, S2).
 * Cost: O(d^3). Never mutates its inputs.
 *
 * @param mean1 length-d vector (d >= 1), finite.
 * @param cov1 d x d covariance: rows or flat row-major, finite, symmetric within
 *   COVARIANCE_SYMMETRY_TOLERANCE of its largest entry, positive semidefinite within PSD_TOLERANCE.
 * @param mean2 length-d vector.
 * @param cov2 d x d covariance, as cov1.
 * @returns W2^2 >= 0 (rounding below zero is reported as 0).
 * @throws RemapError naming the argument for a wrong size, a non-finite
 *   entry, an asymmetric or a non-positive-semidefinite matrix.
 * @example gaussianW2Squared([0, 0], [[1, 0], [0, 1]], [0, 0], [[4, 0], [0, 9]]) // 5
 */
export function gaussianW2Squared(mean1: ArrayLike<number>, cov1: MatrixInput, mean2: ArrayLike<number>, cov2: MatrixInput): number {
  const fn = 'gaussianW2Squared';
  const d = mean1.length;
  if (d < 1) throw new RemapError(`${fn}: mean1 is empty; give one mean per column.`);
  if (mean2.length !== d) throw new RemapError(`${fn}: mean1 has ${d} entries but mean2 has ${mean2.length}; give both means for the same columns.`);
  const m1 = vector(mean1, 'mean1', fn);
  const m2 = vector(mean2, 'mean2', fn);
  const s1 = matrix(cov1, d, 'cov1', fn);
  const s2 = matrix(cov2, d, 'cov2', fn);
  const eig1 = psdEigen(s1, d, 'cov1', fn);
  psdEigen(s2, d, 'cov2', fn);
  const root1 = spectralFunction(eig1, Math.sqrt);
  const inner = product3(root1, s2, root1, d);
  for (let k = 0; k < d; k++)
    for (let l = k + 1; l < d; l++) {
      const s = 0.5 * (inner[k * d + l] + inner[l * d + k]);
      inner[k * d + l] = s;
      inner[l * d + k] = s;
    }
  const innerEig = psdEigen(inner, d, 'cov1^1/2 cov2 cov1^1/2', fn);
  let trace = 0;
  for (let k = 0; k < d; k++) trace += s1[k * d + k] + s2[k * d + k];
  for (let j = 0; j < d; j++) trace -= 2 * Math.sqrt(innerEig.values[j]);
  let meanPart = 0;
  for (let k = 0; k < d; k++) meanPart += (m1[k] - m2[k]) * (m1[k] - m2[k]);
  const out = meanPart + Math.max(0, trace);
  if (!Number.isFinite(out)) throw new RemapError(`${fn}: the result overflows (${out}); rescale the means and covariances.`, 'num');
  return out;
}

function vector(v: ArrayLike<number>, name: string, fn: string): Float64Array {
  const out = Float64Array.from(v);
  for (let k = 0; k < out.length; k++) {
    if (!Number.isFinite(out[k])) throw new RemapError(`${fn}: ${name} entry ${k + 1} is ${String(v[k])}; give finite numbers.`);
  }
  return out;
}

/** Copies a matrix given as rows or flat, checks size, finiteness and symmetry; returns it symmetrised. */
function matrix(m: MatrixInput, d: number, name: string, fn: string): Float64Array {
  const out = new Float64Array(d * d);
  const first = (m as ArrayLike<unknown>)[0];
  if (m.length > 0 && typeof first === 'object' && first !== null) {
    const rows = m as ReadonlyArray<ArrayLike<number>>;
    if (rows.length !== d) throw new RemapError(`${fn}: ${name} has ${rows.length} rows but the means have ${d} entries; give a ${d} x ${d} matrix.`);
    for (let k = 0; k < d; k++) {
      if (rows[k] == null || rows[k].length !== d)
        throw new RemapError(`${fn}: ${name} row ${k + 1} has ${rows[k] == null ? 0 : rows[k].length} entries; give a ${d} x ${d} matrix.`);
      for (let l = 0; l < d; l++) out[k * d + l] = rows[k][l];
    }
  } else {
    const flat = m as ArrayLike<number>;
    if (flat.length !== d * d)
      throw new RemapError(`${fn}: ${name} has ${flat.length} entries but the means have ${d}; give a ${d} x ${d} matrix (${d * d} numbers).`);
    for (let j = 0; j < d * d; j++) out[j] = flat[j];
  }
  let maxAbs = 0;
  for (let j = 0; j < d * d; j++) {
    if (!Number.isFinite(out[j])) throw new RemapError(`${fn}: ${name} entry (${Math.floor(j / d) + 1}, ${(j % d) + 1}) is ${out[j]}; give finite numbers.`);
    maxAbs = Math.max(maxAbs, Math.abs(out[j]));
  }
  for (let k = 0; k < d; k++)
    for (let l = k + 1; l < d; l++) {
      const u = out[k * d + l];
      const w = out[l * d + k];
      if (Math.abs(u - w) > COVARIANCE_SYMMETRY_TOLERANCE * maxAbs) {
        throw new RemapError(
          `${fn}: ${name} is not symmetric: entry (${k + 1}, ${l + 1}) is ${u} but (${l + 1}, ${k + 1}) is ${w}; a covariance matrix must equal its transpose.`,
        );
      }
      out[k * d + l] = out[l * d + k] = 0.5 * (u + w);
    }
  return out;
}
