/**
 * Display helpers of the notebook (no physics): our revision-state labels, parameter symbols,
 * unit text with superscripts, compact value(σ) in display units (SI × factor, rounding by the
 * engine's formatUncertainty).
 */
import { STEP_KINDS, formatNumber, formatUnit, formatValue, symbolOf } from "@/lib/display";

// One set of words for revision states across the app.
export { STATE_LABEL, when } from "@/app/components/review/labels";
export type { RevisionState } from "@/lib/server/review";

/** Step kinds in words: the display vocabulary's (lib/display). */
export const KIND_LABEL: Record<string, string> = Object.fromEntries(Object.entries(STEP_KINDS).map(([k, t]) => [k, t.label]));

export const KIND_HINT: Record<string, string> = {
  data: "choose measurements, range, points left out",
  addenda: "subtract the empty-platform curve",
  normalise: "per mole formula unit or per mole of atoms",
  fit: "a model over a temperature window",
  derive: "Θ_D, D(E_F), m*/m, λ … from γ and β",
  transition: "T_c and the jump by equal areas",
  entropy: "S(T) and H(T) − H(0)",
  note: "text for the group (Markdown)",
};

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
