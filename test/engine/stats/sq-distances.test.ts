import { RemapError } from '../../../src/engine/errors';
import { points } from '../../../src/engine/points';
import { rowSquaredNorms, squaredDistances, squaredDistancesRow } from '../../../src/engine/stats/sq-distances';

describe('sq-distances', () => {
  test('rowSquaredNorms(p) is the sum of squared coordinates of each row', () => {
    // Source: common practice, 3^2 + 4^2 = 25.
    expect(
      Array.from(
        rowSquaredNorms(
          points([
            [3, 4],
            [1, 0],
            [0, 0],
          ]),
        ),
      ),
    ).toEqual([25, 1, 0]);
  });

  test('squaredDistances(x, y) is the n x m matrix |x_i - y_j|^2, row-major', () => {
    // Source: common practice, hand computed.
    expect(Array.from(squaredDistances(points([[0], [1]]), points([[0], [2], [3]])))).toEqual([0, 4, 9, 1, 1, 4]);
    expect(
      Array.from(
        squaredDistances(
          points([[0, 0]]),
          points([
            [3, 4],
            [1, 1],
          ]),
          0.5,
        ),
      ),
    ).toEqual([12.5, 1]);
  });

  test('squaredDistancesRow writes one row at an offset and leaves the rest alone', () => {
    const out = new Float64Array(5).fill(-1);
    squaredDistancesRow(
      points([
        [1, 1],
        [2, 2],
      ]),
      1,
      points([
        [0, 0],
        [2, 3],
      ]),
      out,
      2,
    );
    // Source: common practice, |(2,2)-(0,0)|^2 = 8, |(2,2)-(2,3)|^2 = 1.
    expect(Array.from(out)).toEqual([-1, -1, 8, 1, -1]);
  });

  test('the direct difference form keeps full precision far from the origin', () => {
    // Source: common practice; |x|^2 + |y|^2 - 2xy would lose every digit here.
    const x = points([[1e8 + 0.5, 1e8]]);
    const y = points([[1e8, 1e8 - 0.25]]);
    expect(squaredDistances(x, y)[0]).toBe(0.25 + 0.0625);
  });

  test('inputs are not mutated', () => {
    const x = points([
      [1, 2],
      [3, 4],
    ]);
    const y = points([[5, 6]]);
    const bx = Float64Array.from(x.data);
    const by = Float64Array.from(y.data);
    squaredDistances(x, y);
    rowSquaredNorms(x);
    expect(x.data).toEqual(bx);
    expect(y.data).toEqual(by);
  });

  test('mismatched columns, bad rows and short outputs throw RemapError naming the function', () => {
    expect(() => squaredDistances(points([[1, 2]]), points([[1]]))).toThrow(RemapError);
    expect(() => squaredDistances(points([[1, 2]]), points([[1]]))).toThrow(/squaredDistances: x has 2 columns but y has 1/);
    expect(() => squaredDistancesRow(points([[1]]), 3, points([[1]]), new Float64Array(1))).toThrow(/row index 3/);
    expect(() => squaredDistancesRow(points([[1]]), 0, points([[1], [2]]), new Float64Array(1))).toThrow(/out holds 1/);
  });
});
