import { qqPlot } from '../../src/plots/qq-plot';
import { xmlProblem } from './well-formed';

/** The band's vertices as [x, y] pixel pairs, read from its path. */
function bandVertices(svg: string): number[][] {
  const d = /<path class="band"[^>]* d="([^"]+)"/.exec(svg)?.[1] ?? '';
  return [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

/** The dashed diagonal's two ends in pixels. */
function diagonal(svg: string): number[][] {
  const d = /<path class="diagonal" d="M(-?[\d.]+) (-?[\d.]+)L(-?[\d.]+) (-?[\d.]+)"/.exec(svg)!;
  return [
    [Number(d[1]), Number(d[2])],
    [Number(d[3]), Number(d[4])],
  ];
}

describe('a band on the quantile plot', () => {
  const ref = Object.freeze(Array.from({ length: 101 }, (_, i) => i));
  const series = [{ name: 'mapped source', values: ref }];

  test('a band of zero width on y = x lies on the dashed diagonal, upper ends left to right then lower ends back', () => {
    // Source: geometry worked by hand: a point (v, v) is on the line y = x, which the plot draws corner to corner
    const x = [10, 50, 90];
    const svg = qqPlot({ name: 'target', values: ref }, series, { width: 400, band: { name: '95 % bounds', of: 'mapped source', x, lower: x, upper: x } });
    expect(xmlProblem(svg)).toBeNull();
    const v = bandVertices(svg);
    expect(v).toHaveLength(6);
    const [[x0, y0], [x1, y1]] = diagonal(svg);
    for (const [px, py] of v) expect(py).toBeCloseTo(y0 + ((px - x0) * (y1 - y0)) / (x1 - x0), 1);
    expect(v[0][0]).toBeLessThan(v[2][0]);
    expect(v[3][0]).toBeGreaterThan(v[5][0]);
  });

  test('the upper ends are drawn above the lower ends (smaller y in SVG), points that are not finite are left out, and the legend names the band', () => {
    // Source: SVG coordinates grow downwards (W3C SVG 1.1, sec. 7.3); design choice to drop non-finite points
    const svg = qqPlot({ name: 'target', values: ref }, series, {
      width: 400,
      band: { name: '95 % bounds', x: [10, 50, NaN, 90], lower: [5, 45, 0, 85], upper: [15, 55, 0, 95] },
    });
    const v = bandVertices(svg);
    expect(v).toHaveLength(6);
    expect(v[0][1]).toBeLessThan(v[5][1]);
    expect(svg).toContain('95 % bounds');
  });

  test('ends of different lengths are an error naming the band', () => {
    // Source: design choice (errors say what to fix)
    expect(() => qqPlot({ name: 'target', values: ref }, series, { band: { name: 'b', x: [1, 2], lower: [1], upper: [1, 2] } })).toThrow(/band "b"/);
  });
});
