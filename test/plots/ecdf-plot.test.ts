import { ecdfPlot } from '../../src/plots/ecdf-plot';
import { plotBox, pathPoints, seriesPaths } from './plot-box';
import { xmlProblem } from './well-formed';

const a = Object.freeze(Array.from({ length: 500 }, (_, i) => Math.sin(i) * 100 + i));
const b = Object.freeze([5, 1, 3, NaN, 2]);

describe('ecdfPlot', () => {
  test.each([300, 640])('at %i px the SVG is well formed with one step path per series', (width) => {
    // Source: the function's contract (one <path class="series"> per series)
    const svg = ecdfPlot(
      [
        { name: 'a', values: a },
        { name: 'b', values: b },
        { name: 'empty', values: [] },
      ],
      { width, title: 'T', xLabel: 'x' },
    );
    expect(xmlProblem(svg)).toBeNull();
    expect(seriesPaths(svg)).toHaveLength(3);
    expect(svg).toContain(`width="${width}"`);
  });
  test('every vertex lies inside the plot area, and each curve runs from 0 (bottom) to 1 (top)', () => {
    // Source: definition of an empirical CDF
    const svg = ecdfPlot([
      { name: 'a', values: a },
      { name: 'b', values: b },
    ]);
    const box = plotBox(svg);
    for (const d of seriesPaths(svg)) {
      const pts = pathPoints(d);
      for (const [x, y] of pts) {
        expect(x).toBeGreaterThanOrEqual(box.left - 0.01);
        expect(x).toBeLessThanOrEqual(box.right + 0.01);
        expect(y).toBeGreaterThanOrEqual(box.top - 0.01);
        expect(y).toBeLessThanOrEqual(box.bottom + 0.01);
      }
      expect(pts[0][1]).toBeCloseTo(box.bottom, 1);
      expect(pts[pts.length - 1][1]).toBeCloseTo(box.top, 1);
    }
  });
  test('weights set the step heights: a value with weight 3 of 4 makes a step of three quarters', () => {
    // Source: definition of the weighted empirical CDF
    const svg = ecdfPlot([{ name: 'w', values: [0, 10], weights: [3, 1] }], { width: 640 });
    const box = plotBox(svg);
    const ys = [...new Set(pathPoints(seriesPaths(svg)[0]).map((p) => p[1]))].sort((x, y) => y - x);
    // levels: 0 (bottom), 0.75, 1 (top)
    expect(ys).toHaveLength(3);
    expect((box.bottom - ys[1]) / (box.bottom - box.top)).toBeCloseTo(0.75, 2);
  });
  test('series names and titles are escaped for XML', () => {
    // Source: XML 1.0 section 2.4
    const svg = ecdfPlot([{ name: '<A & B>', values: [1, 2] }], { title: 'x < y & "z"' });
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('&lt;A &amp; B&gt;');
    expect(svg).not.toContain('<A & B>');
    expect(svg).toContain('x &lt; y &amp; &quot;z&quot;');
  });
  test('large samples give a path no longer than about two vertices per pixel', () => {
    // Source: the function's contract (steps closer than one pixel merge)
    const big = Float64Array.from({ length: 100000 }, (_, i) => (i * 7919) % 100003);
    const svg = ecdfPlot([{ name: 'big', values: big }], { width: 300 });
    expect(pathPoints(seriesPaths(svg)[0]).length).toBeLessThan(2 * 300 + 10);
  });
});
