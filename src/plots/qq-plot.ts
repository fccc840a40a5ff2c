import { escapeXml } from '../common/xml-text';
import { makeFrame, px, type PlotOptions } from './frame';
import { INK, seriesColour } from './palette';
import { extentOf, quantileOf, sortSeries, type Series } from './series';

/** Options of a quantile-quantile plot. */
export interface QQOptions extends PlotOptions {
  /** Quantiles drawn per series, 2..1000 (default: the smaller sample size, at most 200). */
  readonly points?: number;
}

/**
 * A quantile-quantile plot: for each series, its quantiles (y) against the
 * reference series' quantiles (x) at the same probabilities (k - 1/2)/m,
 * k = 1..m, with weights honoured. Points on the dashed diagonal y = x mean
 * the series has the reference's distribution. Both axes share one range, so
 * the diagonal runs corner to corner.
 * Each series' quantiles are `<circle class="pt">` marks; the diagonal is `<path class="diagonal">`.
 * Cost: O(n log n) per series plus O(m log n).
 * @param reference the series on the x axis (e.g. the target).
 * @param series the series to compare (e.g. the source before and after mapping); colours start after the reference's.
 * @param opts size, labels and `points`.
 * @returns SVG text.
 * @throws Error when a series has a different number of weights than values.
 * @example qqPlot({ name: 'target', values: [1, 2, 3] }, [{ name: 'mapped', values: [1, 2, 3] }], { points: 3 }) // three points on the diagonal
 */
export function qqPlot(reference: Series, series: readonly Series[], opts: QQOptions = {}): string {
  const ref = sortSeries(reference);
  const others = series.map(sortSeries);
  const all = [ref, ...others];
  const [lo, hi] = extentOf(all);
  const maxN = Math.max(0, ...others.map((s) => Math.min(s.rows, ref.rows)));
  const m = Math.max(2, Math.min(1000, Math.round(opts.points ?? Math.min(200, Math.max(2, maxN)))));
  const legend = [
    ...others.map((s, i) => ({ name: s.name, colour: seriesColour(i + 1), mark: 'point' as const })),
    { name: `same as ${reference.name}`, colour: INK, mark: 'line' as const },
  ];
  const f = makeFrame({ xLabel: `${reference.name} quantiles`, yLabel: 'quantiles', ...opts }, [lo, hi], [lo, hi], legend);
  // share one range on both axes
  const g = makeFrame(
    { xLabel: `${reference.name} quantiles`, yLabel: 'quantiles', ...opts },
    [f.xTicks.lo, f.xTicks.hi],
    [f.xTicks.lo, f.xTicks.hi],
    legend,
    f.xTicks,
  );
  const marks: string[] = [];
  const a = g.xTicks.lo;
  const b = g.xTicks.hi;
  marks.push(
    `<path class="diagonal" d="M${px(g.x(a))} ${px(g.y(a))}L${px(g.x(b))} ${px(g.y(b))}" stroke="${INK}" stroke-width="1" stroke-dasharray="4 3" fill="none"/>`,
  );
  const r = g.width < 420 ? 1.8 : 2.4;
  others.forEach((s, i) => {
    const c = seriesColour(i + 1);
    const dots: string[] = [];
    if (s.sorted.length > 0 && ref.sorted.length > 0) {
      for (let k = 1; k <= m; k++) {
        const p = (k - 0.5) / m;
        dots.push(`<circle class="pt" cx="${px(g.x(quantileOf(ref, p)))}" cy="${px(g.y(quantileOf(s, p)))}" r="${r}"/>`);
      }
    }
    marks.push(`<g data-name="${escapeXml(s.name)}" fill="${c}" fill-opacity="0.75">${dots.join('')}</g>`);
  });
  return g.head + marks.join('') + g.tail;
}
