import { choleskySolve } from '../../../src/engine/gradient-net/cholesky-solve';

describe('choleskySolve', () => {
  test('solves a symmetric positive definite system', () => {
    const a = Float64Array.of(4, 2, 2, 3);
    const x = new Float64Array(2);
    expect(choleskySolve(a, Float64Array.of(8, 7), x, new Float64Array(4), 2)).toBe(true);
    expect(x[0]).toBeCloseTo(1.25, 14); // Source: worked example, 4x + 2y = 8, 2x + 3y = 7
    expect(x[1]).toBeCloseTo(1.5, 14);
  });

  test('reports false for a matrix that is not positive definite', () => {
    expect(choleskySolve(Float64Array.of(1, 2, 2, 1), Float64Array.of(1, 1), new Float64Array(2), new Float64Array(4), 2)).toBe(false);
  });
});
