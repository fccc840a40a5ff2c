import { gaussianW2Squared } from '../../../src/engine/linear/bures';

describe('gaussianW2Squared(mean1, cov1, mean2, cov2) is the closed-form squared W2 between Gaussians', () => {
  test('equal means, S1 = I, S2 = diag(4, 9) gives 5', () => {
    // Source: Dowson & Landau 1982, commuting case: (1 - 2)^2 + (1 - 3)^2 = 5
    expect(
      gaussianW2Squared(
        [0, 0],
        [
          [1, 0],
          [0, 1],
        ],
        [0, 0],
        [
          [4, 0],
          [0, 9],
        ],
      ),
    ).toBeCloseTo(5, 14);
  });

  test('the mean part adds |m1 - m2|^2; flat row-major matrices are accepted', () => {
    // Source: Dowson & Landau 1982 (|(1,2) - 0|^2 = 5, plus 5)
    expect(gaussianW2Squared([1, 2], [1, 0, 0, 1], [0, 0], [4, 0, 0, 9])).toBeCloseTo(10, 14);
  });

  test('in one dimension it is (m1 - m2)^2 + (s1 - s2)^2', () => {
    // Source: common practice (1-D Gaussian W2: quantile functions m + s z)
    expect(gaussianW2Squared([1], [[4]], [3], [[25]])).toBeCloseTo(4 + 9, 14);
  });

  test('singular covariances are allowed: a point mass to N(m, S) costs |m|^2 + tr S', () => {
    // Source: definition (E|Y - x0|^2 = |m - x0|^2 + tr S)
    expect(
      gaussianW2Squared(
        [0, 0],
        [
          [0, 0],
          [0, 0],
        ],
        [1, 1],
        [
          [2, 1],
          [1, 3],
        ],
      ),
    ).toBeCloseTo(2 + 5, 13);
  });

  test('it is symmetric in its two Gaussians', () => {
    const a = gaussianW2Squared(
      [0, 1],
      [
        [2, 0.5],
        [0.5, 1],
      ],
      [1, 0],
      [
        [1, -0.3],
        [-0.3, 4],
      ],
    );
    const b = gaussianW2Squared(
      [1, 0],
      [
        [1, -0.3],
        [-0.3, 4],
      ],
      [0, 1],
      [
        [2, 0.5],
        [0.5, 1],
      ],
    );
    expect(a).toBeCloseTo(b, 13);
  });

  test('bad parameters throw RemapError naming the argument', () => {
    const I = [
      [1, 0],
      [0, 1],
    ];
    expect(() => gaussianW2Squared([], [], [], [])).toThrow(/mean1 is empty/);
    expect(() => gaussianW2Squared([0, 0], I, [0], I)).toThrow(/mean2 has 1/);
    expect(() => gaussianW2Squared([0, 0], [[1, 0]], [0, 0], I)).toThrow(/cov1 has 1 rows/);
    expect(() => gaussianW2Squared([0, 0], I, [0, 0], [1, 0, 0])).toThrow(/cov2 has 3 entries/);
    expect(() => gaussianW2Squared([0, NaN], I, [0, 0], I)).toThrow(/mean1 entry 2 is NaN/);
    expect(() =>
      gaussianW2Squared(
        [0, 0],
        [
          [1, 0.5],
          [0.4, 1],
        ],
        [0, 0],
        I,
      ),
    ).toThrow(/cov1 is not symmetric: entry \(1, 2\) is 0.5 but \(2, 1\) is 0.4/);
    expect(() =>
      gaussianW2Squared(
        [0, 0],
        I,
        [0, 0],
        [
          [1, 2],
          [2, 1],
        ],
      ),
    ).toThrow(/cov2 is not positive semidefinite/);
    expect(() =>
      gaussianW2Squared(
        [0, 0],
        I,
        [0, 0],
        [
          [1, Infinity],
          [0, 1],
        ],
      ),
    ).toThrow(/cov2 entry \(1, 2\) is Infinity/);
  });

  test('inputs are not mutated', () => {
    const c = Object.freeze([Object.freeze([2, 0.5]), Object.freeze([0.5, 1])]);
    const m = Object.freeze([1, 2]);
    gaussianW2Squared(m, c, m, c);
    expect(c).toEqual([
      [2, 0.5],
      [0.5, 1],
    ]);
  });
});
