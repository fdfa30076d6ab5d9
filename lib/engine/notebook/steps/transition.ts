/**
 * Superconducting-transition step: T_c and ΔC/(γ_n T_c) by the entropy-conserving (equal-area)
 * construction on the data of this chain, with γ_n and β from a normal-state fit step above
 * (fitted above T_c, or in a field above H_c2 — the step records which), and the residual γ.
 */
import { z } from "zod";
import { analyzeJump } from "../../superconductor";
import { InputError } from "../../errors";
import { StepFailure, requireDataset, defineStep } from "./shared";
import { pickFit } from "./derive";
import { toSI } from "../../units/named";

export const transitionConfig = z.object({
  normalFitStepId: z.string().nullable().default(null),
  normalState: z.enum(["above-tc", "field-above-hc2"]).default("above-tc"),
  window: z.object({ tLowK: z.number().positive().optional(), tHighK: z.number().positive().optional() }).partial().default({}),
});
export type TransitionConfig = z.infer<typeof transitionConfig>;

export const transitionStep = defineStep({
  kind: "transition",
  title: "Superconducting transition",
  schema: transitionConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: [] }),
  compute(config, state) {
    const data = requireDataset(state, "the transition step");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("the transition step needs molar data: add a normalisation step above it", "normalFitStepId");
    const fit = pickFit(state, config.normalFitStepId, "the transition step", "normalFitStepId");
    if (fit.basis !== data.basis) throw new StepFailure("the normal-state fit and the data are on different bases (per formula unit vs per atom)", "normalFitStepId");
    const warnings: string[] = [];
    if (config.normalState === "field-above-hc2" && fit.fieldT === 0) warnings.push("the normal-state fit is from zero-field data, but the step says it was measured in a field above H_c2");
    if (config.normalState === "above-tc" && fit.fieldT !== 0) warnings.push(`the normal-state fit is from data in ${fit.fieldT} T: choose "field above H_c2"`);
    try {
      const r = analyzeJump({
        temperatureK: data.temperatureK, heatCapacityJPerMolK: data.heatCapacity, ...(data.sigma ? { stdErrorJPerMolK: data.sigma } : {}),
        gammaN: fit.gamma!, beta: fit.beta!, ...(fit.covGammaBeta !== null ? { covGammaBeta: fit.covGammaBeta } : {}),
        normalState: config.normalState, window: config.window as never,
      });
      return {
        // quantities in SI with their units named (ΔC in J mol⁻¹ K⁻¹, γ_r in J mol⁻¹ K⁻²)
        result: { ...r, deltaC: toSI(r.deltaC), gammaResidual: r.gammaResidual && toSI(r.gammaResidual), fitStepId: fit.stepId, points: { temperatureK: data.temperatureK, cElOverT: data.temperatureK.map((t, i) => (data.heatCapacity[i]! - fit.beta!.value * t ** 3) / t) } },
        warnings: [...warnings, ...r.warnings],
        state,
      };
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
  },
});
