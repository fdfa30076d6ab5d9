/**
 * The data step's chart: C vs T of the chosen measurements as stored (whole sample J K⁻¹ with a
 * prefix, or molar/specific), the chosen temperature range shaded, points outside it faint and
 * points left out by hand drawn as crosses. Each row keeps its measurement id and index so a
 * click can name the point. Display scaling only.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { heatCapacityUnit, maxAbs, type Basis } from "../units";
import { COLOURS, fmt, frame, xAxis, yAxis } from "./frame";

export interface DataSeries {
  id: string;
  label: string;
  basis: Basis;
  temperatureK: readonly number[];
  heatCapacity: readonly number[];
}

export interface DataRow {
  measurementId: string;
  label: string;
  index: number;
  t: number;
  c: number;
  state: "used" | "outside" | "excluded";
  reason: string | null;
}

export interface DataPlotOptions {
  width?: number;
  height?: number;
  log?: boolean;
  tMinK?: number | null;
  tMaxK?: number | null;
  excluded?: readonly { measurementId: string; index: number; reason: string }[];
  anchors?: readonly { xMin: number; xMax: number; label?: string }[];
  selection?: { xMin: number; xMax: number } | null;
}

/** Rows in display units; the unit follows the first series' basis. */
export function dataRows(series: readonly DataSeries[], opts: DataPlotOptions = {}): { rows: DataRow[]; unit: string } {
  const basis = series[0]?.basis ?? "sample";
  const unit = heatCapacityUnit(basis, maxAbs(series.flatMap((s) => s.heatCapacity)));
  const reasons = new Map((opts.excluded ?? []).map((e) => [`${e.measurementId}:${e.index}`, e.reason]));
  const rows: DataRow[] = [];
  for (const s of series) {
    s.temperatureK.forEach((t, index) => {
      const reason = reasons.get(`${s.id}:${index}`) ?? null;
      const outside = (opts.tMinK != null && t < opts.tMinK) || (opts.tMaxK != null && t > opts.tMaxK);
      rows.push({ measurementId: s.id, label: s.label, index, t, c: s.heatCapacity[index]! * unit.factor, state: reason !== null ? "excluded" : outside ? "outside" : "used", reason });
    });
  }
  return { rows, unit: unit.label };
}

/** C vs T (log axes optional) with range, exclusions and discussion bands (x in K). */
export function dataPlot(series: readonly DataSeries[], opts: DataPlotOptions = {}): PlotOptions {
  const { rows, unit } = dataRows(series, opts);
  const shown = opts.log ? rows.filter((d) => d.c > 0) : rows;
  const type = opts.log ? "log" : "linear";
  const lo = opts.tMinK ?? null, hi = opts.tMaxK ?? null;
  const title = (d: DataRow) => `${d.label}, point ${d.index + 1}\nT = ${fmt(d.t)} K\nC = ${fmt(d.c)} ${unit}${d.reason ? `\nleft out: ${d.reason}` : d.state === "outside" ? "\noutside the chosen range" : ""}`;
  return {
    ...frame(opts.width, opts.height ?? 320),
    x: xAxis("T (K)", { type, nice: !opts.log }),
    y: yAxis(`C (${unit})`, { type, nice: !opts.log }),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      ...(lo !== null || hi !== null ? [Plot.rect([{ x1: lo ?? Math.min(...rows.map((d) => d.t)), x2: hi ?? Math.max(...rows.map((d) => d.t)) }], { x1: "x1", x2: "x2", fill: COLOURS.window, fillOpacity: 0.45 })] : []),
      ...(opts.anchors?.length ? [Plot.rect(opts.anchors, { x1: "xMin", x2: "xMax", fill: COLOURS.anchorWash, fillOpacity: 0.75 }), Plot.text(opts.anchors, { x: (d: { xMin: number; xMax: number }) => (d.xMin + d.xMax) / 2, text: (d: { label?: string }) => d.label ?? "", frameAnchor: "top", dy: 4, fill: COLOURS.anchor, fontWeight: 600 })] : []),
      ...(opts.selection ? [Plot.rect([opts.selection], { x1: "xMin", x2: "xMax", fill: COLOURS.anchor, fillOpacity: 0.15, stroke: COLOURS.anchor, strokeDasharray: "4,3" })] : []),
      Plot.dot(shown.filter((d) => d.state === "outside"), { x: "t", y: "c", r: 2.2, stroke: COLOURS.faint, fill: "white" }),
      Plot.dot(shown.filter((d) => d.state === "used"), { x: "t", y: "c", r: 2.2, fill: COLOURS.ink, stroke: null }),
      Plot.dot(shown.filter((d) => d.state === "excluded"), { x: "t", y: "c", r: 4, symbol: "times", stroke: "#8e1b33", strokeWidth: 1.8 }),
      Plot.tip(shown, Plot.pointer({ x: "t", y: "c", title, fontSize: 12 })),
    ],
  };
}
