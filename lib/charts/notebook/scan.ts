/**
 * The window-scan chart: γ ± σ (mJ mol⁻¹ K⁻²) against the window's upper edge T_max (K), one
 * line per lower edge T_min (colour), the plateau windows ringed, the plateau mean as a dashed
 * line, the recommended window marked, and the step's current window as a diamond. Cells past
 * the T³ range (Θ_D/15) are drawn hollow. Display scaling only.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { BASIS_TEXT, COLOURS, fmt, frame, tipText, xAxis, yAxis } from "./frame";
import { formatNumber, formatRange } from "../../display/numbers";
import type { MoleBasis, ScanResult } from "./types";

export interface ScanRow {
  k: number;
  tMinK: number;
  tMaxK: number;
  gamma: number;
  lo: number | null;
  hi: number | null;
  nPoints: number;
  chi: number | null;
  plateau: boolean;
  beyond: boolean;
}

const MJ = 1e3;

/** Rows of the converged cells with a γ, in display units. */
export function scanRows(scan: ScanResult): ScanRow[] {
  const inPlateau = new Set(scan.plateau?.cells ?? []);
  const out: ScanRow[] = [];
  scan.cells.forEach((c, k) => {
    if (c.gamma === null || !c.converged) return;
    const g = c.gamma * MJ;
    const s = c.gammaStdError === null ? null : c.gammaStdError * MJ;
    out.push({ k, tMinK: c.tMinK, tMaxK: c.tMaxK, gamma: g, lo: s === null ? null : g - s, hi: s === null ? null : g + s, nPoints: c.nPoints, chi: c.reducedChiSquare, plateau: inPlateau.has(k), beyond: c.beyondT3Range });
  });
  return out;
}

export interface ScanPlotOptions {
  width?: number;
  height?: number;
  basis?: MoleBasis;
  /** The step's own window and γ (SI), drawn as a diamond. */
  current?: { tMaxK: number; gammaSI: number } | null;
}

/** γ ± σ vs T_max per T_min, plateau, recommended window. */
export function scanPlot(scan: ScanResult, opts: ScanPlotOptions = {}): PlotOptions {
  const rows = scanRows(scan);
  const rec = scan.recommended && scan.recommended.gamma !== null ? [{ tMaxK: scan.recommended.tMaxK, gamma: scan.recommended.gamma * MJ, tMinK: scan.recommended.tMinK }] : [];
  const title = (d: ScanRow) => tipText(`window ${fmt(d.tMinK)}–${fmt(d.tMaxK)} K (${d.nPoints} points)\nγ = ${fmt(d.gamma)} ± ${d.lo === null ? "—" : fmt(d.gamma - d.lo)} mJ mol⁻¹ K⁻²\nχ²_red = ${fmt(d.chi)}${d.plateau ? "\nin the plateau" : ""}${d.beyond ? "\nT_max past Θ_D/15" : ""}`);
  const basis = opts.basis ? `, ${BASIS_TEXT[opts.basis]}` : "";
  return {
    ...frame(opts.width, opts.height ?? 340),
    x: xAxis("window upper edge T_max (K)"),
    y: yAxis(`γ (mJ mol⁻¹ K⁻²${basis})`),
    // Quantised so that the legend is a row of swatches (and lines of neighbouring T_min share a colour).
    color: { type: "quantize", n: 5, range: ["#e3b58c", "#c27a4a", "#9a4519", "#5a3a3a", "#1e2431"], label: "window lower edge T_min (K)", legend: true, tickFormat: (v: number) => formatNumber(v, 3) },
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      ...(scan.plateau ? [Plot.ruleY([scan.plateau.gammaMean * MJ], { stroke: COLOURS.plateau, strokeDasharray: "5,4" })] : []),
      Plot.ruleX(rows.filter((d) => d.lo !== null), { x: "tMaxK", y1: "lo", y2: "hi", stroke: "tMinK", strokeOpacity: 0.35 }),
      Plot.line(rows, { x: "tMaxK", y: "gamma", z: "tMinK", stroke: "tMinK", strokeWidth: 1 }),
      Plot.dot(rows.filter((d) => !d.beyond), { x: "tMaxK", y: "gamma", r: 2, fill: "tMinK" }),
      Plot.dot(rows.filter((d) => d.beyond), { x: "tMaxK", y: "gamma", r: 2.2, stroke: "tMinK", fill: "white" }),
      Plot.dot(rows.filter((d) => d.plateau), { x: "tMaxK", y: "gamma", r: 4, stroke: COLOURS.plateau, strokeWidth: 1.2 }),
      Plot.dot(rec, { x: "tMaxK", y: "gamma", r: 8, stroke: COLOURS.copper, strokeWidth: 2.2 }),
      Plot.text(rec, { x: "tMaxK", y: "gamma", text: (d: { tMinK: number; tMaxK: number }) => `recommended ${formatRange(d.tMinK, d.tMaxK, "K")}`, dy: -16, textAnchor: "end", fill: COLOURS.copper, fontWeight: 600, stroke: "white", strokeWidth: 3, paintOrder: "stroke" }),
      ...(opts.current ? [Plot.dot([{ x: opts.current.tMaxK, y: opts.current.gammaSI * MJ }], { x: "x", y: "y", symbol: "diamond", r: 5.5, fill: COLOURS.copper, stroke: "white" })] : []),
      Plot.tip(rows, Plot.pointer({ x: "tMaxK", y: "gamma", title, fontSize: 12 })),
    ],
  };
}
