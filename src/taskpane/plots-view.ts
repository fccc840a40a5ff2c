import { ecdfPlot, histogramPlot, qqPlot, quantileOf, scatterPlot, sortSeries, type Series } from '../plots';
import type { ChartTable } from '../workbook/comparison-chart';
import type { PlotSample } from '../fits/worker/messages';

/**
 * The pane's plots of a fit, as SVG text from src/plots: per column, the
 * source, mapped source and target distributions (ECDF or histogram) and a
 * quantile-quantile plot against the target; for two columns, a scatter of the
 * three clouds; and the quantile table behind the native Excel chart. Pure.
 */

/** The three samples a fit's plots compare, with column names. */
export interface PlotData {
  readonly source: PlotSample;
  readonly mapped: PlotSample;
  readonly target: PlotSample;
  readonly columns: readonly string[] | null;
}

/** Column k's name ("column 1" without a header). */
export function columnName(data: PlotData, k: number): string {
  return data.columns?.[k] ?? `column ${k + 1}`;
}

function columnOf(s: PlotSample, k: number): Float64Array {
  const out = new Float64Array(s.n);
  for (let i = 0; i < s.n; i++) out[i] = s.data[i * s.d + k];
  return out;
}

function seriesOf(data: PlotData, k: number): { source: Series; mapped: Series; target: Series } {
  return {
    source: { name: 'source', values: columnOf(data.source, k), weights: data.source.weights },
    mapped: { name: 'mapped source', values: columnOf(data.mapped, k), weights: data.mapped.weights },
    target: { name: 'target', values: columnOf(data.target, k), weights: data.target.weights },
  };
}

/**
 * Column k's three distributions on one plot. O(n log n).
 * @example distributionSvg(data, 0, 'ecdf', 300) // '<svg ...>'
 */
export function distributionSvg(data: PlotData, k: number, kind: 'ecdf' | 'histogram', width: number): string {
  const s = seriesOf(data, k);
  const opts = { width, title: `${columnName(data, k)}: distributions`, xLabel: columnName(data, k) };
  return kind === 'histogram' ? histogramPlot([s.source, s.mapped, s.target], opts) : ecdfPlot([s.source, s.mapped, s.target], opts);
}

/** Column k's quantiles of source and mapped source against the target's. O(n log n). */
export function qqSvg(data: PlotData, k: number, width: number): string {
  const s = seriesOf(data, k);
  return qqPlot(s.target, [s.source, s.mapped], { width, title: `${columnName(data, k)}: quantiles against the target` });
}

/** Columns a (x) and b (y) of source, mapped source and target as three clouds. O(n). */
export function scatterSvg(data: PlotData, a: number, b: number, width: number): string {
  const pts = (name: string, s: PlotSample) => ({ name, x: columnOf(s, a), y: columnOf(s, b) });
  return scatterPlot([pts('source', data.source), pts('mapped source', data.mapped), pts('target', data.target)], {
    width,
    title: `${columnName(data, a)} and ${columnName(data, b)}`,
    xLabel: columnName(data, a),
    yLabel: columnName(data, b),
  });
}

/**
 * Column k's quantile functions at shares 0, 0.01, ..., 1 (inverse empirical
 * CDF, weights honoured), the table the native chart draws. O(n log n).
 * @example chartTable(data, 0).header // ['share', 'source', 'mapped source', 'target']
 */
export function chartTable(data: PlotData, k: number, steps = 100): ChartTable {
  const s = seriesOf(data, k);
  const sorted = [s.source, s.mapped, s.target].map(sortSeries);
  const rows: number[][] = [];
  for (let i = 0; i <= steps; i++) {
    const p = i / steps;
    rows.push([p, ...sorted.map((x) => quantileOf(x, p))]);
  }
  return {
    title: `${columnName(data, k)}: quantiles of source, mapped source and target`,
    header: ['share', 'source', 'mapped source', 'target'],
    rows,
    sheetName: 'Remap chart',
  };
}
