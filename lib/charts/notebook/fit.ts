/**
 * The fit step's charts. C/T vs T² (K²), where C = γT + βT³ is a straight line with intercept γ
 * and slope β: points with σ/T error bars, the fit window shaded, points outside it hollow, the
 * fitted model as a curve, discussion ranges as bands. Residuals (C − C_fit)/T on the same x
 * axis, so the two charts line up. C/T in mJ mol⁻¹ K⁻² per mole formula unit or per mole of
 * atoms (the result's basis). Display scaling only: SI × 1000.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { invalid } from "../../engine/errors";
import { BASIS_TEXT, COLOURS, fmt, frame, tipText, xAxis, yAxis } from "./frame";
import type { FitPlotData } from "./types";

/** A range drawn on a chart: a discussion anchor or the range being dragged. */
export interface RangeBand {
  xMin: number;
  xMax: number;
  label?: string;
  faded?: boolean;
}

export interface FitPlotOptions {
  width?: number;
  height?: number;
  /** Show points with T ≤ maxTK; null shows every point; default defaultMaxTK(result). */
  maxTK?: number | null;
  /** Discussion anchors on this chart, x in K². */
  anchors?: readonly RangeBand[];
  /** The range being dragged (brush preview), x in K². */
  selection?: RangeBand | null;
}

export interface FitRow {
  i: number;
  t: number;
  x: number;
  y: number;
  lo: number | null;
  hi: number | null;
  inWindow: boolean;
}

const MJ = 1e3;

/** Throws InputError when the result's point arrays do not line up. */
function check(r: FitPlotData): void {
  const n = r.points.temperatureK.length;
  if (r.points.heatCapacity.length !== n) throw invalid("points.heatCapacity", `${r.points.heatCapacity.length} values`, `temperatureK has ${n}`);
  if (r.points.sigma && r.points.sigma.length !== n) throw invalid("points.sigma", `${r.points.sigma.length} values`, `temperatureK has ${n}`);
  if (r.points.inWindow.length !== n) throw invalid("points.inWindow", `${r.points.inWindow.length} values`, `temperatureK has ${n}`);
}

/** Default upper display limit: 1.5 × the window's T_max (the straight-line region), within the data. */
export function defaultMaxTK(r: FitPlotData): number {
  const top = Math.max(...r.points.temperatureK);
  return Math.min(top, 1.5 * r.window.tMaxK);
}

/** One row per point in C/T vs T² display units (K², mJ mol⁻¹ K⁻²). */
export function fitRows(r: FitPlotData, maxTK: number | null = null): FitRow[] {
  check(r);
  const out: FitRow[] = [];
  r.points.temperatureK.forEach((t, i) => {
    if (maxTK !== null && t > maxTK) return;
    const y = (r.points.heatCapacity[i]! / t) * MJ;
    const s = r.points.sigma ? (r.points.sigma[i]! / t) * MJ : null;
    out.push({ i, t, x: t * t, y, lo: s === null ? null : y - s, hi: s === null ? null : y + s, inWindow: r.points.inWindow[i]! });
  });
  return out;
}

/** C/T on the fit charts: the unit of γ. */
export const OVER_T_UNIT = "mJ mol⁻¹ K⁻²";

function bandMarks(anchors: readonly RangeBand[], selection: RangeBand | null | undefined) {
  const marks = [];
  if (anchors.length) {
    marks.push(Plot.rect(anchors, { x1: "xMin", x2: "xMax", fill: COLOURS.anchorWash, fillOpacity: (d: RangeBand) => (d.faded ? 0.35 : 0.75) }));
    marks.push(Plot.text(anchors, { x: (d: RangeBand) => (d.xMin + d.xMax) / 2, text: (d: RangeBand) => d.label ?? "", frameAnchor: "top", dy: 4, fill: COLOURS.anchor, fontWeight: 600 }));
  }
  if (selection) marks.push(Plot.rect([selection], { x1: "xMin", x2: "xMax", fill: COLOURS.anchor, fillOpacity: 0.15, stroke: COLOURS.anchor, strokeDasharray: "4,3" }));
  return marks;
}

/**
 * C/T vs T² with the fit window, the model curve and σ/T error bars. x "T² (K²)", y
 * "C/T (mJ mol⁻¹ K⁻², per mole …)". Throws InputError on mismatched arrays.
 */
export function fitPlot(r: FitPlotData, opts: FitPlotOptions = {}): PlotOptions {
  const maxTK = opts.maxTK === undefined ? defaultMaxTK(r) : opts.maxTK;
  const data = fitRows(r, maxTK);
  const bars = data.filter((d) => d.lo !== null);
  const curve = r.curve.temperatureK.map((t, k) => ({ x: t * t, y: (r.curve.heatCapacity[k]! / t) * MJ, t })).filter((d) => maxTK === null || d.t <= maxTK * 1.0001);
  const w = r.window;
  const unit = OVER_T_UNIT;
  const title = (d: FitRow) => `T = ${fmt(d.t)} K\nT² = ${fmt(d.x)} K²\nC/T = ${fmt(d.y)} ${unit}${d.lo !== null ? ` ± ${fmt(d.y - d.lo)}` : ""}\n${d.inWindow ? "in the fit window" : "outside the fit window"}`;
  return {
    ...frame(opts.width, opts.height ?? 360),
    x: xAxis("T² (K²)", { zero: true }),
    y: yAxis(`C/T (${unit}, ${BASIS_TEXT[r.basis]})`),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.rect([{ x1: w.tMinK ** 2, x2: w.tMaxK ** 2 }], { x1: "x1", x2: "x2", fill: COLOURS.window, fillOpacity: 0.6 }),
      ...bandMarks(opts.anchors ?? [], opts.selection),
      ...(bars.length ? [Plot.ruleX(bars, { x: "x", y1: "lo", y2: "hi", stroke: COLOURS.errorBar })] : []),
      Plot.dot(data.filter((d) => !d.inWindow), { x: "x", y: "y", r: 2.6, stroke: COLOURS.faint, fill: "white" }),
      Plot.dot(data.filter((d) => d.inWindow), { x: "x", y: "y", r: 2.6, fill: COLOURS.ink, stroke: null }),
      Plot.line(curve, { x: "x", y: "y", stroke: COLOURS.copper, strokeWidth: 1.8 }),
      Plot.tip(data, Plot.pointer({ x: "x", y: "y", title, fontSize: 12 })),
    ],
  };
}

export interface ResidualRow {
  t: number;
  x: number;
  y: number;
  lo: number | null;
  hi: number | null;
  normalised: number | null;
}

/** Residual rows (C − C_fit)/T in mJ mol⁻¹ K⁻², for the window's points. */
export function residualRows(r: FitPlotData): ResidualRow[] {
  const idx = r.fit.window.indices;
  if (r.fit.residuals.length !== idx.length) throw invalid("fit.residuals", `${r.fit.residuals.length} values`, `the window has ${idx.length} points`);
  const out: ResidualRow[] = [];
  idx.forEach((i, k) => {
    const res = r.fit.residuals[k];
    const t = r.points.temperatureK[i]!;
    if (res === null || res === undefined) return;
    const s = r.points.sigma ? r.points.sigma[i]! : null;
    const y = (res / t) * MJ;
    const sy = s === null ? null : (s / t) * MJ;
    out.push({ t, x: t * t, y, lo: sy === null ? null : y - sy, hi: sy === null ? null : y + sy, normalised: s ? res / s : null });
  });
  return out;
}

/**
 * Residuals (C − C_fit)/T vs T² for the fitted points, with σ/T bars and the zero line. Pass
 * `xDomain` (K²) to line it up with fitPlot.
 */
export function residualPlot(r: FitPlotData, opts: { width?: number; height?: number; xDomain?: [number, number] } = {}): PlotOptions {
  const data = residualRows(r);
  const unit = OVER_T_UNIT;
  const title = (d: ResidualRow) => tipText(`T = ${fmt(d.t)} K\n(C − C_fit)/T = ${fmt(d.y)} ${unit}${d.normalised !== null ? `\n(C − C_fit)/σ = ${fmt(d.normalised)}` : ""}`);
  const bars = data.filter((d) => d.lo !== null);
  return {
    ...frame(opts.width, opts.height ?? 190),
    x: xAxis("T² (K²)", opts.xDomain ? { domain: opts.xDomain, nice: false } : { zero: true }),
    y: yAxis(`(C − C_fit)/T (${unit})`),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.ruleY([0], { stroke: COLOURS.copper }),
      ...(bars.length ? [Plot.ruleX(bars, { x: "x", y1: "lo", y2: "hi", stroke: COLOURS.errorBar })] : []),
      Plot.dot(data, { x: "x", y: "y", r: 2.4, fill: COLOURS.ink, stroke: null }),
      Plot.tip(data, Plot.pointer({ x: "x", y: "y", title, fontSize: 12 })),
    ],
  };
}
