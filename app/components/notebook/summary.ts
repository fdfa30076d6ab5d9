/**
 * The one-line summary under each step's heading, from its stored result: the numbers a reader
 * looks for first, with units and basis. Display only.
 */
import type { AddendaStepResult, DeriveStepResult, EntropyStepResult, FitStepResult, TransitionStepResult } from "@/lib/charts/notebook";
import { BASIS_LABEL, compact, num, unitText } from "./display";
import { formatCount, formatRange, formatUnit, symbolOf } from "@/lib/display";
import type { StepView } from "./types";
import { formatStatSyst } from "@/lib/engine/scan/statSyst";

const q = (v: { value: number; stdError: number | null } | null | undefined, k = 1) => (v ? compact(v.value * k, v.stdError === null ? null : v.stdError * k) : "—");
/** value(stat)(syst) when a systematic σ is known (a recommended fit), else value(σ). */
const qs = (v: { value: number; stdError: number | null } | null | undefined, syst: number | null | undefined, k = 1) =>
  v && typeof syst === "number" ? `${formatStatSyst(v.value * k, v.stdError === null ? null : v.stdError * k, syst * k)}` : q(v, k);

/** `userModel`: parameters of a user expression are shown by the names the user gave them, not the registry's symbols. */
function fit(r: FitStepResult, userModel = false): string {
  const p = (name: string) => r.fit.parameters.find((x) => x.name === name);
  const g = p("gamma"), b = p("beta");
  const parts: string[] = [];
  const rec = r.recommendation?.recommended ? r.recommendation : null;
  if (g) parts.push(`γ = ${qs(g, rec?.gammaSystematicError, 1e3)} mJ mol⁻¹ K⁻²`);
  if (b) parts.push(`β = ${qs(b, rec?.betaSystematicError, 1e3)} mJ mol⁻¹ K⁻⁴`);
  if (rec) parts.push("(stat)(syst), recommended model and window");
  if (!g && !b) parts.push(r.fit.parameters.slice(0, 3).map((x) => `${userModel ? x.name : symbolOf(x.name)} = ${q(x)}${x.unit ? ` ${unitText(x.unit)}` : ""}`).join(" · "));
  parts.push(`${formatCount(r.window.nPoints, "point")} in ${formatRange(r.window.tMinK, r.window.tMaxK, "K")}`);
  const sigmaKnown = r.weighting?.sigmaKnown ?? r.fit.weighted;
  if (sigmaKnown && r.fit.reducedChiSquare !== null) parts.push(`χ²_red = ${num(r.fit.reducedChiSquare, 3)}`);
  if (!sigmaKnown && r.quality?.residualStdDev != null) parts.push(`residual s.d. ${num(r.quality.residualStdDev * 1e3, 3)} mJ mol⁻¹ K⁻¹`);
  return `${parts.join(" · ")} (${BASIS_LABEL[r.basis]})`;
}

function derive(r: DeriveStepResult): string {
  const by = new Map(r.quantities.map((x) => [x.name, x]));
  const pick = ["thetaD", "dosEF", "massRatio", "lambda"].map((k) => by.get(k)).filter((x) => !!x);
  return pick.map((x) => `${symbolOf(x!.name)} = ${qs(x, x!.systematicError)} ${prettyQuantityUnit(x!.unit)}`.trim()).join(" · ");
}

/** Engine quantity units are written out ("states eV^-1 f.u.^-1"): superscripts only. */
export function prettyQuantityUnit(unit: string): string {
  return formatUnit(unit);
}

/** Step kinds whose summary is built only from our own symbols and numbers (safe to typeset). */
export const TYPESET_SUMMARY = new Set(["fit", "derive", "transition", "entropy"]);

/** Summary text of a computed step, or null when there is nothing to say. */
export function summaryLine(step: StepView): string | null {
  const o = step.output;
  if (!o) return null;
  if (!o.ok) return null;
  const r = o.result as Record<string, unknown>;
  switch (step.kind) {
    case "data": {
      const ms = (r.measurements as { label: string }[]) ?? [];
      const ex = (r.excluded as unknown[])?.length ?? 0;
      return `${formatCount(r.points as number, "point")}, ${formatRange(r.tMinK as number, r.tMaxK as number, "K")}, ${num(r.fieldT as number)} T · ${ms.map((m) => m.label).join(", ")}${ex ? ` · ${formatCount(ex, "point")} left out by hand` : ""} · ${BASIS_LABEL[r.basis as string] ?? r.basis}`;
    }
    case "addenda": {
      const a = r as unknown as AddendaStepResult;
      return `${a.addendaLabel} · ${a.method === "smooth" ? "smoothed" : "interpolated"} · addenda at most ${num(a.maxAddendaFraction * 100, 2)} % of the total`;
    }
    case "normalise": {
      const moles = r.moles as number | null;
      return `${BASIS_LABEL[r.per as string]} · ${r.formula}, M = ${num(r.molarMassGPerMol as number, 6)} g mol⁻¹${moles ? ` · ${num(r.massMg as number, 5)} mg = ${num(moles * 1e3, 5)} mmol` : ""}`;
    }
    case "fit": return fit(r as unknown as FitStepResult, (step.config as { model?: string }).model === "expression");
    case "derive": return derive(r as unknown as DeriveStepResult);
    case "transition": {
      const t = r as unknown as TransitionStepResult;
      return `T_c = ${q(t.tc)} K · ΔC/(γ_n T_c) = ${q(t.jumpRatio)} (BCS weak coupling ${num(t.bcsJumpRatio, 4)})${t.nonSuperconductingFraction ? ` · non-superconducting fraction ${q(t.nonSuperconductingFraction)}` : ""}`;
    }
    case "entropy": {
      const e = r as unknown as EntropyStepResult;
      const k = e.entropy.temperatureK.length - 1;
      if (k < 0) return null;
      return `S(${num(e.entropy.temperatureK[k], 3)} K) = ${compact(e.entropy.values[k]! * 1e3, e.entropy.stdErrors ? e.entropy.stdErrors[k]! * 1e3 : null)} mJ mol⁻¹ K⁻¹ · H − H(0) = ${compact(e.enthalpy.values[k]! * 1e3, e.enthalpy.stdErrors ? e.enthalpy.stdErrors[k]! * 1e3 : null)} mJ mol⁻¹ (${BASIS_LABEL[e.basis]})`;
    }
    case "note": {
      const text = String(r.markdown ?? "").replace(/[#*_`>]/g, "").trim().split("\n")[0] ?? "";
      return text.length > 110 ? `${text.slice(0, 109)}…` : text || null;
    }
    default: return null;
  }
}
