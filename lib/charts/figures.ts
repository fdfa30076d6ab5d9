/**
 * Figures for paper: the notebook's charts (fit with residuals, window scan, series trend)
 * re-laid for print — margins and label offsets in proportion to the font size, legends kept,
 * pointer tips dropped by the SVG renderer — at a width in points (1 px of the chart = 1 pt on
 * paper, so a 8 pt font prints at 8 pt). Journal column widths per common practice: about 8.5 cm
 * (one column) and 17.5 cm (two columns). Pure: Plot options in, Plot options out.
 */
import type { PlotOptions, ScaleOptions } from "@observablehq/plot";
import { fitPlot, residualPlot, fitRows, defaultMaxTK } from "./notebook/fit";
import { scanPlot } from "./notebook/scan";
import { seriesPlot, type SeriesPlotOptions } from "./series";
import type { FitPlotData, ScanResult, MoleBasis } from "./notebook/types";

export const COLUMN_WIDTHS_CM = Object.freeze({ single: 8.5, double: 17.5 });
export type ColumnWidth = keyof typeof COLUMN_WIDTHS_CM;
const PT_PER_CM = 72 / 2.54;

export interface PaperOptions {
  /** Width of the figure in points. */
  widthPt: number;
  /** Font size in points (default 8, the size of a journal figure's labels). */
  fontSize?: number;
}

/** Width in points of a journal column. */
export function columnWidthPt(column: ColumnWidth): number {
  return COLUMN_WIDTHS_CM[column] * PT_PER_CM;
}

/** Margins and label offsets in proportion to the font size; width and height as given. */
export function forPaper(options: PlotOptions, fontSize: number, height: number, width: number): PlotOptions {
  const x = (options.x ?? {}) as ScaleOptions, y = (options.y ?? {}) as ScaleOptions;
  return {
    ...options, width, height,
    marginLeft: Math.round(7.5 * fontSize), marginBottom: Math.round(3.6 * fontSize), marginTop: Math.round(1.6 * fontSize), marginRight: Math.round(1.6 * fontSize),
    x: { ...x, labelOffset: Math.round(3.1 * fontSize) },
    y: { ...y, labelOffset: Math.round(6.1 * fontSize), ticks: 5 },
  };
}

/**
 * C/T vs T² (mJ mol⁻¹ K⁻²; K²) with ±σ bars, the fit window shaded, the model line, and the
 * residuals (C − C_fit)/T below on the same T² axis. Two Plot options, top to bottom. The mole
 * basis (per mole formula unit or of atoms) belongs in the caption: an axis title that long
 * would not fit the panel's height.
 */
export function fitFigure(r: FitPlotData, paper: PaperOptions): PlotOptions[] {
  const fs = paper.fontSize ?? 8, w = paper.widthPt;
  const maxTK = defaultMaxTK(r);
  const xMax = Math.max(...fitRows(r, maxTK).map((d) => d.x), r.window.tMaxK ** 2);
  const domain: [number, number] = [0, xMax];
  const narrow = w < 400;
  const top = forPaper(fitPlot(r, { width: w, maxTK }), fs, Math.round(w * (narrow ? 0.62 : 0.42)), w);
  const bottom = forPaper(residualPlot(r, { width: w, xDomain: domain }), fs, Math.round(w * (narrow ? 0.3 : 0.17)), w);
  const unit = "mJ mol⁻¹ K⁻²";
  return [
    { ...top, x: { ...(top.x as ScaleOptions), domain, nice: true, label: null, tickFormat: () => "" }, y: { ...(top.y as ScaleOptions), label: `C/T (${unit})` }, marginBottom: Math.round(fs * 0.8) },
    { ...bottom, x: { ...(bottom.x as ScaleOptions), domain, nice: true }, y: { ...(bottom.y as ScaleOptions), label: "residual", ticks: 3 }, marginTop: Math.round(fs * 0.6) },
  ];
}

/** γ ± σ against the window's upper edge T_max, one line per lower edge T_min (legend above). */
export function scanFigure(scan: ScanResult, basis: MoleBasis, paper: PaperOptions, current: { tMaxK: number; gammaSI: number } | null = null): PlotOptions[] {
  const fs = paper.fontSize ?? 8, w = paper.widthPt;
  const opts = scanPlot(scan, { width: w, basis: w < 400 ? undefined : basis, current });
  return [forPaper(opts, fs, Math.round(w * (w < 400 ? 0.6 : 0.42)), w)];
}

/** A series quantity against the series axis, trend and band, legend inside. */
export function seriesFigure(options: SeriesPlotOptions, paper: PaperOptions): PlotOptions[] {
  const fs = paper.fontSize ?? 8, w = paper.widthPt;
  return [forPaper(seriesPlot({ ...options, width: w }), fs, Math.round(w * 0.7), w)];
}
