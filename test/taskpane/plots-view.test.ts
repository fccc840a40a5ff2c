import { sample } from '../../src/engine/points';
import { thin } from '../../src/fits/worker/cells-job';
import { PLOT_MAX_ROWS } from '../../src/fits/worker/messages';
import { chartTable, distributionSvg, qqSvg, scatterSvg, type PlotData } from '../../src/taskpane/plots-view';

const s = (rows: number[][]) => ({ n: rows.length, d: rows[0].length, data: Float64Array.from(rows.flat()), weights: null });
const data: PlotData = Object.freeze({
  source: s([
    [1, 10],
    [2, 20],
    [3, 30],
    [4, 40],
  ]),
  mapped: s([
    [11, 1],
    [12, 2],
    [13, 3],
    [14, 4],
  ]),
  target: s([
    [11, 1],
    [12, 2],
    [13, 3],
    [14, 4],
    [15, 5],
  ]),
  columns: ['a', 'b'],
});

describe('the pane plots', () => {
  test('the distribution plot draws three series; the QQ plot two series of points; the scatter three clouds', () => {
    expect(distributionSvg(data, 0, 'ecdf', 300).match(/class="series"/g)).toHaveLength(3);
    expect(distributionSvg(data, 1, 'histogram', 300).match(/class="series"/g)).toHaveLength(3);
    expect((qqSvg(data, 0, 300).match(/class="pt"/g) ?? []).length).toBeGreaterThan(0);
    expect(scatterSvg(data, 0, 1, 300).match(/class="pt"/g)).toHaveLength(13);
  });

  test('the chart table holds the three quantile functions at shares 0, 0.01, ..., 1', () => {
    const t = chartTable(data, 0);
    expect(t.header).toEqual(['share', 'source', 'mapped source', 'target']);
    expect(t.rows).toHaveLength(101);
    // Source: inverse empirical CDF (R type 1): share 0.5 of {1,2,3,4} is 2; of {11..15} is 13
    expect(t.rows[50]).toEqual([0.5, 2, 12, 13]);
    expect(t.rows[100]).toEqual([1, 4, 14, 15]);
  });

  test('thin keeps every k-th row so that at most PLOT_MAX_ROWS remain, weights alongside', () => {
    const n = 2 * PLOT_MAX_ROWS + 1;
    const big = sample(
      Array.from({ length: n }, (_, i) => [i, -i]),
      Array.from({ length: n }, (_, i) => i + 1),
    );
    const t = thin(big);
    expect(t.n).toBeLessThanOrEqual(PLOT_MAX_ROWS);
    expect(Array.from(t.data.subarray(0, 4))).toEqual([0, -0, 3, -3]);
    expect(t.weights?.[1]).toBe(4);
  });
});
