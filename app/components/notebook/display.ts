/**
 * Display helpers of the notebook (no physics): our revision-state labels, parameter symbols,
 * unit text with superscripts, compact value(σ) in display units (SI × factor, rounding by the
 * engine's formatUncertainty).
 */
import { formatUncertainty } from "@/lib/engine/units/format";
import { prettyUnit } from "@/lib/charts/notebook";
import { fmtNumber } from "@/app/_lib/format";

// One set of words for revision states across the app.
export { STATE_LABEL, when } from "@/app/components/review/labels";
export type { RevisionState } from "@/lib/server/review";

export const KIND_LABEL: Record<string, string> = {
  data: "Data",
  addenda: "Addenda subtraction",
  normalise: "Per-mole normalisation",
  fit: "Model fit",
  derive: "Derived quantities",
  transition: "Superconducting transition",
  entropy: "Entropy and enthalpy",
  note: "Note",
};

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

const SYMBOL: Record<string, string> = { gamma: "γ", beta: "β", delta: "δ", epsilon: "ε", thetaD: "Θ_D", thetaE: "Θ_E", A: "A_N", B: "B", delta0: "Δ", tc: "T_c", gammaN: "γ_n" };

export function paramSymbol(name: string): string {
  return SYMBOL[name] ?? name;
}

/** "mJ/(mol*K^2)" → "mJ mol⁻¹ K⁻²"; "mJ*K/mol" → "mJ K mol⁻¹"; "K" → "K". */
export function unitText(unit: string): string {
  if (!unit || unit === "1") return "";
  const [num, den] = unit.split("/", 2) as [string, string | undefined];
  const tokens = (s: string) => s.replace(/[()]/g, "").split(/[*\s]+/).filter(Boolean);
  const up = tokens(num).filter((t) => t !== "1").map((t) => prettyUnit(t));
  const down = den ? tokens(den).map((t) => {
    const [base, e] = t.split("^") as [string, string | undefined];
    return prettyUnit(`${base}^-${e ?? "1"}`);
  }) : [];
  return [...up, ...down].join(" ");
}

/** Compact "4.213(25)" of a value and σ in the same unit; "—" for null. */
export function compact(value: number | null | undefined, sigma?: number | null): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (sigma === null || sigma === undefined || sigma === 0) return fmtNumber(value, 6);
  try {
    return formatUncertainty(value, sigma ?? null, { exponent: "times" });
  } catch {
    return formatUncertainty(value, null, { exponent: "times" });
  }
}

/** A number with 4 significant figures for labels (no uncertainty). */
export function num(value: number | null | undefined, sig = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return compact(Number(value.toPrecision(sig)));
}

export const BASIS_LABEL: Record<string, string> = {
  "formula-unit": "per mole formula unit",
  atom: "per mole of atoms",
  sample: "whole sample",
  specific: "per kilogram",
};

/** ISO → "2026-12-02 14:05 UTC". */
