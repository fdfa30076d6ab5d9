/**
 * Charts of the lattice views step: the effective Debye temperature Θ_D(T) with its σ band
 * (points without a Θ_D left out), and C/T³ and (C − γT)/T³ against T (log T by default: the
 * views are for data over decades). Display scaling only: mJ mol⁻¹ K⁻⁴ for C/T³.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { BASIS_TEXT, COLOURS, fmt, frame, xAxis, yAxis } from "./frame";
import { writeCsv } from "../../engine/csv";
import type { LatticeStepResult } from "./types";

const MJ = 1e3;

export function thetaRows(r: LatticeStepResult) {
  const c = r.curve;
  return c.temperatureK.flatMap((t, i) => (c.thetaDK[i] === null ? [] : [{ t, theta: c.thetaDK[i]!, lo: c.thetaDK[i]! - (c.thetaStdErrorK[i] ?? 0), hi: c.thetaDK[i]! + (c.thetaStdErrorK[i] ?? 0) }]));
}

/** Θ_D(T) (K) vs T (K), with ±σ as a band and the low-T Θ_D from β as a dashed rule. */
export function thetaPlot(r: LatticeStepResult, opts: { width?: number; height?: number; log?: boolean } = {}): PlotOptions {
  const rows = thetaRows(r);
  const log = opts.log ?? true;
  const title = (d: { t: number; theta: number; hi: number; lo: number }) => `T = ${fmt(d.t)} K\nΘ_D = ${fmt(d.theta)} K ± ${fmt((d.hi - d.lo) / 2)} K`;
  return {
    ...frame(opts.width, opts.height ?? 300),
    x: xAxis("T (K)", { type: log ? "log" : "linear", nice: !log }),
    y: yAxis("effective Θ_D (K)", { nice: true }),
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      Plot.areaY(rows, { x: "t", y1: "lo", y2: "hi", fill: COLOURS.window, fillOpacity: 0.7 }),
      Plot.line(rows, { x: "t", y: "theta", stroke: COLOURS.copper, strokeWidth: 1.5 }),
      Plot.dot(rows, { x: "t", y: "theta", r: 1.8, fill: COLOURS.copper }),
      ...(r.lowTemperatureThetaDK !== null ? [Plot.ruleY([r.lowTemperatureThetaDK], { stroke: COLOURS.ink, strokeDasharray: "4 3" })] : []),
      Plot.tip(rows, Plot.pointer({ x: "t", y: "theta", title, fontSize: 12 })),
    ],
  };
}

/** (C − γT)/T³ rows, and C/T³ too when `withTotal` (it rises as γ/T² at low T and can dwarf the lattice part). */
export function ratioRows(r: LatticeStepResult, withTotal = false) {
  const c = r.curve;
  return c.temperatureK.flatMap((t, i) => [
    ...(withTotal ? [{ t, y: c.totalOverT3[i]! * MJ, series: "C/T³" }] : []),
    { t, y: c.latticeOverT3[i]! * MJ, series: "(C − γT)/T³" },
  ]);
}

/** C/T³ and (C − γT)/T³ (mJ mol⁻¹ K⁻⁴) vs T (K); the peak, when inside the range, marked. */
export function ratioPlot(r: LatticeStepResult, opts: { width?: number; height?: number; log?: boolean; withTotal?: boolean } = {}): PlotOptions {
  const rows = ratioRows(r, opts.withTotal ?? false);
  const band = opts.withTotal ? [] : r.curve.temperatureK.flatMap((t, i) => (r.curve.ratioStdError[i] === null ? [] : [{ t, lo: (r.curve.latticeOverT3[i]! - r.curve.ratioStdError[i]!) * MJ, hi: (r.curve.latticeOverT3[i]! + r.curve.ratioStdError[i]!) * MJ }]));
  const log = opts.log ?? true;
  const title = (d: { t: number; y: number; series: string }) => `${d.series}\nT = ${fmt(d.t)} K\n${fmt(d.y)} mJ mol⁻¹ K⁻⁴`;
  return {
    ...frame(opts.width, opts.height ?? 300),
    x: xAxis("T (K)", { type: log ? "log" : "linear", nice: !log }),
    y: yAxis(`${opts.withTotal ? "C/T³" : "(C − γT)/T³"} (mJ mol⁻¹ K⁻⁴, ${BASIS_TEXT[r.basis]})`, { nice: true }),
    color: { domain: ["C/T³", "(C − γT)/T³"], range: [COLOURS.faint, COLOURS.copper], legend: true },
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      ...(band.length ? [Plot.areaY(band, { x: "t", y1: "lo", y2: "hi", fill: COLOURS.window, fillOpacity: 0.7 })] : []),
      Plot.line(rows, { x: "t", y: "y", z: "series", stroke: "series", strokeWidth: 1.5 }),
      Plot.dot(rows.filter((d) => d.series !== "C/T³"), { x: "t", y: "y", r: 1.8, fill: COLOURS.copper }),
      ...(r.peak ? [Plot.ruleX([r.peak.temperatureK], { stroke: COLOURS.ink, strokeDasharray: "4 3" })] : []),
      Plot.tip(rows, Plot.pointer({ x: "t", y: "y", title, fontSize: 12 })),
    ],
  };
}

/** Both views as CSV (SI, as stored): T, Θ_D, σ, C/T³, (C − γT)/T³, σ. */
export function latticeCsv(r: LatticeStepResult): string {
  const c = r.curve;
  const per = r.basis === "atom" ? "per mole of atoms" : "per mole formula unit";
  return writeCsv(
    [{ name: "T", unit: "K" }, { name: "theta_D_effective", unit: "K" }, { name: "sigma_theta_D", unit: "K" }, { name: "C_over_T3", unit: `J mol-1 K-4 (${per})` }, { name: "C_minus_gammaT_over_T3", unit: `J mol-1 K-4 (${per})` }, { name: "sigma_C_minus_gammaT_over_T3", unit: `J mol-1 K-4 (${per})` }],
    c.temperatureK.map((t, i) => [t, c.thetaDK[i], c.thetaStdErrorK[i], c.totalOverT3[i], c.latticeOverT3[i], c.ratioStdError[i]]),
  );
}
