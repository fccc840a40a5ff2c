import { histogramPlot } from '../../src/plots/histogram-plot';
import { plotBox, pathPoints, seriesPaths } from './plot-box';
import { xmlProblem } from './well-formed';

describe('histogramPlot', () => {
  test.each([300, 640])('at %i px the SVG is well formed with one outline per series and one step per bin', (width) => {
    // Source: the function's contract
    const svg = histogramPlot(
      [
        { name: 'North', values: [1, 2, 2, 3, 9] },
        { name: 'South', values: [4, 5, 6] },
      ],
      { width, bins: 4 },
    );
    expect(xmlProblem(svg)).toBeNull();
    const paths = seriesPaths(svg);
    expect(paths).toHaveLength(2);
    // M, then V+H per bin (2 vertices each), then the closing V
    expect(pathPoints(paths[0])).toHaveLength(1 + 2 * 4 + 1);
  });
  test("bar heights are each series' percentage per bin, inside the plot area", () => {
    // Source: worked example: [0, 0, 0, 10] in 2 bins over [0, 10] -> 75 % and 25 %
    const svg = histogramPlot([{ name: 'h', values: Object.freeze([0, 0, 0, 10]) }], { bins: 2, range: [0, 10] });
    const box = plotBox(svg);
    const pts = pathPoints(seriesPaths(svg)[0]);
    for (const [x, y] of pts) {
      expect(x).toBeGreaterThanOrEqual(box.left - 0.01);
      expect(x).toBeLessThanOrEqual(box.right + 0.01);
      expect(y).toBeGreaterThanOrEqual(box.top - 0.01);
      expect(y).toBeLessThanOrEqual(box.bottom + 0.01);
    }
    const heights = [pts[1][1], pts[3][1]].map((y) => box.bottom - y);
    expect(heights[0] / heights[1]).toBeCloseTo(3, 2);
  });
  test('weights count: weight 3 against weight 1 gives bars 3 : 1', () => {
    // Source: definition of a weighted histogram
    const svg = histogramPlot([{ name: 'w', values: [1, 9], weights: [3, 1] }], { bins: 2, range: [0, 10] });
    const box = plotBox(svg);
    const pts = pathPoints(seriesPaths(svg)[0]);
    expect((box.bottom - pts[1][1]) / (box.bottom - pts[3][1])).toBeCloseTo(3, 2);
  });
  test('escapes names and survives an empty series', () => {
    // Source: XML 1.0 section 2.4
    const svg = histogramPlot([
      { name: 'a&b', values: [] },
      { name: 'c', values: [1] },
    ]);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('a&amp;b');
  });
});
