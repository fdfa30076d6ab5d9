/**
 * Chart option builders for one measurement: C vs T (linear or log–log) and C/T vs T², the
 * plot in which C = γT + βT³ is a straight line with intercept γ and slope β. Pure functions
 * from stored points (SI, see ./units) to Observable Plot options; the page's client component
 * calls Plot.plot on them, tests render them with linkedom.
 */
import { formatCount } from "../display/numbers";
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { invalid } from "../engine/errors";
import { heatCapacityOverTUnit, heatCapacityUnit, maxAbs, type Basis } from "./units";

export interface MeasurementSeries {
  temperatureK: readonly number[];
  heatCapacity: readonly number[];
  /** Standard error of each C, same unit as heatCapacity; null when the file had none. */
  sigma: readonly number[] | null;
  /** 1-based source line of each point in the original file (shown on hover). */
  sourceLines?: readonly number[];
  basis: Basis;
}

export interface ChartOptions {
  width?: number;
  height?: number;
  /** C vs T only: logarithmic T and C axes (points with C ≤ 0 are left out and counted in the caption). */
  log?: boolean;
  /** Only points with T ≤ maxTK (K). */
  maxTK?: number;
}

export const INK = "#1e2431";
export const ERROR_BAR = "#b9ad96";
const STYLE = { fontSize: "12px", fontFamily: "inherit", background: "transparent", overflow: "visible" } as const;
/** Margins leave room for the axis labels below and left of the tick labels. */
const FRAME = { marginLeft: 68, marginBottom: 44, marginTop: 16, marginRight: 16, style: STYLE } as const;

interface Row {
  x: number;
  y: number;
  lo: number | null;
  hi: number | null;
  t: number;
  line: number | null;
}

/** Throws InputError when the arrays do not line up (a length mismatch is never silently cut). */
function checkSeries(m: MeasurementSeries): void {
  const n = m.temperatureK.length;
  if (m.heatCapacity.length !== n) throw invalid("heatCapacity", `${m.heatCapacity.length} values`, `temperatureK has ${n}`);
  if (m.sigma && m.sigma.length !== n) throw invalid("sigma", `${m.sigma.length} values`, `temperatureK has ${n}`);
  if (m.sourceLines && m.sourceLines.length !== n) throw invalid("sourceLines", `${m.sourceLines.length} values`, `temperatureK has ${n}`);
}

function fmt(v: number): string {
  return Math.abs(v) >= 1e-3 && Math.abs(v) < 1e5 ? String(Number(v.toPrecision(5))) : v.toExponential(4);
}

function rows(m: MeasurementSeries, maxTK: number | undefined, map: (t: number, c: number, s: number | null) => [number, number, number | null]): Row[] {
  const out: Row[] = [];
  for (let i = 0; i < m.temperatureK.length; i++) {
    const t = m.temperatureK[i]!;
    if (maxTK !== undefined && t > maxTK) continue;
    const [x, y, s] = map(t, m.heatCapacity[i]!, m.sigma ? m.sigma[i]! : null);
    out.push({ x, y, lo: s === null ? null : y - s, hi: s === null ? null : y + s, t, line: m.sourceLines ? m.sourceLines[i]! : null });
  }
  return out;
}

function marks(data: Row[], xName: string, yName: string, unit: string) {
  const bars = data.filter((d) => d.lo !== null && d.hi !== null);
  const title = (d: Row) => `T = ${fmt(d.t)} K\n${xName === "T" ? "" : `${xName} = ${fmt(d.x)} K²\n`}${yName} = ${fmt(d.y)} ${unit}${d.line !== null ? `\nfile line ${d.line}` : ""}`;
  return [
    Plot.frame({ stroke: "#d9cfbc" }),
    ...(bars.length ? [Plot.ruleX(bars, { x: "x", y1: "lo", y2: "hi", stroke: ERROR_BAR })] : []),
    Plot.dot(data, { x: "x", y: "y", r: 2.6, fill: INK, stroke: null }),
    Plot.tip(data, Plot.pointer({ x: "x", y: "y", title, fontSize: 12 })),
  ];
}

/**
 * C vs T. y label "C (<unit>)" per basis (see heatCapacityUnit), x label "T (K)". With
 * `log`, both axes are logarithmic and points with C ≤ 0 (and error bars reaching ≤ 0) are
 * dropped, with a caption saying how many. Throws InputError on mismatched array lengths.
 */
export function heatCapacityPlot(m: MeasurementSeries, opts: ChartOptions = {}): PlotOptions {
  checkSeries(m);
  const unit = heatCapacityUnit(m.basis, maxAbs(m.heatCapacity));
  let data = rows(m, opts.maxTK, (t, c, s) => [t, c * unit.factor, s === null ? null : s * unit.factor]);
  let caption: string | null = null;
  if (opts.log) {
    const kept = data.filter((d) => d.y > 0 && d.x > 0);
    if (kept.length < data.length) caption = `${formatCount(data.length - kept.length, "point")} with C ≤ 0 not shown on log axes`;
    data = kept.map((d) => (d.lo !== null && d.lo <= 0 ? { ...d, lo: null, hi: null } : d));
  }
  return {
    width: opts.width ?? 560,
    height: opts.height ?? 380,
    ...FRAME,
    caption,
    x: { type: opts.log ? "log" : "linear", label: "T (K)", labelAnchor: "center", labelArrow: "none", labelOffset: 38, grid: true, nice: true },
    y: { type: opts.log ? "log" : "linear", label: `C (${unit.label})`, labelAnchor: "center", labelArrow: "none", labelOffset: 56, grid: true, nice: true },
    marks: marks(data, "T", "C", unit.label),
  };
}

/**
 * C/T vs T²: x = T² (K²), y = C/T in mJ mol⁻¹ K⁻² for molar data (see heatCapacityOverTUnit),
 * σ/T as error bars. `maxTK` limits the range to the low-temperature end where the straight
 * line holds. Throws InputError on mismatched array lengths.
 */
export function sommerfeldPlot(m: MeasurementSeries, opts: ChartOptions = {}): PlotOptions {
  checkSeries(m);
  const overT = m.temperatureK.map((t, i) => m.heatCapacity[i]! / t);
  const unit = heatCapacityOverTUnit(m.basis, maxAbs(overT));
  const data = rows(m, opts.maxTK, (t, c, s) => [t * t, (c / t) * unit.factor, s === null ? null : (s / t) * unit.factor]);
  return {
    width: opts.width ?? 560,
    height: opts.height ?? 380,
    ...FRAME,
    x: { label: "T² (K²)", labelAnchor: "center", labelArrow: "none", labelOffset: 38, grid: true, nice: true, zero: true },
    y: { label: `C/T (${unit.label})`, labelAnchor: "center", labelArrow: "none", labelOffset: 56, grid: true, nice: true },
    marks: marks(data, "T²", "C/T", unit.label),
  };
}
