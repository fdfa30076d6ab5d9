/**
 * lib/charts/notebook: pure builders from stored step results to Observable Plot options, and
 * the data behind each chart as CSV.
 *
 *   fitPlot / residualPlot     C/T vs T² with window, model, σ bars; (C − C_fit)/T
 *   scanPlot                   γ ± σ vs T_max per T_min, plateau, recommended window
 *   candidatesPlot             γ per window of each candidate model, acceptable ones filled, the recommendation
 *   addendaPlot                total / addenda / net vs T
 *   transitionPlot             C_el/T with the idealised equal-area step
 *   integralPlot               S(T) or H(T) − H(0)
 *   dataPlot                   C vs T of the chosen measurements, exclusions
 *   *Csv                       the chart's data as CSV
 */
export { fitPlot, residualPlot, fitRows, residualRows, defaultMaxTK, OVER_T_UNIT } from "./fit";
export type { FitPlotOptions, FitRow, RangeBand, ResidualRow } from "./fit";
export { scanPlot, scanRows } from "./scan";
export { candidatesPlot, candidateRows } from "./candidates";
export type { CandidateRow, CandidatesPlotOptions } from "./candidates";
export type { ScanRow, ScanPlotOptions } from "./scan";
export { addendaPlot, addendaRows, transitionPlot, integralPlot, integralRows } from "./curves";
export { dataPlot, dataRows } from "./data";
export type { DataSeries, DataRow, DataPlotOptions } from "./data";
export { fitCsv, scanCsv, addendaCsv, transitionCsv, entropyCsv, dataCsv } from "./csv";
export { COLOURS, prettyUnit, fmt, BASIS_TEXT } from "./frame";
export type * from "./types";
export { thetaPlot, ratioPlot, thetaRows, ratioRows, latticeCsv } from "./lattice";
export { jointPlot, jointResidualPlot, jointRows, jointCsv, gammaFieldPlot, gammaFieldCsv, fieldName, FIELD_COLOURS } from "./joint";
