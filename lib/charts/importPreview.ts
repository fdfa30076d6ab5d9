/**
 * The curve of a file being imported, drawn before anything is stored: C against T and C/T
 * against T², in the file's own units (the units chosen in the mapping), so that a misread
 * column or a wrong unit is seen at once. Pure: Plot options from plain arrays.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { INK } from "./measurement";

export interface PreviewCurve {
  temperature: readonly number[];
  heatCapacity: readonly number[];
  line: readonly number[];
}

const STYLE = { fontSize: "12px", fontFamily: "inherit", background: "transparent", overflow: "visible" } as const;
const FRAME = { marginLeft: 68, marginBottom: 44, marginTop: 12, marginRight: 14, style: STYLE } as const;

/** Unit text with ASCII exponents written as superscripts ("K^2" → "K²", "K-1" → "K⁻¹"). */
export function typesetUnit(unit: string): string {
  const sup: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
  return unit.replace(/\^?(-?\d+)/g, (m, e: string, offset: number, all: string) => (offset > 0 && /[A-Za-zµμ)]/.test(all[offset - 1]!) ? [...e].map((c) => sup[c] ?? c).join("") : m));
}

function frame(width: number, xLabel: string, yLabel: string): Omit<PlotOptions, "marks"> {
  return {
    width, height: 260, ...FRAME,
    x: { label: xLabel, labelAnchor: "center", labelArrow: "none", labelOffset: 38, grid: true, nice: true },
    y: { label: yLabel, labelAnchor: "center", labelArrow: "none", labelOffset: 56, grid: true, nice: true },
  };
}

/** C vs T in the file's units. */
export function previewHeatCapacityPlot(c: PreviewCurve, units: { temperature: string; heatCapacity: string }, width: number): PlotOptions {
  const data = c.temperature.map((t, i) => ({ x: t, y: c.heatCapacity[i]!, line: c.line[i]! }));
  return {
    ...frame(width, `T (${typesetUnit(units.temperature)})`, `C (${typesetUnit(units.heatCapacity)})`),
    marks: [Plot.frame({ stroke: "#d9cfbc" }), Plot.dot(data, { x: "x", y: "y", r: 2, fill: INK, stroke: null, title: (d: { line: number }) => `file line ${d.line}` })],
  };
}

/** C/T vs T² in the file's units; rows with T ≤ 0 are left out (they are listed as invalid rows). */
export function previewSommerfeldPlot(c: PreviewCurve, units: { temperature: string; heatCapacity: string }, width: number): PlotOptions {
  const data = c.temperature.flatMap((t, i) => (t > 0 ? [{ x: t * t, y: c.heatCapacity[i]! / t, line: c.line[i]! }] : []));
  const tu = typesetUnit(units.temperature);
  return {
    ...frame(width, `T² (${tu}²)`, `C/T (${typesetUnit(units.heatCapacity)} / ${tu})`),
    marks: [Plot.frame({ stroke: "#d9cfbc" }), Plot.dot(data, { x: "x", y: "y", r: 2, fill: INK, stroke: null, title: (d: { line: number }) => `file line ${d.line}` })],
  };
}
