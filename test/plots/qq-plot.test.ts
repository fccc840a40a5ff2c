import { qqPlot } from '../../src/plots/qq-plot';
import { plotBox } from './plot-box';
import { attrValues, count, xmlProblem } from './well-formed';

describe('qqPlot', () => {
  test.each([300, 640])('at %i px the SVG is well formed with `points` quantile marks per series and one diagonal', (width) => {
    // Source: the function's contract
    const ref = Object.freeze(Array.from({ length: 100 }, (_, i) => i));
    const svg = qqPlot(
      { name: 'target', values: ref },
      [
        { name: 'before', values: ref.map((v) => v / 2) },
        { name: 'after', values: ref },
      ],
      { width, points: 25 },
    );
    expect(xmlProblem(svg)).toBeNull();
    expect(count(svg, 'class="pt"')).toBe(50);
    expect(count(svg, 'class="diagonal"')).toBe(1);
  });
  test("a series with the reference's distribution lies on the diagonal, and every mark is inside the plot area", () => {
    // Source: definition of a Q-Q plot (equal quantiles give y = x)
    const ref = Array.from({ length: 200 }, (_, i) => i * 3 - 50);
    const svg = qqPlot({ name: 'r', values: ref }, [{ name: 'same', values: [...ref].reverse() }], { points: 40 });
    const box = plotBox(svg);
    const cx = attrValues(svg, 'pt', 'cx');
    const cy = attrValues(svg, 'pt', 'cy');
    expect(cx).toHaveLength(40);
    for (let i = 0; i < cx.length; i++) {
      expect(cx[i]).toBeGreaterThanOrEqual(box.left - 0.01);
      expect(cx[i]).toBeLessThanOrEqual(box.right + 0.01);
      // on the diagonal: the fraction along x equals the fraction up y (both axes share one range)
      const fx = (cx[i] - box.left) / (box.right - box.left);
      const fy = (box.bottom - cy[i]) / (box.bottom - box.top);
      expect(fy).toBeCloseTo(fx, 2);
    }
  });
  test('escapes the reference name used in the axis label and legend', () => {
    // Source: XML 1.0 section 2.4
    const svg = qqPlot({ name: 'R&D <old>', values: [1, 2, 3] }, [{ name: 's', values: [1, 2] }]);
    expect(xmlProblem(svg)).toBeNull();
    expect(svg).toContain('R&amp;D &lt;old&gt; quantiles');
  });
});
