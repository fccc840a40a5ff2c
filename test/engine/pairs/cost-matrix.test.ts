import { RemapError } from '../../../src/engine/errors';
import { squaredDistanceTable } from '../../../src/engine/pairs/cost-matrix';
import { column, points } from '../../../src/engine/points';

describe('squaredDistanceTable', () => {
  test('squaredDistanceTable(source, target)[i * target.n + j] is the squared Euclidean distance |x_i - y_j|^2', () => {
    const x = points([
      [0, 0],
      [1, 2],
    ]);
    const y = points([
      [3, 4],
      [1, 0],
      [1, 2],
    ]);
    // Source: computed by hand: (0,0)-(3,4): 9+16=25; (0,0)-(1,0): 1; (0,0)-(1,2): 5; (1,2)-(3,4): 4+4=8; (1,2)-(1,0): 4; (1,2)-(1,2): 0.
    expect(Array.from(squaredDistanceTable(x, y))).toEqual([25, 1, 5, 8, 4, 0]);
  });

  test('squaredDistanceTable in one column squares the differences', () => {
    // Source: computed by hand: (1-4)^2=9, (1-(-1))^2=4, (2.5-4)^2=2.25, (2.5+1)^2=12.25.
    expect(Array.from(squaredDistanceTable(column([1, 2.5]), column([4, -1])))).toEqual([9, 4, 2.25, 12.25]);
  });

  test('squaredDistanceTable keeps digits for points far from the origin (uses differences)', () => {
    const big = 1e9;
    const t = squaredDistanceTable(points([[big, big]]), points([[big + 1, big + 2]]));
    expect(t[0]).toBe(5); // Source: computed by hand, 1^2 + 2^2; |x|^2 + |y|^2 - 2<x,y> would lose it at 1e18 scale.
  });

  test('squaredDistanceTable does not mutate its inputs', () => {
    const x = points([
      [1, 2],
      [3, 4],
    ]);
    const y = points([
      [5, 6],
      [7, 8],
    ]);
    const bx = x.data.slice();
    const by = y.data.slice();
    squaredDistanceTable(x, y);
    expect(x.data).toEqual(bx);
    expect(y.data).toEqual(by);
  });

  test('squaredDistanceTable rejects samples with different column counts', () => {
    expect(() => squaredDistanceTable(points([[1, 2]]), column([1]))).toThrow(/source has 2 columns and the target 1/);
  });

  test('squaredDistanceTable throws kind cancelled when the signal is aborted', () => {
    try {
      squaredDistanceTable(column([1, 2]), column([3, 4]), { aborted: true });
      throw new Error('expected a throw');
    } catch (e) {
      expect(e).toBeInstanceOf(RemapError);
      expect((e as RemapError).kind).toBe('cancelled');
    }
  });
});
