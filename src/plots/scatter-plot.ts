import { escapeXml } from '../common/xml-text';
import { makeFrame, px, type PlotOptions } from './frame';
import { seriesColour } from './palette';

/** One named cloud of points: x[i], y[i] is point i. */
export interface PointSeries {
  readonly name: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
}

/** Options of a scatter plot. */
export interface ScatterOptions extends PlotOptions {
  /** Most points drawn per series, 10..20,000 (default 1,500): larger series are thinned evenly (every k-th point), never at random. */
  readonly maxPoints?: number;
}

/**
 * A 2-D scatter of several point series, each in its own colour, translucent
 * so dense regions show. Points with a non-finite coordinate are left out.
 * Each drawn point is a `<circle class="pt">`.
 * Cost: O(n) per series; output O(min(n, maxPoints)).
 * @param series one or more point series (x and y of equal length).
 * @param opts size, labels and `maxPoints`.
 * @returns SVG text.
 * @throws Error when a series' x and y have different lengths.
 * @example scatterPlot([{ name: 'model', x: [0, 1], y: [1, 0] }]) // two circles
 */
export function scatterPlot(series: readonly PointSeries[], opts: ScatterOptions = {}): string {
  const cap = Math.max(10, Math.min(20000, Math.round(opts.maxPoints ?? 1500)));
  const kept = series.map((s) => {
    if (s.x.length !== s.y.length) throw new Error(`plot: series "${s.name}" has ${s.x.length} x values but ${s.y.length} y values; give one y per x.`);
    const idx: number[] = [];
    for (let i = 0; i < s.x.length; i++) if (Number.isFinite(s.x[i]) && Number.isFinite(s.y[i])) idx.push(i);
    if (idx.length <= cap) return idx;
    const thin: number[] = [];
    for (let k = 0; k < cap; k++) thin.push(idx[Math.floor((k * idx.length) / cap)]);
    return thin;
  });
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  series.forEach((s, i) => {
    for (const j of kept[i]) {
      x0 = Math.min(x0, s.x[j]);
      x1 = Math.max(x1, s.x[j]);
      y0 = Math.min(y0, s.y[j]);
      y1 = Math.max(y1, s.y[j]);
    }
  });
  const legend = series.map((s, i) => ({ name: s.name, colour: seriesColour(i), mark: 'point' as const }));
  const f = makeFrame(opts, [x0, x1], [y0, y1], legend);
  const r = f.width < 420 ? 1.6 : 2.2;
  const marks = series.map((s, i) => {
    const dots = kept[i].map((j) => `<circle class="pt" cx="${px(f.x(s.x[j]))}" cy="${px(f.y(s.y[j]))}" r="${r}"/>`);
    return `<g data-name="${escapeXml(s.name)}" fill="${seriesColour(i)}" fill-opacity="0.45">${dots.join('')}</g>`;
  });
  return f.head + marks.join('') + f.tail;
}
