/**
 * Shared look of the notebook charts: our palette, margins, axis label style, and the number
 * text used in hover read-outs. Display only.
 */
import type { PlotOptions, ScaleOptions } from "@observablehq/plot";
import { formatNumber } from "../../display/numbers";
import { plainSymbol } from "../../display/typeset";

export const COLOURS = {
  ink: "#1e2431",
  faint: "#9aa0ab",
  errorBar: "#b9ad96",
  copper: "#9a4519",
  window: "#f0d9c4",
  anchor: "#4a6d8c",
  anchorWash: "#d5e1ec",
  plateau: "#2f5d3a",
  addenda: "#5b4a8a",
  frame: "#d9cfbc",
} as const;

const STYLE = { fontSize: "12px", fontFamily: "inherit", background: "transparent", overflow: "visible" } as const;

/** Width, height, margins and style common to every notebook chart. */
export function frame(width: number | undefined, height: number): Pick<PlotOptions, "width" | "height" | "marginLeft" | "marginBottom" | "marginTop" | "marginRight" | "style"> {
  return { width: width ?? 560, height, marginLeft: 68, marginBottom: 44, marginTop: 18, marginRight: 18, style: STYLE };
}

/** An axis with its label centred under/beside it, e.g. axis("T² (K²)"). */
export function axis(label: string, extra: ScaleOptions = {}): ScaleOptions {
  return { label, labelAnchor: "center", labelArrow: "none", grid: true, nice: true, ...extra };
}

export const xAxis = (label: string, extra: ScaleOptions = {}) => axis(label, { labelOffset: 38, ...extra });
export const yAxis = (label: string, extra: ScaleOptions = {}) => axis(label, { labelOffset: 56, ...extra });

/** Five significant figures, "× 10ⁿ" outside 10⁻³ … 10⁵ (the display rule, lib/display). */
export function fmt(v: number | null | undefined): string {
  return formatNumber(v, 5);
}

/** Hover text of our own (no people's labels in it): symbol markup as plain Unicode ("T_max" → "Tmax"). */
export const tipText = (s: string) => plainSymbol(s);

/** "mJ mol^-1 K^-2" → "mJ mol⁻¹ K⁻²" (unit text from the engine, for display). */
export function prettyUnit(unit: string): string {
  const sup: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
  if (unit === "1") return "";
  return unit.replace(/\^(-?\d+)/g, (_, e: string) => [...e].map((c) => sup[c] ?? c).join(""));
}

export const BASIS_TEXT = { "formula-unit": "per mole formula unit", atom: "per mole of atoms" } as const;
