/* Plots as SVG text: pure functions (no DOM, no Node APIs), shared by the
 * headless demo (files) and the task pane (inline). */
export { PALETTE, INK, GRID, seriesColour } from './palette';
export { niceTicks, formatTick, decimalsOf, type Ticks } from './nice-ticks';
export { sortSeries, quantileOf, extentOf, type Series, type SortedSeries } from './series';
export { makeFrame, px, textWidth, type PlotOptions, type LegendEntry, type Frame } from './frame';
export { ecdfPlot } from './ecdf-plot';
export { histogramPlot, type HistogramOptions } from './histogram-plot';
export { qqPlot, type QQOptions } from './qq-plot';
export { scatterPlot, type PointSeries, type ScatterOptions } from './scatter-plot';
