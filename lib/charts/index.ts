/** lib/charts: pure functions from stored data and engine results to Observable Plot options. */
export { heatCapacityPlot, sommerfeldPlot, INK, ERROR_BAR } from "./measurement";
export type { MeasurementSeries, ChartOptions } from "./measurement";
export { heatCapacityUnit, heatCapacityOverTUnit, maxAbs } from "./units";
export type { Basis, DisplayUnit } from "./units";
export { seriesPlot, seriesPoints, QUANTITY_LABEL, SERIES_COLOURS, SERIES_CHART_QUANTITIES } from "./series";
export type { SeriesChartRow, SeriesChartLayer, SeriesChartTrend, SeriesChartQuantity, SeriesPlotOptions, SeriesPoint, ValueWithError } from "./series";
