import { logitRows2 } from '../../../src/engine/entropic/cost-rows';
import { points } from '../../../src/engine/points';
import { squaredDistancesRow } from '../../../src/engine/stats/sq-distances';

describe('cost-rows', () => {
  const x = Object.freeze(
    points([
      [0, 0, 1],
      [1, -2, 0.5],
      [3, 1, -1],
    ]),
  );
  const y = Object.freeze(
    points([
      [1, 1, 1],
      [2, 0, -1],
      [-1, 4, 0],
      [0.5, 0.25, 2],
    ]),
  );
  const g = Float64Array.of(0.3, -0.1, 0, 0.7);
  const inv = 1 / 0.45;

  test('logitRows2 writes (g_j - |x_i - y_j|^2 / 2) / eps for two rows, bit-identical to the distances computed first, and the row maxima', () => {
    const xCopy = Float64Array.from(x.data);
    const out = new Float64Array(8);
    const max = new Float64Array(2);
    logitRows2(x.data, 0, 2, y.data, 3, 0, 4, g, inv, out, 0, 4, max);
    const c = new Float64Array(4);
    for (const [r, i] of [
      [0, 0],
      [1, 2],
    ]) {
      squaredDistancesRow(x, i, y, c, 0, 0.5);
      // Source: squaredDistancesRow (src/engine/stats/sq-distances.ts), the same arithmetic in the same order.
      const want = Array.from(c, (cj, j) => (g[j] - cj) * inv);
      expect(Array.from(out.subarray(4 * r, 4 * r + 4))).toEqual(want);
      expect(max[r]).toBe(Math.max(...want));
    }
    expect(Array.from(x.data)).toEqual(Array.from(xCopy));
  });

  test('logitRows2 with from > 0 writes only columns from..m-1, at the start of each output row', () => {
    const out = new Float64Array(6).fill(9);
    const max = new Float64Array(2);
    logitRows2(x.data, 1, 1, y.data, 3, 2, 4, g, inv, out, 0, 3, max);
    const c = new Float64Array(4);
    squaredDistancesRow(x, 1, y, c, 0, 0.5);
    // Source: squaredDistancesRow; row 1 written to both halves, the third cell of each untouched.
    const want = [(g[2] - c[2]) * inv, (g[3] - c[3]) * inv];
    expect(Array.from(out)).toEqual([...want, 9, ...want, 9]);
    expect(max[0]).toBe(Math.max(...want));
  });
});
