import { fitRecordOf } from '../../../src/engine/gradient-net/fit-record';
import { randomParams } from './helpers';

describe('fitRecordOf', () => {
  test('cost is the mean squared displacement; warnings follow the stop reason', () => {
    const p = { ...randomParams(1, 2, 1, 1), c: Float64Array.of(0, 0), v: Float64Array.of(0), alpha: 1, beta: Float64Array.of(3) };
    // F(x) = x + 3 in standardised units, scale 1: every row moves by 3.
    const src = { n: 4, d: 1, data: Float64Array.of(0, 1, 2, 3), weights: null };
    const frame = { mean: Float64Array.of(0), scale: 1, lo: Float64Array.of(0), hi: Float64Array.of(3) };
    const result = { params: p, steps: 5, keptStep: 5, keptScore: 0.1, startScore: 0.2, finalLoss: 0.1, stopped: 'time-budget' as const, elapsedMs: 1, backend: 'cpu' as const, backendFallback: null };
    const rec = fitRecordOf(src, src, p, frame, frame, result, { steps: 10, timeBudget: 1, blur: 1 }, []);
    expect(rec.cost.w2Squared).toBeCloseTo(9, 12); // Source: |T(x) - x| = 3 for every row
    expect(rec.minJacobianEigenvalue).toBeCloseTo(1, 12);
    expect(rec.warnings.map((w) => w.code)).toEqual(['time-budget']);
    expect(rec.convergence?.converged).toBe(false);
    const done = fitRecordOf(src, src, p, frame, frame, { ...result, stopped: 'plateau' }, { steps: 10, timeBudget: 1, blur: 1 }, []);
    expect(done.warnings).toEqual([]);
    expect(done.convergence?.converged).toBe(true);
  });
});
