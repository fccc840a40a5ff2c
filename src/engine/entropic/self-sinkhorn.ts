import type { Points } from '../points';
import { epsSchedule } from './eps-schedule';
import { maxSquarings } from './kernel';
import { buildSymmetricKernel, packedSize, softMinSelf, squareSymmetricKernel, symmetricKernelTimes } from './symmetric-kernel';
import { SolveControl } from './solve-control';

export interface SelfSinkhornOptions {
  readonly eps: number;
  readonly tolerance: number;
  readonly maxIterations: number;
  /** First eps of an eps-scaling schedule (default: the target eps, a single stage). */
  readonly startEps?: number;
  readonly control?: SolveControl;
  /** Scratch for the kernel, length >= n (n + 1) / 2 (the packed upper triangle). */
  readonly kernel?: Float64Array;
}

export interface SelfSinkhornResult {
  /** The symmetric potential (length n): the plan is a_i a_j exp((f_i + f_j - C_ij) / eps). */
  readonly f: Float64Array;
  readonly iterations: number;
  /** L1 error of the plan's marginal (both marginals are equal by symmetry). */
  readonly marginalError: number;
  readonly converged: boolean;
  /** The dual objective 2 <f, a> - eps (mass - 1): the entropic self-transport cost OT_eps(a, a); the mass term is as small as the marginal error. */
  readonly value: number;
  readonly kernelBuilds: number;
}

const STAGE_ITERATIONS = 1;
const STAGE_TOLERANCE = 1e-2;
const LOG_TAU = 100;

/**
 * Entropic optimal transport of a weighted point set onto itself, the debiasing
 * term of the Sinkhorn divergence. The plan is symmetric, so one potential f
 * suffices, and the symmetrised iteration f <- (f + T(f)) / 2 with
 * T(f)_i = -eps log sum_j a_j exp((f_j - C_ij) / eps) converges in a handful
 * of steps (Feydy et al. 2019, "Interpolating between optimal transport and MMD
 * using Sinkhorn divergences", section 3.1). Kernel form with absorption as in
 * `solveSinkhorn`; in scalings the step reads u <- sqrt(u / K(a u)).
 * By default there is no epsilon-scaling: one stage at the target eps. At
 * f = 0 the diagonal entries K_ii = exp(0) = 1, so no row can underflow, and
 * the averaged step converges from there in a few iterations (measured at the
 * default eps: 2-12 iterations against 10-16 when halving from a quarter of
 * the mean cost, the value equal to 1e-9 relative). `startEps` still asks for
 * a schedule. The kernel is symmetric, so only its upper triangle
 * is stored (symmetric-kernel.ts): half the Math.exp calls and half the memory
 * of the full square.
 * Cost: O(n^2 / 2) per iteration plus O(n^2 (d + 1) / 2) per exact build; memory 4 n (n + 1) bytes.
 * @param x the points; logA their log-masses (summing in exp to 1).
 * @param o eps > 0, tolerance > 0, maxIterations >= 1.
 * @throws RemapError (kind 'cancelled') through `o.control`.
 * @example solveSelfSinkhorn(x, logA, { eps: 0.1, tolerance: 1e-9, maxIterations: 500 }).value // OT_eps(a, a)
 */
export function solveSelfSinkhorn(x: Points, logA: Float64Array, o: SelfSinkhornOptions): SelfSinkhornResult {
  const n = x.n;
  const a = logA.map(Math.exp);
  const K = o.kernel && o.kernel.length >= packedSize(n) ? o.kernel : new Float64Array(packedSize(n));
  const control = o.control ?? new SolveControl({}, o.maxIterations);
  const schedule = epsSchedule(o.eps, o.startEps ?? o.eps);
  const squaringCap = maxSquarings(o.tolerance);
  const stages = schedule.length;
  const f = new Float64Array(n);
  const fNew = new Float64Array(n);
  const scratch = new Float64Array(n);
  const u = new Float64Array(n).fill(1);
  const au = Float64Array.from(a);
  const s = new Float64Array(n);
  let eps = schedule[0];
  let builds = 0;
  let squarings = 0;
  let err = Infinity;
  let mass = 1;
  let fresh = false;

  const absorb = (): void => {
    for (let i = 0; i < n; i++) f[i] += eps * Math.log(u[i]);
    u.fill(1);
    au.set(a);
    fresh = false;
  };
  const rebuild = (exactStep: boolean): void => {
    absorb();
    if (exactStep) {
      // f <- T(f) in the log domain, for rows whose kernel underflowed.
      softMinSelf(x, logA, f, eps, fNew, scratch);
      f.set(fNew);
    }
    buildSymmetricKernel(x, f, eps, K);
    builds++;
    squarings = 0;
  };

  rebuild(false);
  let iterations = 0;
  let converged = false;
  const stageCap = Math.min(STAGE_ITERATIONS, Math.floor(o.maxIterations / (2 * stages)));
  for (let st = 0; st < stages; st++) {
    const last = st === stages - 1;
    if (st > 0) {
      if (squarings >= squaringCap) {
        absorb();
        eps = schedule[st];
        rebuild(false);
      } else {
        // Square with the scalings first (K' = (u_i K_ij u_j)^2), then fold them into f at the old eps.
        squareSymmetricKernel(K, n, u);
        squarings++;
        absorb();
        eps = schedule[st];
      }
    }
    const tol = last ? o.tolerance : Math.max(o.tolerance, STAGE_TOLERANCE);
    const cap = last ? Math.max(0, o.maxIterations - iterations) : stageCap;
    for (let it = 0; it < cap; it++) {
      let bad = false;
      err = 0;
      mass = 0;
      symmetricKernelTimes(K, n, au, s);
      for (let i = 0; i < n; i++) {
        const acc = s[i];
        const row = au[i] * acc;
        mass += row;
        err += Math.abs(row - a[i]);
        if (!(acc > 0 && acc < Infinity)) bad = true;
      }
      iterations++;
      fresh = !bad;
      control.tick(err);
      if (bad) {
        rebuild(true);
        continue;
      }
      if (err < tol) {
        if (last) converged = true;
        break;
      }
      if (last && it === cap - 1) break;
      let big = false;
      for (let i = 0; i < n; i++) {
        const ui = Math.sqrt(u[i] / s[i]);
        u[i] = ui;
        au[i] = a[i] * ui;
        if (Math.abs(Math.log(ui)) > LOG_TAU) big = true;
      }
      fresh = false;
      if (big) rebuild(false);
    }
  }
  if (!fresh) {
    err = 0;
    mass = 0;
    symmetricKernelTimes(K, n, au, s);
    for (let i = 0; i < n; i++) {
      mass += au[i] * s[i];
      err += Math.abs(au[i] * s[i] - a[i]);
    }
  }
  const F = new Float64Array(n);
  let value = 0;
  for (let i = 0; i < n; i++) {
    F[i] = f[i] + eps * Math.log(u[i]);
    value += 2 * a[i] * F[i];
  }
  value -= eps * (mass - 1);
  return { f: F, iterations, marginalError: err, converged: converged || err < o.tolerance, value, kernelBuilds: builds };
}
