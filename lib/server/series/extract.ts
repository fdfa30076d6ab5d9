/**
 * The reported values of one analysis revision, read from its stored step outputs, typed by the
 * engine's registry (StepResult of each kind) — no guessing of shapes.
 *
 *  - derive step (last computed one): its quantities (deriveAll: gamma, beta in the unit each
 *    quantity names, thetaD [K], dosEF [states eV⁻¹], massRatio [1]) and its basis.
 *  - fit step (last computed one), when there is no derive step: γ and β in SI from the summary it
 *    hands down (FitSummary), or — for outputs stored before the summary existed — its fit's
 *    parameters (SI by the engine's contract); Θ_D and D(E_F) are then derived here.
 *  - transition step (last computed one): T_c.
 * A value whose unit is not one named below is left out rather than converted by a guess.
 * Everything is reported per mole FORMULA UNIT (per-atom values × r), so members compare.
 */
import { debyeTemperature, densityOfStates, MILLI_PER_UNIT } from "../../engine/derived";
import type { StepKind, StepResult } from "../../engine/notebook/registry";
import { toTrade } from "../../engine/units/named";

export interface Valued {
  value: number;
  stdError: number | null;
  /** Systematic σ (window and model dependence of the fit), when the fit came from a recommendation. */
  systematicError?: number | null;
}

export interface RevisionValues {
  /** mJ mol⁻¹ K⁻² per mole formula unit. */
  gamma: Valued | null;
  /** mJ mol⁻¹ K⁻⁴ per mole formula unit. */
  beta: Valued | null;
  /** K */
  thetaD: Valued | null;
  /** states eV⁻¹ per formula unit, both spins. */
  dosEF: Valued | null;
  massRatio: Valued | null;
  /** K */
  tc: Valued | null;
  /** Where γ came from: "derive" or "fit" step, or null when no step gave it. */
  source: "derive" | "fit" | null;
}

export interface StepLike {
  kind: string;
  position: number;
  output: unknown;
}

type Pair = { value: number; stdError: number | null; systematicError?: number | null };

function valued(v: Pair | null | undefined, factor = 1): Valued | null {
  if (!v || typeof v.value !== "number" || !Number.isFinite(v.value)) return null;
  const s = typeof v.stdError === "number" && Number.isFinite(v.stdError) ? v.stdError * factor : null;
  const sys = typeof v.systematicError === "number" && Number.isFinite(v.systematicError) ? Math.abs(v.systematicError * factor) : null;
  return sys === null ? { value: v.value * factor, stdError: s } : { value: v.value * factor, stdError: s, systematicError: sys };
}

/** The result of the last computed step of `kind` (by position). */
function lastResult<K extends StepKind>(steps: readonly StepLike[], kind: K): StepResult<K> | null {
  const ok = steps.filter((s) => s.kind === kind && typeof s.output === "object" && s.output !== null && (s.output as { ok?: unknown }).ok === true).sort((a, b) => b.position - a.position);
  return ok.length ? ((ok[0]!.output as { result: StepResult<K> }).result ?? null) : null;
}

/**
 * Factor to the series unit (mJ mol⁻¹ K⁻² for γ, mJ mol⁻¹ K⁻⁴ for β) from a unit as the engine
 * names it; null for a unit not listed here (the value is then not reported).
 */
const TO_MILLI: Readonly<Record<string, number>> = {
  "mJ mol^-1 K^-2": 1, "mJ/(mol*K^2)": 1, "J mol^-1 K^-2": MILLI_PER_UNIT, "J/(mol*K^2)": MILLI_PER_UNIT,
  "mJ mol^-1 K^-4": 1, "mJ/(mol*K^4)": 1, "J mol^-1 K^-4": MILLI_PER_UNIT, "J/(mol*K^4)": MILLI_PER_UNIT,
};
function milliFactor(unit: string): number | null {
  return Object.hasOwn(TO_MILLI, unit) ? TO_MILLI[unit]! : null;
}

/** Values of one revision from its steps; atoms per formula unit r converts per-atom values. */
export function valuesFromSteps(steps: readonly StepLike[], atomsPerFormulaUnit: number): RevisionValues {
  const out: RevisionValues = { gamma: null, beta: null, thetaD: null, dosEF: null, massRatio: null, tc: null, source: null };
  const derive = lastResult(steps, "derive");
  if (derive) {
    const perFu = derive.basis === "atom" ? atomsPerFormulaUnit : 1;
    // in the trade's units (stored SI since engine 0.4, in these units before)
    const named = (name: string) => { const q = derive.quantities.find((x) => x.name === name); return q ? toTrade(q) : null; };
    const coefficient = (name: "gamma" | "beta") => {
      const q = named(name);
      const k = q ? milliFactor(q.unit) : null;
      return q && k !== null ? valued(q, k * perFu) : null;
    };
    out.gamma = coefficient("gamma");
    out.beta = coefficient("beta");
    out.thetaD = valued(named("thetaD"));
    out.dosEF = valued(named("dosEF"), perFu);
    out.massRatio = valued(named("massRatio"));
    if (out.gamma) out.source = "derive";
  }
  const fit = lastResult(steps, "fit");
  if (fit && !out.gamma) fromFit(out, fit, atomsPerFormulaUnit);
  const transition = lastResult(steps, "transition");
  if (transition) out.tc = valued(transition.tc);
  return out;
}

/** γ and β (SI) of a fit step's output: the summary it hands down, else its fit's parameters. */
function fitCoefficients(fit: StepResult<"fit">): { basis: string; gamma: Pair | null; beta: Pair | null } {
  if (fit.summary) return { basis: fit.summary.basis, gamma: fit.summary.gamma, beta: fit.summary.beta };
  const p = (name: string) => fit.fit?.parameters.find((x) => x.name === name) ?? null;
  return { basis: fit.basis ?? "formula-unit", gamma: p("gamma"), beta: p("beta") };
}

function fromFit(out: RevisionValues, fit: StepResult<"fit">, r: number): void {
  const c = fitCoefficients(fit);
  const perFu = c.basis === "atom" ? r : 1;
  out.gamma = valued(c.gamma, MILLI_PER_UNIT * perFu);
  out.beta = valued(c.beta, MILLI_PER_UNIT * perFu);
  if (out.gamma) out.source = "fit";
  const si = (v: Valued) => ({ value: v.value / MILLI_PER_UNIT, stdError: v.stdError === null ? null : v.stdError / MILLI_PER_UNIT });
  if (out.beta && out.beta.value > 0 && !out.thetaD) out.thetaD = valued(debyeTemperature(si(out.beta), r));
  if (out.gamma && !out.dosEF) out.dosEF = valued(densityOfStates(si(out.gamma), "f.u."));
}
