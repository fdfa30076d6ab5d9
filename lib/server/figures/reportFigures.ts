/**
 * The report's figures as SVG text, from the report object alone (what was sealed): per fit,
 * C/T vs T² with ±σ bars, the window shaded, the model line and the residuals below; and the
 * window scan when the fit step ran one. The HTML report inlines these; the PDF draws the same
 * SVG as vectors; the figure export writes them at journal column widths.
 */
import type { PlotOptions } from "@observablehq/plot";
import { fitFigure, scanFigure, type PaperOptions } from "../../charts/figures";
import { chartSvg } from "../../charts/svg";
import type { FitPlotData, FitStepResult, ScanResult } from "../../charts/notebook/types";
import type { RevisionReport } from "../review/report";
import { FIGURE_FONT_FAMILY } from "./fonts";

type ReportFit = RevisionReport["fits"][number];
export type ReportFigureKind = "fit" | "scan";

export interface ReportFigure {
  /** "fit-3" or "scan-3" (the step's position, 1-based), stable for the export URL. */
  id: string;
  kind: ReportFigureKind;
  position: number;
  caption: string;
  options: PlotOptions[];
}

/** The fit's stored plot data as the chart builders' input, or null when it is missing. */
export function fitResultOf(fit: ReportFit): FitPlotData | null {
  const points = fit.plot.points as FitStepResult["points"] | null;
  const curve = fit.plot.curve as FitStepResult["curve"] | null;
  const residuals = fit.plot.residuals as (number | null)[] | null;
  const indices = fit.plot.windowIndices as number[] | null;
  if (!points?.temperatureK?.length || !curve || !residuals || !indices) return null;
  return {
    basis: fit.basis === "atom" ? "atom" : "formula-unit",
    window: { tMinK: fit.tMinK, tMaxK: fit.tMaxK, requestedMinK: null, requestedMaxK: null, nPoints: fit.nPoints },
    points, curve, scan: (fit.plot.scan as ScanResult | null) ?? null,
    fit: { residuals, window: { indices } },
  };
}

/** Every figure of the report, laid out for `paper`. */
export function reportFigures(report: RevisionReport, paper: PaperOptions): ReportFigure[] {
  const out: ReportFigure[] = [];
  for (const f of report.fits) {
    const r = fitResultOf(f);
    if (!r) continue;
    const n = f.position + 1;
    const gamma = f.parameters.find((p) => p.name === "gamma");
    out.push({
      id: `fit-${n}`, kind: "fit", position: f.position, options: fitFigure(r, paper),
      caption: `C/T against T² ${f.basis === "atom" ? "per mole of atoms" : "per mole formula unit"}. Filled points lie inside the fit window (shaded), hollow points outside; bars are ±1σ${r.points.sigma ? "" : " (none: the data carry no σ)"}; the line is the fitted ${f.modelLabel}. Lower panel: residuals (C − C_fit)/T of the window’s points in the same unit.`,
    });
    if (r.scan && r.scan.cells.length) {
      out.push({
        id: `scan-${n}`, kind: "scan", position: f.position,
        options: scanFigure(r.scan, r.basis, paper, gamma ? { tMaxK: f.tMaxK, gammaSI: gamma.value / 1e3 } : null),
        caption: "Window scan: γ ± 1σ of the same model fitted to every window, against the window’s upper edge T_max, one line per lower edge T_min; ringed points form the plateau, its mean is the dashed line; the large circle marks the recommended window and the diamond the window used.",
      });
    }
  }
  return out;
}

/** A figure as standalone SVG text (fonts named; text as text). */
export function figureSvg(fig: ReportFigure, fontSize: number): string {
  return chartSvg(fig.options, { fontSize, fontFamily: `${FIGURE_FONT_FAMILY}, sans-serif`, background: "#ffffff" });
}
