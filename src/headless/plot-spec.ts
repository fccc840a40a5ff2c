import { ecdfPlot, histogramPlot, qqPlot, scatterPlot, type Series } from '../plots';
import { rangeNumbers } from './range-values';
import type { CellResult } from './workbook-io';

/** One series of a plot, read from computed ranges ("Sheet!A2:A100"). */
export interface PlotSeriesSpec {
  readonly name: string;
  /** The values (the x values of a scatter). */
  readonly range: string;
  /** The y values of a scatter (same size as range). */
  readonly y?: string;
  /** One weight per value (ECDF, histogram, QQ). */
  readonly weights?: string;
}

/** A before/after plot of a calculated workbook. */
export interface PlotSpec {
  /** File name of the SVG. */
  readonly file: string;
  readonly kind: 'ecdf' | 'histogram' | 'qq' | 'scatter';
  readonly title: string;
  readonly xLabel?: string;
  readonly yLabel?: string;
  /** Histogram bins and the span they cover (optional). */
  readonly bins?: number;
  readonly range?: readonly [number, number];
  /** For a QQ plot the first series is the reference (x axis). */
  readonly series: readonly PlotSeriesSpec[];
}

/**
 * Draws `spec` from a calculated workbook's values as SVG text (src/plots),
 * `width` px wide (default 640). Cells that are not numbers are left out.
 * Cost: O(cells read) plus the plot's own cost.
 * @throws Error for a range naming an unknown sheet, or a scatter series without y.
 */
export function renderPlot(spec: PlotSpec, values: Readonly<Record<string, CellResult[][]>>, width = 640): string {
  const opts = { width, title: spec.title, xLabel: spec.xLabel, yLabel: spec.yLabel };
  if (spec.kind === 'scatter') {
    return scatterPlot(
      spec.series.map((s) => {
        if (!s.y) throw new Error(`Plot ${spec.file}: the scatter series "${s.name}" needs a y range.`);
        return { name: s.name, x: rangeNumbers(values, s.range).data, y: rangeNumbers(values, s.y).data };
      }),
      opts,
    );
  }
  const series: Series[] = spec.series.map((s) => ({
    name: s.name,
    values: rangeNumbers(values, s.range).data,
    weights: s.weights ? weightsOf(rangeNumbers(values, s.weights).data) : null,
  }));
  if (spec.kind === 'ecdf') return ecdfPlot(series, opts);
  if (spec.kind === 'histogram') return histogramPlot(series, { ...opts, bins: spec.bins, range: spec.range });
  return qqPlot(series[0], series.slice(1), opts);
}

/** Weights with non-numbers as 0 (the plots leave such rows out). */
function weightsOf(w: Float64Array): Float64Array {
  return w.map((v) => (Number.isFinite(v) ? v : 0));
}
