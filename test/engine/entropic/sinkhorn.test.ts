import { epsSchedule, halfSquaredDiameter, meanCost } from '../../../src/engine/entropic/eps-schedule';
import { solveSinkhorn } from '../../../src/engine/entropic/sinkhorn';
import { SolveControl } from '../../../src/engine/entropic/solve-control';
import { RemapError } from '../../../src/engine/errors';
import type { Points } from '../../../src/engine/points';

function gaussian(n: number, d: number, seed: number, scale = 1, shift = 0): Points {
  let s = seed >>> 0;
  const u = (): number => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) data[i] = shift + scale * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return { n, d, data };
}

function plan(x: Points, y: Points, logA: Float64Array, logB: Float64Array, f: Float64Array, g: Float64Array, eps: number): number[][] {
  const d = x.d;
  return Array.from({ length: x.n }, (_, i) =>
    Array.from({ length: y.n }, (_, j) => {
      let c = 0;
      for (let k = 0; k < d; k++) c += (x.data[i * d + k] - y.data[j * d + k]) ** 2;
      return Math.exp(logA[i] + logB[j] + (f[i] + g[j] - c / 2) / eps);
    }),
  );
}

/** Plain scaling-form Sinkhorn: K = exp(-C / eps), u = a / (K v), v = b / (K^T u); plan diag(u) K diag(v). */
function naivePlan(x: Points, y: Points, a: number[], b: number[], eps: number, iterations: number): number[][] {
  const d = x.d;
  const K = Array.from({ length: x.n }, (_, i) =>
    Array.from({ length: y.n }, (_, j) => {
      let c = 0;
      for (let k = 0; k < d; k++) c += (x.data[i * d + k] - y.data[j * d + k]) ** 2;
      return Math.exp(-c / 2 / eps);
    }),
  );
  let u = a.map(() => 1);
  let v = b.map(() => 1);
  for (let it = 0; it < iterations; it++) {
    u = a.map((ai, i) => ai / K[i].reduce((s, kij, j) => s + kij * v[j], 0));
    v = b.map((bj, j) => bj / K.reduce((s, row, i) => s + row[j] * u[i], 0));
  }
  return K.map((row, i) => row.map((kij, j) => u[i] * kij * v[j]));
}

describe('sinkhorn', () => {
  test('on a tiny weighted problem the plan matches plain scaling-form Sinkhorn to 1e-10', () => {
    const x = gaussian(6, 2, 1);
    const y = gaussian(5, 2, 2, 1.3, 0.4);
    const a = [1, 2, 3, 1, 2, 1].map((w) => w / 10);
    const b = [3, 1, 1, 2, 3].map((w) => w / 10);
    const logA = Float64Array.from(a.map(Math.log));
    const logB = Float64Array.from(b.map(Math.log));
    const eps = 0.5;
    const r = solveSinkhorn({ x, y, logA, logB }, { eps, tolerance: 1e-14, maxIterations: 5000 });
    expect(r.converged).toBe(true);
    const got = plan(x, y, logA, logB, r.f, r.g, eps);
    // Source: Sinkhorn's scaling iteration (Cuturi 2013, "Sinkhorn distances", Algorithm 1), run to its fixed point.
    const want = naivePlan(x, y, a, b, eps, 5000);
    for (let i = 0; i < x.n; i++) for (let j = 0; j < y.n; j++) expect(Math.abs(got[i][j] - want[i][j])).toBeLessThan(1e-10);
  });

  test('after convergence both marginals of the plan are within the tolerance (L1)', () => {
    const x = gaussian(80, 3, 3);
    const y = gaussian(60, 3, 4, 2, 1);
    const logA = new Float64Array(80).fill(-Math.log(80));
    const logB = new Float64Array(60).fill(-Math.log(60));
    const eps = 0.05;
    const r = solveSinkhorn({ x, y, logA, logB }, { eps, tolerance: 1e-8, maxIterations: 5000 });
    expect(r.converged).toBe(true);
    expect(r.marginalError).toBeLessThan(1e-8);
    const P = plan(x, y, logA, logB, r.f, r.g, eps);
    let err = 0;
    for (let i = 0; i < 80; i++) err += Math.abs(P[i].reduce((s, p) => s + p, 0) - 1 / 80);
    for (let j = 0; j < 60; j++) err += Math.abs(P.reduce((s, row) => s + row[j], 0) - 1 / 60);
    // Source: definition of the stopping rule (L1 marginal error below tolerance).
    expect(err).toBeLessThan(1e-8);
    expect(Math.abs(err - r.marginalError)).toBeLessThan(1e-12);
  });

  test('value is the dual objective <f, a> + <g, b>', () => {
    const x = gaussian(10, 1, 5);
    const y = gaussian(12, 1, 6);
    const logA = new Float64Array(10).fill(-Math.log(10));
    const logB = new Float64Array(12).fill(-Math.log(12));
    const r = solveSinkhorn({ x, y, logA, logB }, { eps: 0.1, tolerance: 1e-13, maxIterations: 5000 });
    const dual = r.f.reduce((s, v) => s + v / 10, 0) + r.g.reduce((s, v) => s + v / 12, 0);
    // Source: Feydy et al. 2019, "Interpolating between optimal transport and MMD using Sinkhorn divergences", eq. (11).
    expect(Math.abs(r.value - dual)).toBeLessThan(1e-12);
  });

  test('far-apart samples whose plain kernel exp(-C / eps) underflows to 0 everywhere still converge (stabilised kernel)', () => {
    const x = gaussian(30, 2, 7);
    const y = gaussian(30, 2, 8, 1, 40);
    const logA = new Float64Array(30).fill(-Math.log(30));
    // C is about 1,600 between the clouds, so exp(-C / 0.05) = 0 in double precision.
    const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps: 0.05, tolerance: 1e-8, maxIterations: 5000 });
    expect(r.f.every(Number.isFinite)).toBe(true);
    expect(r.g.every(Number.isFinite)).toBe(true);
    expect(r.converged).toBe(true);
    expect(r.marginalError).toBeLessThan(1e-8);
  });

  test('an eps far too small for the iteration budget gives finite potentials and converged = false', () => {
    const x = gaussian(30, 2, 7, 10);
    const y = gaussian(30, 2, 8, 10, 40);
    const logA = new Float64Array(30).fill(-Math.log(30));
    const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps: 1e-3, tolerance: 1e-6, maxIterations: 300 });
    expect(r.f.every(Number.isFinite)).toBe(true);
    expect(r.g.every(Number.isFinite)).toBe(true);
    expect(r.converged).toBe(false);
    expect(r.iterations).toBeLessThanOrEqual(300);
  });

  test('a bounded iteration count stops early and reports not converged with the measured error', () => {
    const x = gaussian(40, 2, 9);
    const y = gaussian(40, 2, 10, 3);
    const logA = new Float64Array(40).fill(-Math.log(40));
    const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps: 1e-3, tolerance: 1e-12, maxIterations: 3 });
    expect(r.iterations).toBeLessThanOrEqual(3);
    expect(r.converged).toBe(false);
    expect(r.marginalError).toBeGreaterThan(1e-12);
    const P = plan(x, y, logA, logA, r.f, r.g, 1e-3);
    let err = 0;
    for (let i = 0; i < 40; i++) err += Math.abs(P[i].reduce((s, p) => s + p, 0) - 1 / 40);
    for (let j = 0; j < 40; j++) err += Math.abs(P.reduce((s, row) => s + row[j], 0) - 1 / 40);
    expect(Math.abs(err - r.marginalError)).toBeLessThan(1e-9 + 1e-6 * err);
  });

  test('the same inputs give bit-identical potentials, and inputs are not mutated', () => {
    const x = gaussian(20, 2, 11);
    const y = gaussian(25, 2, 12);
    const logA = new Float64Array(20).fill(-Math.log(20));
    const logB = new Float64Array(25).fill(-Math.log(25));
    const copies = [x.data, y.data, logA, logB].map((z) => Float64Array.from(z));
    const r1 = solveSinkhorn({ x, y, logA, logB }, { eps: 0.1, tolerance: 1e-9, maxIterations: 500 });
    const r2 = solveSinkhorn({ x, y, logA, logB }, { eps: 0.1, tolerance: 1e-9, maxIterations: 500 });
    expect(Array.from(r1.g)).toEqual(Array.from(r2.g));
    expect([x.data, y.data, logA, logB]).toEqual(copies);
  });

  test('a cancelled control throws RemapError of kind cancelled', () => {
    const x = gaussian(20, 2, 13);
    const logA = new Float64Array(20).fill(-Math.log(20));
    const control = new SolveControl({ signal: { aborted: true } }, 100);
    let caught: unknown;
    try {
      solveSinkhorn({ x, y: x, logA, logB: logA }, { eps: 0.1, tolerance: 1e-9, maxIterations: 100, control });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(RemapError);
    expect((caught as RemapError).kind).toBe('cancelled');
  });

  test('a far outlier whose kernel column nearly underflows (sum e^-450) is set exactly at the build, with no second build', () => {
    const x = gaussian(40, 2, 21);
    const y = gaussian(40, 2, 22);
    y.data[0] = 30; // C to the source cloud is about 450, so at eps = 1 its column sums to about e^-450
    const logA = new Float64Array(40).fill(-Math.log(40));
    const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps: 1, startEps: 1, tolerance: 1e-9, maxIterations: 2000 });
    // Source: the build's column repair (an exact log-domain g-update) keeps the scaling of that column near 1.
    expect(r.kernelBuilds).toBe(1);
    expect(r.converged).toBe(true);
    const P = plan(x, y, logA, logA, r.f, r.g, 1);
    // Source: definition of the transport plan's column marginal.
    expect(Math.abs(P.reduce((s, row) => s + row[0], 0) - 1 / 40)).toBeLessThan(1e-9);
  });

  test('by default the eps schedule starts at a quarter of the mean cost, fewer stages than from the squared diameter', () => {
    const x = gaussian(60, 2, 23);
    const y = gaussian(60, 2, 24, 1.5, 1);
    const logA = new Float64Array(60).fill(-Math.log(60));
    const r = solveSinkhorn({ x, y, logA, logB: logA }, { eps: 0.03, tolerance: 1e-8, maxIterations: 5000 });
    // Source: the documented default start (eps-schedule.ts, meanCost / 4).
    expect(r.stages).toBe(epsSchedule(0.03, meanCost(x, logA, y, logA) / 4).length);
    expect(r.stages).toBeLessThan(epsSchedule(0.03, halfSquaredDiameter(x, y)).length);
    expect(r.converged).toBe(true);
  });
});
