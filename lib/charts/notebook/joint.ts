/**
 * Charts of the joint fit and γ(H) steps. Joint fit: C/T (mJ mol⁻¹ K⁻²) against T for every
 * measurement with its fitted curve, one colour per field, and the normalised residuals
 * (C − fit)/σ (or C − fit without σ) per field beneath. γ(H): γ(H)/γ_n against H/H_c2 with ±σ
 * and the fitted linear and √H laws. Display only; CSV in SI.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { BASIS_TEXT, COLOURS, fmt, frame, tipText, xAxis, yAxis } from "./frame";
import { writeCsv, type CsvCell } from "../../engine/csv";
import { formatNumber } from "../../display/numbers";
import type { GammaFieldStepResult, JointFitStepResult } from "./types";

const MJ = 1e3;
/** Field colours (ours): dark to copper as the field rises; repeats past eight. */
export const FIELD_COLOURS = ["#1e2431", "#4a6d8c", "#2f5d3a", "#5b4a8a", "#8a6d1e", "#9a4519", "#7a3411", "#4b5263"];

/** "2 T" — a measurement's field as its series name (with the label when two share a field). */
export function fieldName(r: JointFitStepResult, k: number): string {
  const m = r.fit.measurements[k]!;
  const same = r.fit.measurements.filter((x) => x.fieldT === m.fieldT).length > 1;
  return same ? `${formatNumber(m.fieldT, 4)} T (${m.label})` : `${formatNumber(m.fieldT, 4)} T`;
}

export function jointRows(r: JointFitStepResult) {
  const points: { t: number; y: number; series: string; inWindow: boolean }[] = [];
  const curves: { t: number; y: number; series: string }[] = [];
  r.fit.measurements.forEach((m, k) => {
    const series = fieldName(r, k);
    m.temperatureK.forEach((t, i) => points.push({ t, y: (m.heatCapacity[i]! / t) * MJ, series, inWindow: m.inWindow[i]! }));
    m.curve.temperatureK.forEach((t, i) => curves.push({ t, y: (m.curve.heatCapacity[i]! / t) * MJ, series }));
  });
  return { points, curves };
}

function colour(r: JointFitStepResult) {
  const domain = r.fit.measurements.map((_, k) => fieldName(r, k));
  return { domain, range: domain.map((_, k) => FIELD_COLOURS[k % FIELD_COLOURS.length]!), legend: true };
}

/** C/T vs T of every measurement (points in the window filled, outside hollow) with its fitted curve. */
export function jointPlot(r: JointFitStepResult, opts: { width?: number; height?: number; log?: boolean } = {}): PlotOptions {
  const { points, curves } = jointRows(r);
  const log = opts.log ?? false;
  const title = (d: { t: number; y: number; series: string }) => tipText(`${d.series}\nT = ${fmt(d.t)} K\nC/T = ${fmt(d.y)} mJ mol⁻¹ K⁻²`);
  return {
    ...frame(opts.width, opts.height ?? 340),
    x: xAxis("T (K)", { type: log ? "log" : "linear", nice: !log }),
    y: yAxis(`C/T (mJ mol⁻¹ K⁻², ${BASIS_TEXT[r.basis]})`),
    color: colour(r),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.dot(points.filter((d) => d.inWindow), { x: "t", y: "y", r: 2, fill: "series", stroke: null }),
      Plot.dot(points.filter((d) => !d.inWindow), { x: "t", y: "y", r: 2, stroke: "series", fill: "none", strokeOpacity: 0.5 }),
      Plot.line(curves, { x: "t", y: "y", z: "series", stroke: "series", strokeWidth: 1.6 }),
      Plot.tip(points, Plot.pointer({ x: "t", y: "y", title, fontSize: 12 })),
    ],
  };
}

/** Residuals in the window per field: (C − fit)/σ with σ, else C − fit in mJ mol⁻¹ K⁻¹. */
export function jointResidualPlot(r: JointFitStepResult, opts: { width?: number; height?: number; log?: boolean } = {}): PlotOptions {
  const weighted = r.fit.weighted;
  const rows: { t: number; y: number; series: string }[] = [];
  r.fit.measurements.forEach((m, k) => {
    const series = fieldName(r, k);
    m.temperatureK.forEach((t, i) => {
      const res = m.residuals[i];
      if (res === null || res === undefined || !m.inWindow[i]) return;
      rows.push({ t, y: weighted && m.sigma ? res / m.sigma[i]! : res * MJ, series });
    });
  });
  const log = opts.log ?? false;
  return {
    ...frame(opts.width, opts.height ?? 200),
    x: xAxis("T (K)", { type: log ? "log" : "linear", nice: !log }),
    y: yAxis(weighted ? "(C − fit)/σ" : "C − fit (mJ mol⁻¹ K⁻¹)"),
    color: colour(r),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.ruleY([0], { stroke: COLOURS.faint }),
      Plot.dot(rows, { x: "t", y: "y", r: 2, fill: "series", stroke: null }),
      Plot.tip(rows, Plot.pointer({ x: "t", y: "y", title: (d: { t: number; y: number; series: string }) => tipText(`${d.series}\nT = ${fmt(d.t)} K\n${fmt(d.y)}`), fontSize: 12 })),
    ],
  };
}

/** Every point of every measurement: field, T, C, σ, in window, fitted C, residual (SI). */
export function jointCsv(r: JointFitStepResult): string {
  const per = r.basis === "atom" ? "J mol-1 K-1 (per mole of atoms)" : "J mol-1 K-1 (per mole formula unit)";
  const rows: CsvCell[][] = [];
  r.fit.measurements.forEach((m) => m.temperatureK.forEach((t, i) => rows.push([m.index, m.label, m.fieldT, t, m.heatCapacity[i], m.sigma ? m.sigma[i] : null, m.inWindow[i], m.fitted[i] ?? null, m.residuals[i] ?? null])));
  return writeCsv([{ name: "measurement" }, { name: "label" }, { name: "H", unit: "T" }, { name: "T", unit: "K" }, { name: "C", unit: per }, { name: "sigma_C", unit: per }, { name: "in_window" }, { name: "C_fit", unit: per }, { name: "residual_C_minus_fit", unit: per }], rows);
}

/** γ(H)/γ_n vs H/H_c2 with ±σ, the two laws as lines. */
export function gammaFieldPlot(r: GammaFieldStepResult, opts: { width?: number; height?: number } = {}): PlotOptions {
  const pts = r.points.map((p) => ({ h: p.h, y: p.ratio, lo: p.sigma === null ? null : p.ratio - p.sigma, hi: p.sigma === null ? null : p.ratio + p.sigma }));
  const hs = Array.from({ length: 101 }, (_, i) => i / 100);
  const preferred = r.preferred === "linear" ? "linear in H" : "√H";
  const lines = r.laws.flatMap((law) => hs.map((h) => ({ h, y: law.intercept.value + law.slope.value * (law.law === "linear" ? h : Math.sqrt(h)), law: law.law === "linear" ? "linear in H" : "√H" })));
  return {
    ...frame(opts.width, opts.height ?? 300),
    x: xAxis("H/H_c2", { domain: [0, 1] }),
    y: yAxis("γ(H)/γ_n"),
    color: { domain: ["linear in H", "√H"], range: [COLOURS.anchor, COLOURS.copper], legend: true },
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      // the preferred law solid, the other dashed
      Plot.line(lines.filter((d) => d.law === preferred), { x: "h", y: "y", stroke: "law", strokeWidth: 1.8 }),
      Plot.line(lines.filter((d) => d.law !== preferred), { x: "h", y: "y", stroke: "law", strokeWidth: 1.4, strokeDasharray: "5 4" }),
      Plot.ruleX(pts.filter((d) => d.lo !== null), { x: "h", y1: "lo", y2: "hi", stroke: COLOURS.errorBar }),
      Plot.dot(pts, { x: "h", y: "y", r: 3, fill: COLOURS.ink }),
      Plot.tip(pts, Plot.pointer({ x: "h", y: "y", title: (d: { h: number; y: number }) => tipText(`H/H_c2 = ${fmt(d.h)}\nγ(H)/γ_n = ${fmt(d.y)}`), fontSize: 12 })),
    ],
  };
}

export function gammaFieldCsv(r: GammaFieldStepResult): string {
  return writeCsv(
    [{ name: "H", unit: "T" }, { name: "H_over_Hc2" }, { name: "gamma", unit: "J mol-1 K-2" }, { name: "sigma_gamma", unit: "J mol-1 K-2" }, { name: "gamma_over_gamma_n" }, { name: "sigma_ratio" }, { name: "source" }],
    r.fields.map((f, i) => [f.fieldT, r.points[i]!.h, f.gamma, f.stdError, r.points[i]!.ratio, r.points[i]!.sigma, f.from]),
  );
}
