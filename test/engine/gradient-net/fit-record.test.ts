import { fitRecordOf, type FitStory } from '../../../src/engine/gradient-net/fit-record';
import type { TrainResult } from '../../../src/engine/gradient-net/train';
import { randomParams } from './helpers';

describe('fitRecordOf', () => {
  // F(x) = x + 3 in standardised units, scale 1: every row moves by 3.
  const p = { ...randomParams(1, 2, 1, 1), c: Float64Array.of(0, 0), v: Float64Array.of(0), alpha: 1, beta: Float64Array.of(3) };
  const src = { n: 4, d: 1, data: Float64Array.of(0, 1, 2, 3), weights: null };
  const tgt = { n: 4, d: 1, data: Float64Array.of(3, 4, 5, 6), weights: null };
  const frame = { mean: Float64Array.of(0), scale: Float64Array.of(1), lo: Float64Array.of(0), hi: Float64Array.of(3) };
  const result: TrainResult = {
    params: p,
    steps: 50,
    keptStep: 30,
    keptScore: 0.1,
    startScore: 0.2,
    keptLoss: 0.05,
    finalLoss: 0.04,
    stopped: 'time-budget',
    elapsedMs: 1,
    backend: 'cpu',
    backendFallback: null,
  };
  const story = (r: TrainResult): FitStory => ({
    steps: 100,
    timeBudget: 1,
    start: 'gaussian',
    teacher: null,
    phases: [{ name: 'phase', objective: 'loss', result: r, stepOffset: 0 }],
    startScore: 0.2,
    judge: 'held-out energy distance',
  });

  test('cost is the mean squared displacement, with the Gaussian bound beside it; warnings follow the stop reason', () => {
    const rec = fitRecordOf(src, tgt, p, frame, frame, story(result), []);
    expect(rec.cost.w2Squared).toBeCloseTo(9, 12); // Source: |T(x) - x| = 3 for every row
    expect(rec.cost.note).toMatch(/lower bound from means and covariances \(Gelbrich\) is 9/); // Source: worked by hand, means 1.5 and 4.5, equal variances
    expect(rec.minJacobianEigenvalue).toBeCloseTo(1, 12);
    expect(rec.warnings.map((w) => w.code)).toEqual(['time-budget']);
    expect(rec.convergence?.converged).toBe(false);
  });

  test('the convergence record describes the returned checkpoint, not the last weights', () => {
    const rec = fitRecordOf(src, tgt, p, frame, frame, story({ ...result, stopped: 'no-gain' }), []);
    expect(rec.warnings).toEqual([]);
    expect(rec.convergence).toMatchObject({ iterations: 30, finalError: 0.1, converged: true });
    expect(rec.convergence?.criterion).toMatch(/weights of step 30/);
  });

  test('a run in which nothing beat the Gaussian start says so, and is not converged', () => {
    const rec = fitRecordOf(src, tgt, p, frame, frame, story({ ...result, keptStep: 0, stopped: 'no-gain' }), []);
    expect(rec.warnings.map((w) => w.code)).toEqual(['kept-linear-start']);
    expect(rec.warnings[0].message).toMatch(/linear \(Gaussian\) map/);
    expect(rec.convergence).toMatchObject({ iterations: 0, finalError: 0.2, converged: false });
  });

  test('a displacement below the Gaussian lower bound is explained', () => {
    // T(x) = x: no move at all, while the target sits 3 away.
    const still = { ...p, beta: Float64Array.of(0) };
    const rec = fitRecordOf(src, tgt, still, frame, frame, story(result), []);
    expect(rec.cost.w2Squared).toBe(0);
    expect(rec.cost.note).toMatch(/has not carried the source all the way to the target/);
  });
});
