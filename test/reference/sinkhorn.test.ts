/**
 * Outside checks of the entropic method against reference computations:
 * mathjs matrix algebra for plain Sinkhorn and for the Gaussian closed-form
 * Brenier map, and sorted-sample 1-D W2^2.
 */
import * as math from 'mathjs';
import { fitEntropic } from '../../src/engine/entropic/fit';
import { solveSinkhorn } from '../../src/engine/entropic/sinkhorn';
import type { Points, Sample } from '../../src/engine/points';

function normals(n: number, d: number, seed: number): number[][] {
  let s = seed >>> 0;
  const u = (): number => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  return Array.from({ length: n }, () => Array.from({ length: d }, () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u())));
}
const toSample = (rows: number[][]): Sample => ({ n: rows.length, d: rows[0].length, data: Float64Array.from(rows.flat()), weights: null });
const toPoints = (rows: number[][]): Points => ({ n: rows.length, d: rows[0].length, data: Float64Array.from(rows.flat()) });

function moments(rows: number[][]): { mean: number[]; cov: number[][] } {
  const n = rows.length;
  const d = rows[0].length;
  const mean = Array.from({ length: d }, (_, k) => rows.reduce((s, r) => s + r[k], 0) / n);
  const cov = Array.from({ length: d }, (_, p) => Array.from({ length: d }, (_, q) => rows.reduce((s, r) => s + (r[p] - mean[p]) * (r[q] - mean[q]), 0) / n));
  return { mean, cov };
}

describe('reference: entropic transport', () => {
  test('the potentials reproduce the plan of plain Sinkhorn written with mathjs matrices (diag(u) K diag(v)), to 1e-10', () => {
    const X = normals(7, 3, 1);
    const Y = normals(6, 3, 2).map((r) => r.map((v) => 0.8 * v + 0.5));
    const eps = 0.6;
    const C = X.map((x) => Y.map((y) => (math.norm(math.subtract(x, y)) as number) ** 2 / 2));
    const K = math.map(math.matrix(C), (c: number) => Math.exp(-c / eps));
    const a = math.matrix(new Array(7).fill(1 / 7));
    const b = math.matrix(new Array(6).fill(1 / 6));
    let u = math.matrix(new Array(7).fill(1));
    let v = math.matrix(new Array(6).fill(1));
    for (let it = 0; it < 3000; it++) {
      u = math.dotDivide(a, math.multiply(K, v)) as math.Matrix;
      v = math.dotDivide(b, math.multiply(math.transpose(K), u)) as math.Matrix;
    }
    // Source: Cuturi 2013, "Sinkhorn distances", Algorithm 1, computed with mathjs.
    const P = math.multiply(math.multiply(math.diag(u), K), math.diag(v)).toArray() as number[][];
    const logA = new Float64Array(7).fill(-Math.log(7));
    const logB = new Float64Array(6).fill(-Math.log(6));
    const r = solveSinkhorn({ x: toPoints(X), y: toPoints(Y), logA, logB }, { eps, tolerance: 1e-14, maxIterations: 5000 });
    for (let i = 0; i < 7; i++) {
      for (let j = 0; j < 6; j++) {
        const p = Math.exp(logA[i] + logB[j] + (r.f[i] + r.g[j] - C[i][j]) / eps);
        expect(Math.abs(p - P[i][j])).toBeLessThan(1e-10);
      }
    }
  });

  test('for Gaussian samples the entropic map is close to the closed-form linear Brenier map', () => {
    const d = 2;
    const L1 = [
      [1, 0],
      [0.6, 0.8],
    ];
    const L2 = [
      [1.5, 0],
      [-0.5, 0.7],
    ];
    const X = normals(600, d, 3).map((z) => math.multiply(L1, z) as number[]);
    const Y = normals(600, d, 4).map((z) => math.add(math.multiply(L2, z) as number[], [2, -1]) as number[]);
    const m1 = moments(X);
    const m2 = moments(Y);
    // Source: closed-form OT map between Gaussians, A = S1^-1/2 (S1^1/2 S2 S1^1/2)^1/2 S1^-1/2 (e.g. Peyre & Cuturi,
    // "Computational Optimal Transport", Remark 2.31), with mathjs sqrtm on the sample covariances.
    const r1 = math.sqrtm(m1.cov) as number[][];
    const r1inv = math.inv(r1) as number[][];
    const A = math.multiply(math.multiply(r1inv, math.sqrtm(math.multiply(math.multiply(r1, m2.cov), r1)) as number[][]), r1inv) as number[][];
    const map = fitEntropic(toSample(X), toSample(Y), {});
    const probe = normals(200, d, 5)
      .map((z) => math.multiply(L1, z) as number[])
      .filter((x) => (math.norm(x) as number) < 1.5);
    const T = map.apply(toPoints(probe)).data;
    let se = 0;
    probe.forEach((x, i) => {
      const lin = math.add(m2.mean, math.multiply(A, math.subtract(x, m1.mean))) as number[];
      se += (T[2 * i] - lin[0]) ** 2 + (T[2 * i + 1] - lin[1]) ** 2;
    });
    const relative = se / probe.length / (m2.cov[0][0] + m2.cov[1][1]);
    expect(relative).toBeLessThan(0.03);
  });

  test('with a small eps, 2 x the Sinkhorn divergence is within 1% of the exact 1-D W2^2 of sorted samples', () => {
    const X = normals(60, 1, 6);
    const Y = normals(60, 1, 7).map((r) => [2 * r[0] + 1]);
    const sx = X.map((r) => r[0]).sort((p, q) => p - q);
    const sy = Y.map((r) => r[0]).sort((p, q) => p - q);
    // Source: fact of the trade, exact 1-D W2^2 of equal-size samples = mean squared difference of sorted values.
    const w2sq = sx.reduce((s, v, i) => s + (v - sy[i]) ** 2, 0) / 60;
    const map = fitEntropic(toSample(X), toSample(Y), { smoothing: 0.02, tolerance: 1e-8, max_iterations: 20000, units: 'raw' });
    expect(Math.abs(map.cost().w2Squared - w2sq) / w2sq).toBeLessThan(0.01);
  });
});
