import type { Points } from '../points';
import { epsSchedule, meanCost } from './eps-schedule';
import { buildKernelRecentred, maxSquarings, repairColumn, squareKernel } from './kernel';
import { fusedScalingPass, kernelTimes, kernelTransposeTimes } from './kernel-products';
import { AndersonMixer } from './anderson';
import { SolveControl } from './solve-control';

/** Two weighted point sets: masses exp(logA) on the rows of x, exp(logB) on the rows of y, each summing to 1. */
export interface TransportProblem {
  readonly x: Points;
  readonly y: Points;
  readonly logA: Float64Array;
  readonly logB: Float64Array;
}

export interface SinkhornOptions {
  /** The entropic regularisation (> 0), in units of the cost |x - y|^2 / 2. */
  readonly eps: number;
  /** Stop when the L1 marginal error falls below this (> 0). */
  readonly tolerance: number;
  /** The most iterations, over all eps stages (>= 1). */
  readonly maxIterations: number;
  /** First eps of the schedule (default: a quarter of the mean cost, see `meanCost`). */
  readonly startEps?: number;
  /** Shared cancellation, progress and iteration count. */
  readonly control?: SolveControl;
  /** Scratch for the kernel, length >= n m; reused across solves to spare memory. */
  readonly kernel?: Float64Array;
}

export interface SinkhornResult {
  /** Source potential f (length n) and target potential g (length m). */
  readonly f: Float64Array;
  readonly g: Float64Array;
  readonly eps: number;
  readonly iterations: number;
  /** L1 error of the returned plan's marginals (source plus target; the source part is 0 after a plain step). */
  readonly marginalError: number;
  readonly converged: boolean;
  /** The dual objective <f, a> + <g, b> - eps (mass - 1): the entropic cost OT_eps; the mass term is 0 for an exact marginal. */
  readonly value: number;
  /** How many times the kernel was built with Math.exp (the rest of the stages squared it). */
  readonly kernelBuilds: number;
  readonly stages: number;
}

/** Iterations allowed per intermediate eps stage, and the marginal error good enough to move on. */
const STAGE_ITERATIONS = 1;
const STAGE_TOLERANCE = 1e-2;
/**
 * Absorb the scalings into the potentials once one leaves [e^-LOG_TAU, e^LOG_TAU].
 * 200 keeps every entry that matters representable: a plan entry a_i u_i K_ij v_j b_j
 * above e^-40 needs K_ij above e^-440 with both scalings at the limit, far from
 * the smallest normal double (about e^-708). (It was 100; at 100 the scenarios
 * demo rebuilt its 5,000 x 5,000 kernel once more mid-solve, about 1 s.)
 */
const LOG_TAU = 200;
/**
 * Anderson acceleration of the last stage (see `AndersonMixer`): how many past
 * iterates it combines. Measured on heavy-tailed and skewed targets (Student t
 * with 3 degrees of freedom, log-normal, a shift of 5 sd; n = m = 4,000, d = 8):
 * the transport solve took 297-593 iterations with the over-relaxation it
 * replaced and 90-126 with Anderson (memory 6); memory 10 gained nothing more.
 */
const ANDERSON_MEMORY = 6;
/** An iterate whose marginal error is this many times the previous one discards the Anderson history (a safeguard). */
const ANDERSON_RESTART = 2;

/**
 * Entropic optimal transport between two weighted point sets for the cost
 * c(x, y) = |x - y|^2 / 2: finds potentials f, g such that the plan
 *   P_ij = a_i b_j exp((f_i + g_j - C_ij) / eps)
 * has row sums a and column sums b. Sinkhorn's iteration in the stabilised
 * kernel form with epsilon-scaling (Schmitzer 2019, "Stabilized sparse scaling
 * algorithms for entropy regularized transport problems", Algorithms 2 and 3):
 *  - the kernel K_ij = exp((f_i + g_j - C_ij) / eps) is stored once per stage and
 *    each iteration is one fused pass over it (row products give u = 1 / K(b v),
 *    the same rows, still in cache, accumulate K^T(a u)): no Math.exp;
 *  - eps halves from a quarter of the mean cost (see `meanCost`) to the target;
 *    moving to the next stage squares the kernel after absorbing the scalings, so
 *    Math.exp runs only on the first build, after `maxSquarings(tolerance)`
 *    squarings (never fewer than 12), and on absorption or repair;
 *  - scalings beyond e^200 are absorbed into f, g and the kernel rebuilt exactly;
 *    a row whose kernel underflowed is rebuilt in the log domain (log-sum-exp),
 *    and so is a column whose kernel sum fell outside [e^-200, e^200], so the
 *    solve never divides by zero;
 *  - at the final eps the log column scalings are Anderson-accelerated
 *    (`AndersonMixer`, memory 6): each plain step log v <- -log K^T(a u) is
 *    replaced by the mix of the last steps that best cancels their residuals;
 *    the history is dropped when the error more than doubles or the kernel is
 *    rebuilt (the over-relaxation used before took 3-5 times more iterations on
 *    heavy-tailed and skewed targets).
 * The loop stops when the L1 marginal error (source plus target marginal, of
 * which the source part is 0 for plain steps) is below `tolerance`, or the
 * iterations run out. The returned potentials are exactly the measured state.
 * Cost: O(n m) per iteration plus O(n m (d + 1)) per exact build; memory 8 n m bytes.
 * @param p the problem (masses positive, summing to 1; finite coordinates).
 * @param o eps > 0, tolerance > 0, maxIterations >= 1.
 * @throws RemapError (kind 'cancelled') through `o.control` when the fit is cancelled.
 * @example solveSinkhorn({ x, y, logA, logB }, { eps: 0.1, tolerance: 1e-9, maxIterations: 1000 }).converged // true
 */
export function solveSinkhorn(p: TransportProblem, o: SinkhornOptions): SinkhornResult {
  const { x, y, logA, logB } = p;
  const n = x.n;
  const m = y.n;
  const a = logA.map(Math.exp);
  const b = logB.map(Math.exp);
  const K = o.kernel && o.kernel.length >= n * m ? o.kernel : new Float64Array(n * m);
  const control = o.control ?? new SolveControl({}, o.maxIterations);
  const schedule = epsSchedule(o.eps, o.startEps ?? meanCost(x, logA, y, logB) / 4);
  const squaringCap = maxSquarings(o.tolerance);
  const stages = schedule.length;
  const st: SolverState = {
    x,
    y,
    logA,
    a,
    b,
    K,
    n,
    m,
    f: new Float64Array(n),
    g: new Float64Array(m),
    u: new Float64Array(n).fill(1),
    v: new Float64Array(m).fill(1),
    bv: Float64Array.from(b),
    t: new Float64Array(m),
    scratch: new Float64Array(n),
    eps: schedule[0],
    builds: 0,
    squarings: 0,
    squareWith: { u: new Float64Array(n), v: new Float64Array(m) },
    pendingSquare: false,
  };
  let uNew: Float64Array = new Float64Array(n);
  const stats = new Float64Array(2);
  /** Whether `err` and `mass` measure the current scalings. */
  let fresh = false;
  let err = Infinity;
  let mass = 1;

  rebuild(st);
  let iterations = 0;
  let converged = false;
  const stageCap = Math.min(STAGE_ITERATIONS, Math.floor(o.maxIterations / (2 * stages)));
  for (let s = 0; s < stages; s++) {
    const last = s === stages - 1;
    if (s > 0) {
      // Move to eps / 2: K <- (u K v)^2, done by the stage's first pass (or a rebuild once squarings have piled up).
      flushSquare(st);
      if (st.squarings >= squaringCap) {
        absorbScalings(st);
        st.eps = schedule[s];
        rebuild(st);
      } else {
        st.squareWith.u.set(st.u);
        st.squareWith.v.set(st.v);
        absorbScalings(st);
        st.eps = schedule[s];
        st.pendingSquare = true;
        st.squarings++;
      }
      fresh = false;
    }
    const tol = last ? o.tolerance : Math.max(o.tolerance, STAGE_TOLERANCE);
    const cap = last ? Math.max(0, o.maxIterations - iterations) : stageCap;
    const accel = last ? new AndersonMixer(m, ANDERSON_MEMORY) : null;
    const logV = new Float64Array(m);
    const plainLogV = new Float64Array(m);
    let prevErr = Infinity;
    for (let it = 0; it < cap; it++) {
      const ok = fusedScalingPass(st.K, n, m, a, st.bv, st.u, 1, uNew, st.t, stats, st.pendingSquare ? st.squareWith : null);
      st.pendingSquare = false;
      iterations++;
      if (!ok) {
        // A row underflowed: start again from the last good scalings, exactly, in plain steps.
        control.tick(err, 'Sinkhorn: kernel rebuilt after underflow');
        rebuild(st);
        fresh = false;
        accel?.reset();
        continue;
      }
      const t = st.t;
      const bv = st.bv;
      let colErr = 0;
      let colBad = false;
      for (let j = 0; j < m; j++) {
        colErr += Math.abs(bv[j] * t[j] - b[j]);
        if (!(t[j] > 0 && t[j] < Infinity)) colBad = true;
      }
      const swap = st.u;
      st.u = uNew;
      uNew = swap;
      err = stats[0] + colErr;
      mass = stats[1];
      fresh = true;
      control.tick(err);
      if (err < tol) {
        if (last) converged = true;
        break;
      }
      if (last && it === cap - 1) break;
      if (colBad || !Number.isFinite(err)) {
        rebuild(st);
        fresh = false;
        accel?.reset();
        continue;
      }
      if (accel) {
        // log v <- the Anderson mix of past plain updates -log t (the u update stays the plain one, inside the pass).
        const v = st.v;
        if (err > ANDERSON_RESTART * prevErr) accel.reset();
        prevErr = err;
        let big = false;
        for (let j = 0; j < m; j++) {
          logV[j] = Math.log(v[j]);
          plainLogV[j] = -Math.log(t[j]);
        }
        accel.step(logV, plainLogV, logV);
        // A mix that leaves the scalings' safe range falls back to the plain step (which the rebuild below can absorb).
        let wild = false;
        for (let j = 0; j < m && !wild; j++) if (!(Math.abs(logV[j]) <= LOG_TAU)) wild = true;
        if (wild) {
          accel.reset();
          logV.set(plainLogV);
        }
        for (let j = 0; j < m; j++) {
          const vj = Math.exp(logV[j]);
          v[j] = vj;
          bv[j] = b[j] * vj;
          if (!(Math.abs(logV[j]) <= LOG_TAU)) big = true;
        }
        fresh = false;
        const u = st.u;
        for (let i = 0; i < n && !big; i++) if (!(Math.abs(Math.log(u[i])) <= LOG_TAU)) big = true;
        if (big) {
          rebuild(st);
          accel.reset();
        }
        continue;
      }
      let big = false;
      const v = st.v;
      for (let j = 0; j < m; j++) {
        const vj = 1 / t[j];
        v[j] = vj;
        bv[j] = b[j] * vj;
        if (!(Math.abs(Math.log(vj)) <= LOG_TAU)) big = true;
      }
      fresh = false;
      const u = st.u;
      for (let i = 0; i < n && !big; i++) if (!(Math.abs(Math.log(u[i])) <= LOG_TAU)) big = true;
      if (big) rebuild(st);
    }
  }
  flushSquare(st);
  if (!fresh) {
    const r = measurePlan(st);
    err = r.err;
    mass = r.mass;
  }
  const F = new Float64Array(n);
  const G = new Float64Array(m);
  const eps = st.eps;
  let value = 0;
  for (let i = 0; i < n; i++) {
    F[i] = st.f[i] + eps * Math.log(st.u[i]);
    value += a[i] * F[i];
  }
  for (let j = 0; j < m; j++) {
    G[j] = st.g[j] + eps * Math.log(st.v[j]);
    value += b[j] * G[j];
  }
  // The dual objective's mass term vanishes for an exact marginal; keep it for the rest.
  value -= eps * (mass - 1);
  return { f: F, g: G, eps, iterations, marginalError: err, converged: converged || err < o.tolerance, value, kernelBuilds: st.builds, stages };
}

/** The solver's working arrays; kept in one object so the helpers below need no closures. */
interface SolverState {
  readonly x: Points;
  readonly y: Points;
  readonly logA: Float64Array;
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly K: Float64Array;
  readonly n: number;
  readonly m: number;
  readonly f: Float64Array;
  readonly g: Float64Array;
  u: Float64Array;
  readonly v: Float64Array;
  readonly bv: Float64Array;
  readonly t: Float64Array;
  readonly scratch: Float64Array;
  eps: number;
  builds: number;
  squarings: number;
  /** The scalings of the previous stage, to square K with (K <- (u K v)^2) when `pendingSquare`. */
  readonly squareWith: { readonly u: Float64Array; readonly v: Float64Array };
  pendingSquare: boolean;
}

/** Applies a pending stage move to K on its own (when no pass will do it). O(n m) if pending, else O(1). */
function flushSquare(st: SolverState): void {
  if (!st.pendingSquare) return;
  squareKernel(st.K, st.n, st.m, st.squareWith.u, st.squareWith.v);
  st.pendingSquare = false;
}

/** Folds the scalings into the potentials (f += eps log u, g += eps log v) and resets them to 1. O(n + m). */
function absorbScalings(st: SolverState): void {
  const { n, m, f, g, u, v, eps } = st;
  for (let i = 0; i < n; i++) f[i] += eps * Math.log(u[i]);
  for (let j = 0; j < m; j++) g[j] += eps * Math.log(v[j]);
  u.fill(1);
  v.fill(1);
  st.bv.set(st.b);
}

/**
 * Absorbs u, v into f, g and rebuilds the kernel exactly (an exact log-domain
 * f-update); columns whose kernel sum K^T a fell outside [e^-200, e^200] (an
 * outlier far from every source row) get their exact g-update too, so the next
 * step needs no scaling beyond e^200 (on the scenarios demo this spared a
 * second build). The column sums come from the build's last pass over each row.
 * O(n m (d + 1)).
 */
function rebuild(st: SolverState): void {
  const { x, y, logA, a, b, K, m, f, g, t, scratch, eps } = st;
  absorbScalings(st);
  buildKernelRecentred(x, y, b, f, g, eps, K, a, t);
  st.pendingSquare = false;
  st.builds++;
  st.squarings = 0;
  // Columns whose kernel (nearly) underflowed would need a scaling beyond e^LOG_TAU at once: set them exactly.
  const lo = Math.exp(-LOG_TAU);
  const hi = Math.exp(LOG_TAU);
  for (let j = 0; j < m; j++) if (!(t[j] >= lo && t[j] <= hi)) repairColumn(x, y, logA, f, g, eps, K, j, scratch);
}

/** Both marginal errors (L1, summed) and the total mass of the plan a_i u_i K_ij v_j b_j. O(n m). */
function measurePlan(st: SolverState): { err: number; mass: number } {
  const { K, n, m, a, b, u, v } = st;
  const s = new Float64Array(n);
  const bv = new Float64Array(m);
  for (let j = 0; j < m; j++) bv[j] = b[j] * v[j];
  kernelTimes(K, n, m, bv, s);
  const au = new Float64Array(n);
  let err = 0;
  let mass = 0;
  for (let i = 0; i < n; i++) {
    au[i] = a[i] * u[i];
    mass += au[i] * s[i];
    err += Math.abs(au[i] * s[i] - a[i]);
  }
  const col = new Float64Array(m);
  kernelTransposeTimes(K, n, m, au, col);
  for (let j = 0; j < m; j++) err += Math.abs(col[j] * bv[j] - b[j]);
  return { err, mass };
}
