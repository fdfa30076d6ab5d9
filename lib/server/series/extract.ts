/**
 * The reported values of one analysis revision, read from its stored step outputs.
 *
 * Reading rules (what the notebook's steps store; tolerant of the shapes named here):
 *  - derive step (last one with ok output): `result.quantities` — engine Quantity objects
 *    (deriveAll: gamma, beta [mJ mol⁻¹ K⁻², mJ mol⁻¹ K⁻⁴], thetaD [K], dosEF [states eV⁻¹],
 *    massRatio [1]) with `result.basis` "formula-unit" | "atom".
 *  - fit step (last ok): γ and β in SI from `result.summary`, `result.gamma`/`result.beta`
 *    ({value, stdError}) or `result.parameters[]` (FitParameter, unit "J/(mol K^2)" or "mJ/…");
 *    used when there is no derive step, and then Θ_D and D(E_F) are derived here with the engine.
 *  - transition step (last ok): `result.tc` (Quantity, K) or a quantity named "tc".
 * Everything is reported per mole FORMULA UNIT (per-atom values × r), so members compare.
 */
import { debyeTemperature, densityOfStates, MILLI_PER_UNIT } from "../../engine/derived";

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

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);

function valued(v: unknown, factor = 1): Valued | null {
  if (!isObj(v) || typeof v.value !== "number" || !Number.isFinite(v.value)) return null;
  const s = typeof v.stdError === "number" && Number.isFinite(v.stdError) ? v.stdError * factor : null;
  const sys = typeof v.systematicError === "number" && Number.isFinite(v.systematicError) ? Math.abs(v.systematicError * factor) : null;
  return sys === null ? { value: v.value * factor, stdError: s } : { value: v.value * factor, stdError: s, systematicError: sys };
}

function lastResult(steps: readonly StepLike[], kind: string): Obj | null {
  const ok = steps.filter((s) => s.kind === kind && isObj(s.output) && s.output.ok === true && isObj(s.output.result)).sort((a, b) => b.position - a.position);
  return ok.length ? ((ok[0]!.output as Obj).result as Obj) : null;
}

function quantityNamed(result: Obj, name: string): Obj | null {
  const list = Array.isArray(result.quantities) ? result.quantities : isObj(result.derived) && Array.isArray(result.derived.quantities) ? result.derived.quantities : [];
  return (list as unknown[]).find((q): q is Obj => isObj(q) && q.name === name) ?? null;
}

/** Unit factor to mJ for a fit parameter's unit text; SI (J…) unless it starts with "mJ". */
function toMilli(unit: unknown): number {
  return typeof unit === "string" && unit.trim().startsWith("mJ") ? 1 : MILLI_PER_UNIT;
}

function fitCoefficient(result: Obj, name: "gamma" | "beta"): Valued | null {
  const summary = isObj(result.summary) ? result.summary : result;
  const direct = valued(summary[name], MILLI_PER_UNIT);
  if (direct) return direct;
  const params = Array.isArray(result.parameters) ? result.parameters : isObj(result.fit) && Array.isArray(result.fit.parameters) ? result.fit.parameters : [];
  const p = (params as unknown[]).find((q): q is Obj => isObj(q) && q.name === name);
  return p ? valued(p, toMilli(p.unit)) : null;
}

function fitBasis(result: Obj): string {
  const summary = isObj(result.summary) ? result.summary : result;
  return typeof summary.basis === "string" ? summary.basis : "formula-unit";
}

/** Values of one revision from its steps; atoms per formula unit r converts per-atom values. */
export function valuesFromSteps(steps: readonly StepLike[], atomsPerFormulaUnit: number): RevisionValues {
  const out: RevisionValues = { gamma: null, beta: null, thetaD: null, dosEF: null, massRatio: null, tc: null, source: null };
  const derive = lastResult(steps, "derive");
  if (derive) {
    const perFu = derive.basis === "atom" ? atomsPerFormulaUnit : 1;
    out.gamma = valued(quantityNamed(derive, "gamma"), perFu);
    out.beta = valued(quantityNamed(derive, "beta"), perFu);
    out.thetaD = valued(quantityNamed(derive, "thetaD"));
    out.dosEF = valued(quantityNamed(derive, "dosEF"), perFu);
    out.massRatio = valued(quantityNamed(derive, "massRatio"));
    if (out.gamma) out.source = "derive";
  }
  const fit = lastResult(steps, "fit");
  if (fit && !out.gamma) fromFit(out, fit, atomsPerFormulaUnit);
  const transition = lastResult(steps, "transition");
  if (transition) out.tc = valued(transition.tc) ?? valued(quantityNamed(transition, "tc"));
  return out;
}

function fromFit(out: RevisionValues, fit: Obj, r: number): void {
  const perFu = fitBasis(fit) === "atom" ? r : 1;
  const g = fitCoefficient(fit, "gamma");
  const b = fitCoefficient(fit, "beta");
  const perFormula = (v: Valued): Valued => ({ ...v, value: v.value * perFu, stdError: v.stdError === null ? null : v.stdError * perFu, ...(typeof v.systematicError === "number" ? { systematicError: v.systematicError * perFu } : {}) });
  out.gamma = g && perFormula(g);
  out.beta = b && perFormula(b);
  if (out.gamma) out.source = "fit";
  const si = (v: Valued) => ({ value: v.value / MILLI_PER_UNIT, stdError: v.stdError === null ? null : v.stdError / MILLI_PER_UNIT });
  if (out.beta && out.beta.value > 0 && !out.thetaD) out.thetaD = valued(debyeTemperature(si(out.beta), r));
  if (out.gamma && !out.dosEF) out.dosEF = valued(densityOfStates(si(out.gamma), "f.u."));
}
