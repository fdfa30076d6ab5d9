/**
 * Display helpers of the notebook (no physics): our revision-state labels, parameter symbols,
 * unit text with superscripts, compact value(σ) in display units (SI × factor, rounding by the
 * engine's formatUncertainty).
 */
import { formatNumber, formatUnit, formatValue, symbolOf } from "@/lib/display";

// One set of words for revision states across the app.
export { STATE_LABEL, when } from "@/app/components/review/labels";
export type { RevisionState } from "@/lib/server/review";

/** Symbol markup of a parameter or quantity (render with <Sym m=…/>). */
export function paramSymbol(name: string): string {
  return symbolOf(name);
}

/** "mJ/(mol*K^2)" → "mJ mol⁻¹ K⁻²"; "mJ*K/mol" → "mJ K mol⁻¹"; "K" → "K"; "1" → "". */
export function unitText(unit: string): string {
  return formatUnit(unit);
}

/** Compact "4.213(25)" of a value and σ in the same unit (the one display rule); "—" for null. */
export function compact(value: number | null | undefined, sigma?: number | null): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return formatValue(value, sigma ?? null, 6);
}

/** A number with `sig` significant figures for labels (no uncertainty). */
export function num(value: number | null | undefined, sig = 4): string {
  return formatNumber(value, sig);
}

export const BASIS_LABEL: Record<string, string> = {
  "formula-unit": "per mole formula unit",
  atom: "per mole of atoms",
  sample: "whole sample",
  specific: "per kilogram",
};

/** ISO → "2026-12-02 14:05 UTC". */
