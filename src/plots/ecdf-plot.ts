import { escapeXml } from '../common/xml-text';
import { makeFrame, px, type PlotOptions } from './frame';
import { seriesColour } from './palette';
import { extentOf, sortSeries, type Series } from './series';

/**
 * The empirical cumulative distribution function of several series on one
 * plot: for each series a step line rising from 0 to 1, with weights honoured
 * (a value's step is its share of the total weight). Curves that lie on top of
 * each other mean the distributions agree; the largest vertical gap between
 * two curves is the Kolmogorov-Smirnov statistic.
 *
 * The first series (usually the target) is drawn wide and pale so that a
 * series lying on top of it stays visible inside it.
 * Each series is drawn as one `<path class="series">`; steps closer than one
 * pixel are merged, so the SVG stays small for large samples.
 * Cost: O(n log n) per series (sorting); output O(width) per series.
 * @param series one or more series (names are escaped; non-finite values and
 *   non-positive weights are left out).
 * @param opts size, title and axis labels (the y label defaults to "share at or below").
 * @returns SVG text (no DOM needed).
 * @throws Error when a series has a different number of weights than values.
 * @example ecdfPlot([{ name: 'wave 1', values: [1, 2, 3] }], { width: 300 }) // '<svg ...><path class="series" .../>...</svg>'
 */
export function ecdfPlot(series: readonly Series[], opts: PlotOptions = {}): string {
  const sorted = series.map(sortSeries);
  const [lo, hi] = extentOf(sorted);
  const legend = sorted.map((s, i) => ({ name: s.name, colour: seriesColour(i), mark: 'line' as const }));
  const f = makeFrame({ yLabel: 'share at or below', ...opts }, [lo, hi], [0, 1], legend, { lo: 0, hi: 1, step: 0.25, values: [0, 0.25, 0.5, 0.75, 1] });
  const marks: string[] = [];
  sorted.forEach((s, i) => {
    const n = s.sorted.length;
    if (n === 0) {
      marks.push(`<path class="series" data-name="${escapeXml(s.name)}" d="" fill="none"/>`);
      return;
    }
    const pts: string[] = [`M${px(f.left)} ${px(f.y(0))}`];
    let lastX = f.x(s.sorted[0]);
    let level = 0;
    pts.push(`H${px(lastX)}`);
    for (let j = 0; j < n; j++) {
      const xx = f.x(s.sorted[j]);
      if (Math.abs(xx - lastX) >= 1) {
        pts.push(`V${px(f.y(level))}H${px(xx)}`);
        lastX = xx;
      }
      level = s.cum[j];
    }
    pts.push(`V${px(f.y(level))}H${px(f.right)}`);
    marks.push(
      `<path class="series" data-name="${escapeXml(s.name)}" d="${pts.join('')}" fill="none" stroke="${seriesColour(i)}" ` +
        `stroke-width="${i === 0 ? 4.5 : 1.8}"${i === 0 ? ' stroke-opacity="0.55"' : ''} stroke-linejoin="round"/>`,
    );
  });
  return f.head + marks.join('') + f.tail;
}
