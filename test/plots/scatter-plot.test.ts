import { scatterPlot } from '../../src/plots/scatter-plot';
import { plotBox } from './plot-box';
import { attrValues, count, xmlProblem } from './well-formed';

describe('scatterPlot', () => {
  test.each([300, 640])('at %i px the SVG is well formed with one circle per finite point', (width) => {
    // Source: the function's contract
    const x = Object.freeze([0, 1, 2, NaN, 4]);
    const y = Object.freeze([1, 0, 3, 2, Infinity]);
    const svg = scatterPlot(
      [
        { name: 'a', x, y },
        { name: 'b', x: [5, 6], y: [-1, -2] },
      ],
      { width },
    );
    expect(xmlProblem(svg)).toBeNull();
    expect(count(svg, 'class="pt"')).toBe(3 + 2);
  });
  test('every point lies inside the plot area (the axes cover the data)', () => {
    // Source: the function's contract
    const xs = Array.from({ length: 300 }, (_, i) => Math.cos(i) * 1e5);
    const ys = Array.from({ length: 300 }, (_, i) => Math.sin(i * 1.3) * 0.01 - 4);
    const svg = scatterPlot([{ name: 'p', x: xs, y: ys }]);
    const box = plotBox(svg);
    const cx = attrValues(svg, 'pt', 'cx');
    const cy = attrValues(svg, 'pt', 'cy');
    expect(cx).toHaveLength(300);
    for (let i = 0; i < cx.length; i++) {
      expect(cx[i]).toBeGreaterThanOrEqual(box.left - 0.01);
      expect(cx[i]).toBeLessThanOrEqual(box.right + 0.01);
      expect(cy[i]).toBeGreaterThanOrEqual(box.top - 0.01);
      expect(cy[i]).toBeLessThanOrEqual(box.bottom + 0.01);
    }
  });
  test('large series are thinned evenly to maxPoints, the same way every time', () => {
    // Source: the function's contract (deterministic thinning)
    const xs = Float64Array.from({ length: 5000 }, (_, i) => i);
    const one = scatterPlot([{ name: 'p', x: xs, y: xs }], { maxPoints: 500 });
    expect(count(one, 'class="pt"')).toBe(500);
    expect(scatterPlot([{ name: 'p', x: xs, y: xs }], { maxPoints: 500 })).toBe(one);
  });
  test('throws when x and y differ in length, and escapes names', () => {
    // Source: the function's contract; XML 1.0 section 2.4
    expect(() => scatterPlot([{ name: 'p', x: [1], y: [] }])).toThrow(/one y per x/);
    expect(scatterPlot([{ name: '"q" & r', x: [1], y: [2] }])).toContain('&quot;q&quot; &amp; r');
  });
});
