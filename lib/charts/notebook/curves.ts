/**
 * Charts of the correction and thermodynamics steps: addenda (total, addenda, net vs T, log
 * axes by default since the curves span decades), the superconducting transition (C_el/T vs T
 * with the idealised equal-area step), entropy S(T) and enthalpy H(T) − H(0) with their σ band.
 * Display scaling only (prefixes chosen from the data).
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { heatCapacityUnit, maxAbs } from "../units";
import { BASIS_TEXT, COLOURS, fmt, frame, tipText, xAxis, yAxis } from "./frame";
import type { AddendaStepResult, EntropyStepResult, TransitionStepResult } from "./types";

const SERIES = ["total", "addenda", "net"] as const;

export interface AddendaRow {
  t: number;
  c: number;
  series: (typeof SERIES)[number];
}

/** Long-format rows (display unit from the largest total, e.g. µJ K⁻¹). */
export function addendaRows(r: AddendaStepResult): { rows: AddendaRow[]; unit: string } {
  const unit = heatCapacityUnit("sample", maxAbs(r.curve.totalJPerK));
  const rows: AddendaRow[] = [];
  const cols = { total: r.curve.totalJPerK, addenda: r.curve.addendaJPerK, net: r.curve.netJPerK };
  for (const s of SERIES) r.curve.temperatureK.forEach((t, i) => rows.push({ t, c: cols[s][i]! * unit.factor, series: s }));
  return { rows, unit: unit.label };
}

/** Total, addenda and net heat capacity of the whole sample (J K⁻¹ with a prefix) vs T (K). */
export function addendaPlot(r: AddendaStepResult, opts: { width?: number; height?: number; log?: boolean } = {}): PlotOptions {
  const { rows, unit } = addendaRows(r);
  const log = opts.log ?? true;
  const shown = log ? rows.filter((d) => d.c > 0) : rows;
  const title = (d: AddendaRow) => `${d.series}\nT = ${fmt(d.t)} K\nC = ${fmt(d.c)} ${unit}`;
  return {
    ...frame(opts.width, opts.height ?? 320),
    x: xAxis("T (K)", { type: log ? "log" : "linear", nice: !log }),
    y: yAxis(`C (${unit}, whole sample)`, { type: log ? "log" : "linear", nice: !log }),
    color: { domain: [...SERIES], range: [COLOURS.ink, COLOURS.addenda, COLOURS.copper], legend: true },
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.line(shown, { x: "t", y: "c", z: "series", stroke: "series", strokeWidth: 1.5 }),
      Plot.dot(shown.filter((d) => d.series !== "addenda"), { x: "t", y: "c", r: 1.8, fill: "series" }),
      Plot.tip(shown, Plot.pointer({ x: "t", y: "c", title, fontSize: 12 })),
    ],
  };
}

const MJ = 1e3;

/**
 * C_el/T = (C − βT³)/T (mJ mol⁻¹ K⁻²) vs T (K): the data, the idealised equal-area curve with its
 * vertical step at T_c, T_c as a dashed rule and the construction window shaded.
 */
export function transitionPlot(r: TransitionStepResult, opts: { width?: number; height?: number; basis?: "formula-unit" | "atom" } = {}): PlotOptions {
  const data = r.points.temperatureK.map((t, i) => ({ t, y: r.points.cElOverT[i]! * MJ }));
  const ideal = r.idealised.temperatureK.map((t, i) => ({ t, y: r.idealised.cElOverT[i]! * MJ }));
  const tc = r.tc.value;
  const basis = opts.basis ? `, ${BASIS_TEXT[opts.basis]}` : "";
  return {
    ...frame(opts.width, opts.height ?? 320),
    x: xAxis("T (K)"),
    y: yAxis(`C_el/T (mJ mol⁻¹ K⁻²${basis})`),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.rect([{ x1: r.windows.lowerK, x2: r.windows.upperK }], { x1: "x1", x2: "x2", fill: COLOURS.window, fillOpacity: 0.45 }),
      Plot.ruleX([tc], { stroke: COLOURS.copper, strokeDasharray: "5,4" }),
      Plot.text([tc], { x: (d: number) => d, text: () => `T_c = ${fmt(tc)} K`, frameAnchor: "top", dy: 6, dx: 6, textAnchor: "start", fill: COLOURS.copper, fontWeight: 600 }),
      Plot.dot(data, { x: "t", y: "y", r: 2.2, fill: COLOURS.ink, stroke: null }),
      Plot.line(ideal, { x: "t", y: "y", stroke: COLOURS.copper, strokeWidth: 2 }),
      Plot.tip(data, Plot.pointer({ x: "t", y: "y", title: (d: { t: number; y: number }) => tipText(`T = ${fmt(d.t)} K\nC_el/T = ${fmt(d.y)} mJ mol⁻¹ K⁻²`), fontSize: 12 })),
    ],
  };
}

export interface IntegralRow {
  t: number;
  v: number;
  lo: number | null;
  hi: number | null;
}

/** S (mJ mol⁻¹ K⁻¹) or H − H(0) (mJ mol⁻¹) rows. */
export function integralRows(r: EntropyStepResult, which: "entropy" | "enthalpy"): IntegralRow[] {
  const c = r[which];
  return c.temperatureK.map((t, i) => {
    const v = c.values[i]! * MJ;
    const s = c.stdErrors ? c.stdErrors[i]! * MJ : null;
    return { t, v, lo: s === null ? null : v - s, hi: s === null ? null : v + s };
  });
}

/**
 * S(T) or H(T) − H(0) vs T with the ±σ band and the 0 → T_min part (from the fit) marked at
 * T_min. `log` puts both axes on log scales (S ≈ γT at the low end: slope 1).
 */
export function integralPlot(r: EntropyStepResult, which: "entropy" | "enthalpy", opts: { width?: number; height?: number; log?: boolean } = {}): PlotOptions {
  const rows = integralRows(r, which);
  const unit = which === "entropy" ? "mJ mol⁻¹ K⁻¹" : "mJ mol⁻¹";
  const name = which === "entropy" ? "S" : "H − H(0)";
  const type = opts.log ? "log" : "linear";
  const shown = opts.log ? rows.filter((d) => d.v > 0 && d.t > 0) : rows;
  const band = shown.filter((d) => d.lo !== null && (!opts.log || d.lo > 0));
  const first = shown[0];
  return {
    ...frame(opts.width, opts.height ?? 280),
    x: xAxis("T (K)", { type }),
    y: yAxis(`${name} (${unit}, ${BASIS_TEXT[r.basis]})`, { type }),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      ...(band.length ? [Plot.areaY(band, { x: "t", y1: "lo", y2: "hi", fill: COLOURS.window, fillOpacity: 0.8 })] : []),
      Plot.line(shown, { x: "t", y: "v", stroke: COLOURS.ink, strokeWidth: 1.6 }),
      ...(first ? [Plot.dot([first], { x: "t", y: "v", r: 4, fill: COLOURS.copper }), Plot.text([first], { x: "t", y: "v", text: () => "below T_min: from the fit", dx: 8, textAnchor: "start", fill: COLOURS.copper })] : []),
      Plot.tip(shown, Plot.pointer({ x: "t", y: "v", title: (d: IntegralRow) => `T = ${fmt(d.t)} K\n${name} = ${fmt(d.v)}${d.lo !== null ? ` ± ${fmt(d.v - d.lo)}` : ""} ${unit}`, fontSize: 12 })),
    ],
  };
}
