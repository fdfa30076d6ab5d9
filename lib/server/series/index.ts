/**
 * Composition series: records (create, rename, members), the table-and-trends view, CSV export.
 *
 *   listSeries, getSeries, createSeries, updateSeries, addSeriesMembers, removeSeriesMember
 *   seriesView(db, member, id, { axis, includeDrafts, trendFrom })   rows + trends
 *   seriesCsv(view)                                                  safe CSV
 *   valuesFromSteps(steps, r)                                        one revision's γ, β, Θ_D, D(E_F), m*, T_c
 */
export { listSeries, getSeries, createSeries, updateSeries, addSeriesMembers, removeSeriesMember, createSeriesSchema, updateSeriesSchema, seriesMembersSchema } from "./records";
export type { SeriesInfo } from "./records";
export { seriesView, SERIES_QUANTITIES, QUANTITY_UNITS } from "./view";
export type { SeriesView, SeriesRow, SeriesAxis, SeriesQuantity, SeriesViewOptions, QuantityTrends, RowSource } from "./view";
export { seriesCsv } from "./csv";
export { valuesFromSteps } from "./extract";
export type { RevisionValues, Valued, StepLike } from "./extract";
export { seriesLatex, latexText, latexFormula, latexNumber } from "./latex";
