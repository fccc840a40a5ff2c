import { RemapError } from '../errors';

/** Eigenvalues and eigenvectors of a symmetric matrix. */
export interface SymmetricEigen {
  readonly d: number;
  /** Eigenvalues in ascending order, length d. */
  readonly values: Float64Array;
  /** Row-major d x d; column j (entries vectors[k * d + j]) is the unit eigenvector of values[j]. */
  readonly vectors: Float64Array;
  /** Jacobi sweeps used. */
  readonly sweeps: number;
}

/** Relative asymmetry |a_kl - a_lk| / max|a| accepted before the matrix is called not symmetric. */
export const SYMMETRY_TOLERANCE = 1e-10;
/** Upper bound on Jacobi sweeps; cyclic Jacobi converges quadratically and needs about 6-12. */
export const MAX_JACOBI_SWEEPS = 100;

/**
 * Eigendecomposition S = V diag(values) V^T of a real symmetric d x d matrix
 * by the cyclic Jacobi method (Jacobi 1846; the threshold form in Rutishauser,
 * "The Jacobi method for real symmetric matrices", Numer. Math. 9, 1966): plane
 * rotations zero the off-diagonal entries one at a time, sweep after sweep,
 * until they vanish. It gives eigenvalues with small relative error and
 * orthonormal eigenvectors even when eigenvalues are close or repeated.
 * The input is symmetrised as (S + S^T) / 2 after checking that it is
 * symmetric within SYMMETRY_TOLERANCE (relative to its largest entry).
 *
 * Cost: O(d^3) per sweep, at most `maxSweeps` sweeps; O(d^2) memory.
 * Never mutates `matrix`.
 *
 * @param matrix row-major d x d numbers, finite and symmetric.
 * @param d the size, an integer >= 1.
 * @param maxSweeps optional bound on sweeps (integer 1..1000, default MAX_JACOBI_SWEEPS).
 * @throws RemapError for a wrong length, non-finite entries, an asymmetric
 *   matrix, or (kind 'num') no convergence within the sweep bound.
 * @example symmetricEigen(Float64Array.from([2, 1, 1, 2]), 2)
 * // values [1, 3]; vectors columns ±[0.7071, -0.7071] and ±[0.7071, 0.7071]
 */
export function symmetricEigen(matrix: ArrayLike<number>, d: number, maxSweeps: number = MAX_JACOBI_SWEEPS): SymmetricEigen {
  const fn = 'symmetricEigen';
  if (!(Number.isInteger(d) && d >= 1)) throw new RemapError(`${fn}: the size d is ${d}; give a whole number of at least 1.`);
  if (matrix.length !== d * d)
    throw new RemapError(`${fn}: the matrix has ${matrix.length} entries but a ${d} x ${d} matrix needs ${d * d}; give it row by row.`);
  if (!(Number.isInteger(maxSweeps) && maxSweeps >= 1 && maxSweeps <= 1000))
    throw new RemapError(`${fn}: maxSweeps is ${maxSweeps}; give a whole number from 1 to 1000.`);
  let maxAbs = 0;
  for (let j = 0; j < d * d; j++) {
    const v = matrix[j];
    if (!Number.isFinite(v)) throw new RemapError(`${fn}: entry (${Math.floor(j / d) + 1}, ${(j % d) + 1}) is ${v}; give finite numbers.`);
    if (Math.abs(v) > maxAbs) maxAbs = Math.abs(v);
  }
  const a = new Float64Array(d * d);
  for (let k = 0; k < d; k++) {
    a[k * d + k] = matrix[k * d + k];
    for (let l = k + 1; l < d; l++) {
      const u = matrix[k * d + l];
      const w = matrix[l * d + k];
      if (Math.abs(u - w) > SYMMETRY_TOLERANCE * maxAbs) {
        throw new RemapError(
          `${fn}: the matrix is not symmetric: entry (${k + 1}, ${l + 1}) is ${u} but (${l + 1}, ${k + 1}) is ${w}; give a symmetric matrix.`,
        );
      }
      const s = 0.5 * (u + w);
      a[k * d + l] = s;
      a[l * d + k] = s;
    }
  }
  const v = new Float64Array(d * d);
  for (let k = 0; k < d; k++) v[k * d + k] = 1;

  let sweeps = 0;
  let converged = d === 1;
  for (; sweeps < maxSweeps && !converged; sweeps++) {
    let off = 0;
    for (let p = 0; p < d; p++) for (let q = p + 1; q < d; q++) off += Math.abs(a[p * d + q]);
    if (off === 0) {
      converged = true;
      break;
    }
    for (let p = 0; p < d - 1; p++) {
      for (let q = p + 1; q < d; q++) {
        const apq = a[p * d + q];
        if (apq === 0) continue;
        const app = a[p * d + p];
        const aqq = a[q * d + q];
        const g = 100 * Math.abs(apq);
        // After a few sweeps an entry too small to change either diagonal entry is set to zero.
        if (sweeps > 3 && Math.abs(app) + g === Math.abs(app) && Math.abs(aqq) + g === Math.abs(aqq)) {
          a[p * d + q] = 0;
          a[q * d + p] = 0;
          continue;
        }
        // Rotation angle phi with cot(2 phi) = theta; t = tan(phi), the smaller root (|phi| <= pi/4).
        const theta = (aqq - app) / (2 * apq);
        const t = Math.abs(theta) > 1e150 ? 1 / (2 * theta) : (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        a[p * d + p] = app - t * apq;
        a[q * d + q] = aqq + t * apq;
        a[p * d + q] = 0;
        a[q * d + p] = 0;
        for (let r = 0; r < d; r++) {
          if (r === p || r === q) continue;
          const arp = a[r * d + p];
          const arq = a[r * d + q];
          const np = c * arp - s * arq;
          const nq = s * arp + c * arq;
          a[r * d + p] = np;
          a[p * d + r] = np;
          a[r * d + q] = nq;
          a[q * d + r] = nq;
        }
        for (let r = 0; r < d; r++) {
          const vrp = v[r * d + p];
          const vrq = v[r * d + q];
          v[r * d + p] = c * vrp - s * vrq;
          v[r * d + q] = s * vrp + c * vrq;
        }
      }
    }
  }
  if (!converged) {
    // Accept an off-diagonal remainder at rounding level; refuse anything larger.
    let off = 0;
    let diag = 0;
    for (let p = 0; p < d; p++) {
      diag = Math.max(diag, Math.abs(a[p * d + p]));
      for (let q = p + 1; q < d; q++) off = Math.max(off, Math.abs(a[p * d + q]));
    }
    if (off > 1e-14 * diag) {
      throw new RemapError(
        `${fn}: the Jacobi iteration did not converge in ${maxSweeps} sweeps (largest off-diagonal entry ${off.toExponential(2)}); check the matrix for extreme scales.`,
        'num',
      );
    }
  }

  // Sort ascending, carrying eigenvector columns along.
  const order = Array.from({ length: d }, (_, k) => k).sort((i, j) => a[i * d + i] - a[j * d + j] || i - j);
  const values = new Float64Array(d);
  const vectors = new Float64Array(d * d);
  for (let j = 0; j < d; j++) {
    const src = order[j];
    values[j] = a[src * d + src];
    for (let r = 0; r < d; r++) vectors[r * d + j] = v[r * d + src];
  }
  return { d, values, vectors, sweeps };
}

/**
 * Rebuilds V diag(f(values)) V^T from an eigendecomposition: a function of a
 * symmetric matrix (square root, inverse, inverse square root, ...). Only the
 * upper triangle is computed and mirrored, so the result is exactly symmetric.
 * Cost: O(d^3). Never mutates `eig`.
 *
 * @param eig the decomposition from `symmetricEigen`.
 * @param f applied to each eigenvalue; must return finite numbers.
 * @throws RemapError if f returns a non-finite number.
 * @example spectralFunction(symmetricEigen(Float64Array.from([4, 0, 0, 9]), 2), Math.sqrt) // [2, 0, 0, 3]
 */
export function spectralFunction(eig: SymmetricEigen, f: (lambda: number) => number): Float64Array {
  const { d, values, vectors } = eig;
  const fv = new Float64Array(d);
  for (let j = 0; j < d; j++) {
    fv[j] = f(values[j]);
    if (!Number.isFinite(fv[j]))
      throw new RemapError(`spectralFunction: the function gives ${fv[j]} at eigenvalue ${values[j]}; the matrix is outside the function's domain.`, 'num');
  }
  const out = new Float64Array(d * d);
  for (let k = 0; k < d; k++) {
    for (let l = k; l < d; l++) {
      let s = 0;
      for (let j = 0; j < d; j++) s += vectors[k * d + j] * fv[j] * vectors[l * d + j];
      out[k * d + l] = s;
      out[l * d + k] = s;
    }
  }
  return out;
}
