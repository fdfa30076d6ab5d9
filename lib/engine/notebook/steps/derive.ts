/**
 * Derived-quantities step: Θ_D, D(E_F), the free-electron comparison and m* / m, and — given the
 * optional inputs — λ, McMillan T_c, the Wilson and Kadowaki–Woods ratios, from the γ and β of
 * a fit step above (the nearest, unless one is named), with σ through their covariance.
 */
import { z } from "zod";
import { deriveAll } from "../../derived";
import { parseFormula, electronsPerFormulaUnit } from "../../chemistry";
import { InputError } from "../../errors";
import type { ChainState, FitSummary } from "../types";
import { StepFailure, defineStep } from "./shared";
import { withSystematic, type Quantity } from "../../uncertainty/quantity";
import { toSI } from "../../units/named";

/**
 * The fit's systematic σ (from the model-and-window recommendation) carried to γ, β and what
 * scales with them: D(E_F) and m* / m ∝ γ keep γ's relative systematic σ, Θ_D ∝ β^(−1/3) a third
 * of β's. Quantities of a fit without a recommendation are returned unchanged.
 */
function carrySystematic(quantities: readonly Quantity[], fit: FitSummary): readonly Quantity[] {
  const rel = (m: FitSummary["gamma"]) => (m && m.systematicError !== undefined && m.systematicError !== null && m.value !== 0 ? Math.abs(m.systematicError / m.value) : null);
  const g = rel(fit.gamma), b = rel(fit.beta);
  if (g === null && b === null) return quantities;
  const byName: Record<string, number | null> = { gamma: g, beta: b, thetaD: b === null ? null : b / 3, dosEF: g, massRatio: g };
  return quantities.map((q) => (Object.hasOwn(byName, q.name) ? withSystematic(q, byName[q.name]!) : q));
}

const measured = z.object({ value: z.number().finite(), stdError: z.number().finite().min(0).nullable().default(null) });

export const deriveConfig = z.object({
  fitStepId: z.string().nullable().default(null),
  basis: z.enum(["formula-unit", "atom"]).default("formula-unit"),
  densityGPerCm3: z.number().positive().nullable().default(null),
  valences: z.record(z.string(), z.number().min(0).max(8)).default({}),
  /** Band-structure γ in mJ mol⁻¹ K⁻² per mole formula unit. */
  gammaBandMJ: measured.nullable().default(null),
  muStar: z.number().min(0).max(0.5).nullable().default(null),
  tcK: z.number().positive().nullable().default(null),
  chi: measured.extend({ unit: z.enum(["m3/mol", "emu/mol"]) }).nullable().default(null),
  /** Resistivity coefficient A in μΩ cm K⁻². */
  kwA: measured.nullable().default(null),
});
export type DeriveConfig = z.infer<typeof deriveConfig>;

/**
 * The fit whose γ and β a step uses: the one named, or else the nearest fit above that has γ and
 * β (a user-expression fit with other parameter names is passed over).
 */
export function pickFit(state: ChainState, stepId: string | null, what: string, field = "fitStepId"): FitSummary {
  if (stepId) {
    const named = state.fits[stepId];
    if (!named) throw new StepFailure("the chosen fit step is not above this step", field);
    if (!named.gamma || !named.beta) throw new StepFailure(`the chosen fit (model ${named.model}) has no γ and β`, field);
    return named;
  }
  if (state.fit?.gamma && state.fit.beta) return state.fit;
  const withGammaBeta = Object.values(state.fits).filter((f) => f.gamma && f.beta);
  const fit = withGammaBeta[withGammaBeta.length - 1];
  if (!fit) throw new StepFailure(state.fit ? `the fit above (model ${state.fit.model}) has no γ and β: name them gamma and beta, or choose a fit step` : `${what} needs a fit step above it`, field);
  return fit;
}

export const deriveStep = defineStep({
  kind: "derive",
  title: "Derived quantities",
  schema: deriveConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: ["formula", "molarMassGPerMol", "atomsPerFormulaUnit", "densityGPerCm3", "valences"] }),
  compute(config, state, ctx) {
    const fit = pickFit(state, config.fitStepId, "derived quantities");
    const r = ctx.sample.atomsPerFormulaUnit;
    // deriveAll takes γ and β per mole formula unit.
    const k = fit.basis === "atom" ? r : 1;
    const scale = (m: { value: number; stdError: number | null }) => ({ value: m.value * k, stdError: m.stdError === null ? null : m.stdError * k });
    const mJ = (m: { value: number; stdError: number | null }) => ({ value: m.value * 1e-3, stdError: m.stdError === null ? null : m.stdError * 1e-3 });
    const valences = { ...ctx.sample.valences, ...config.valences };
    const density = config.densityGPerCm3 ?? ctx.sample.densityGPerCm3;
    try {
      const chem = parseFormula(ctx.sample.formula);
      const result = deriveAll({
        gamma: scale(fit.gamma!), beta: scale(fit.beta!), ...(fit.covGammaBeta !== null ? { covGammaBeta: fit.covGammaBeta * k * k } : {}),
        formula: { atomsPerFormulaUnit: r, molarMassGPerMol: ctx.sample.molarMassGPerMol, electronsPerFormulaUnit: electronsPerFormulaUnit(chem.elements, valences), label: ctx.sample.formula },
        basis: config.basis,
        ...(density ? { free: { densityGPerCm3: density } } : {}),
        ...(config.gammaBandMJ ? { gammaBand: mJ(config.gammaBandMJ) } : {}),
        ...(config.muStar !== null ? { muStar: config.muStar } : {}),
        ...(config.tcK !== null ? { tcK: config.tcK } : {}),
        ...(config.chi ? { chi: config.chi } : {}),
        ...(config.kwA ? { kwA: config.kwA } : {}),
      });
      const warnings = [...result.warnings];
      if (!density) warnings.push("no density on the sample: the free-electron comparison (γ_free, m* / m) is left out");
      return {
        result: { fitStepId: fit.stepId, fitModel: fit.model, fitWindow: { tMinK: fit.tMinK, tMaxK: fit.tMaxK }, fieldT: fit.fieldT, basis: result.basis, quantities: carrySystematic(result.quantities, fit).map(toSI), valences, densityGPerCm3: density },
        warnings,
        state,
      };
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
  },
});
