/**
 * Several measurements of one sample on one chart (zero field and in field, sample and addenda):
 * C vs T or C/T vs T², one colour per measurement with a legend. Pure: Plot options from stored
 * points (SI, one basis for all — the caller groups measurements by basis). Each curve is
 * reduced per pixel column for drawing (reduce.ts); the caller says so.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { invalid } from "../engine/errors";
import { reduceForChart } from "./reduce";
import { heatCapacityOverTUnit, heatCapacityUnit, maxAbs, type Basis } from "./units";

export interface OverlaySeries {
  label: string;
  basis: Basis;
  temperatureK: readonly number[];
  heatCapacity: readonly number[];
}

export interface OverlayOptions {
  width?: number;
  view: "c-vs-t" | "ct-vs-t2";
  log?: boolean;
  maxTK?: number;
}

/** Eight colours told apart with the common forms of colour blindness (Okabe–Ito, Nature Methods 8, 441 (2011)). */
export const OVERLAY_COLOURS = ["#000000", "#E69F00", "#56B4E9", "#009E73", "#D55E00", "#0072B2", "#CC79A7", "#8a7a00"];

/** Plot options; throws InputError when the series mix bases or their arrays do not line up. */
export function overlayPlot(series: readonly OverlaySeries[], opts: OverlayOptions): PlotOptions {
  const basis = series[0]?.basis ?? "molar";
  for (const s of series) {
    if (s.basis !== basis) throw invalid("basis", s.basis, `every overlaid measurement must be stored per the same basis (${basis})`);
    if (s.heatCapacity.length !== s.temperatureK.length) throw invalid("heatCapacity", `${s.heatCapacity.length} values`, `temperatureK has ${s.temperatureK.length}`);
  }
  const width = opts.width ?? 640;
  const ct = opts.view === "ct-vs-t2";
  const all = series.flatMap((s) => s.heatCapacity.map((c, i) => (ct ? c / s.temperatureK[i]! : c)));
  const unit = ct ? heatCapacityOverTUnit(basis, maxAbs(all)) : heatCapacityUnit(basis, maxAbs(all));
  const rows: { x: number; y: number; label: string }[] = [];
  for (const s of series) {
    const xs: number[] = [], ys: number[] = [];
    s.temperatureK.forEach((t, i) => {
      if (opts.maxTK !== undefined && t > opts.maxTK) return;
      const c = s.heatCapacity[i]!;
      const x = ct ? t * t : t, y = (ct ? c / t : c) * unit.factor;
      if (opts.log && (x <= 0 || y <= 0)) return;
      xs.push(x); ys.push(y);
    });
    for (const i of reduceForChart(xs, ys, { bins: Math.max(100, Math.round(width)), logX: opts.log && !ct })) rows.push({ x: xs[i]!, y: ys[i]!, label: s.label });
  }
  const type = opts.log && !ct ? "log" : "linear";
  return {
    width, height: 400, marginLeft: 68, marginBottom: 44, marginTop: 16, marginRight: 16,
    style: { fontSize: "12px", fontFamily: "inherit", background: "transparent", overflow: "visible" },
    x: { type, label: ct ? "T² (K²)" : "T (K)", labelAnchor: "center", labelArrow: "none", labelOffset: 38, grid: true, nice: true },
    y: { type, label: `${ct ? "C/T" : "C"} (${unit.label})`, labelAnchor: "center", labelArrow: "none", labelOffset: 56, grid: true, nice: true },
    color: { domain: series.map((s) => s.label), range: OVERLAY_COLOURS, legend: true },
    marks: [Plot.frame({ stroke: "#d9cfbc" }), Plot.dot(rows, { x: "x", y: "y", r: 2.2, fill: "label", stroke: null })],
  };
}
