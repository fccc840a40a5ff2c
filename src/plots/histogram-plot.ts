import { escapeXml } from '../common/xml-text';
import { makeFrame, px, type PlotOptions } from './frame';
import { seriesColour } from './palette';
import { extentOf, sortSeries, type Series } from './series';

/** Options of a histogram overlay. */
export interface HistogramOptions extends PlotOptions {
  /** Number of bins, 2..200 (default: the square root of the smallest series' size, kept within 8..40). */
  readonly bins?: number;
  /** The span the bins cover (default: the data's range); values outside go into the end bins. E.g. [-0.5, 10.5] with 11 bins centres bins on the
   * scores 0..10. */
  readonly range?: readonly [number, number];
}

/**
 * Histograms of several series overlaid on shared bins, each drawn as a
 * translucent filled outline. Heights are each series' share of its total
 * weight falling in the bin, in percent (bins are shared and of equal width),
 * so samples of different sizes and weights compare directly.
 * Each series is one `<path class="series">`.
 * Cost: O(n log n) per series plus O(bins) output.
 * @param series one or more series (weights honoured; non-finite values left out).
 * @param opts size, labels, `bins` (2..200, clamped) and `range`.
 * @returns SVG text.
 * @throws Error when a series has a different number of weights than values.
 * @example histogramPlot([{ name: 'North', values: [1, 2, 2, 3] }], { bins: 4 }) // '<svg ...>...</svg>'
 */
export function histogramPlot(series: readonly Series[], opts: HistogramOptions = {}): string {
  const sorted = series.map(sortSeries);
  const [lo, hi] = extentOf(sorted);
  const nonEmpty = sorted.filter((s) => s.sorted.length > 0);
  const smallest = nonEmpty.length ? Math.min(...nonEmpty.map((s) => s.rows)) : 1;
  const bins = Math.max(2, Math.min(200, Math.round(opts.bins ?? Math.max(8, Math.min(40, Math.ceil(Math.sqrt(smallest)))))));
  const given = opts.range && Number.isFinite(opts.range[0]) && Number.isFinite(opts.range[1]) && opts.range[1] > opts.range[0] ? opts.range : null;
  const a = given ? given[0] : Number.isFinite(lo) ? lo : 0;
  const b = given ? given[1] : Number.isFinite(hi) && hi > a ? hi : a + 1;
  const width = (b - a) / bins;
  const densities = sorted.map((s) => {
    const d = new Float64Array(bins);
    for (let j = 0; j < s.sorted.length; j++) {
      const k = Math.min(bins - 1, Math.max(0, Math.floor((s.sorted[j] - a) / width)));
      d[k] += s.share[j];
    }
    for (let k = 0; k < bins; k++) d[k] *= 100;
    return d;
  });
  let top = 0;
  for (const d of densities) for (const v of d) top = Math.max(top, v);
  const legend = sorted.map((s, i) => ({ name: s.name, colour: seriesColour(i), mark: 'box' as const }));
  const f = makeFrame({ yLabel: '% per bin', ...opts }, [a, b], [0, top > 0 ? top : 1], legend);
  const marks: string[] = [];
  densities.forEach((d, i) => {
    const name = escapeXml(sorted[i].name);
    if (sorted[i].sorted.length === 0) {
      marks.push(`<path class="series" data-name="${name}" d="" fill="none"/>`);
      return;
    }
    const parts: string[] = [`M${px(f.x(a))} ${px(f.y(0))}`];
    for (let k = 0; k < bins; k++) parts.push(`V${px(f.y(d[k]))}H${px(f.x(a + (k + 1) * width))}`);
    parts.push(`V${px(f.y(0))}Z`);
    const c = seriesColour(i);
    marks.push(
      `<path class="series" data-name="${name}" d="${parts.join('')}" fill="${c}" fill-opacity="0.22" stroke="${c}" stroke-width="1.8" ` +
        `stroke-linejoin="round"/>`,
    );
  });
  return f.head + marks.join('') + f.tail;
}
