/**
 * γ(H) step of a superconductor: γ(H)/γ_n against H/H_c2, with the linear law (fully gapped)
 * and the √H law (line nodes) fitted and compared by AICc (superconductor/gammaField.ts), and
 * the cautions on what that comparison can show.
 *
 * γ(H) per field from a joint fit above with γ per measurement (the nearest, or the one named),
 * fields below H_c2; single fit steps named in `fitStepIds` add their (field, γ). γ_n from, in
 * this order: the fit step named in `normalFitStepId`, the value typed in `gammaNMJ`, or the
 * weighted mean of the joint fit's γ at fields ≥ H_c2. Needs H_c2 at the measuring temperature.
 */
import { z } from "zod";
import { analyseGammaField } from "../../superconductor/gammaField";
import { InputError } from "../../errors";
import type { ChainState, JointFitSummary } from "../types";
import { StepFailure, defineStep } from "./shared";

const measured = z.object({ value: z.number().finite().positive(), stdError: z.number().finite().min(0).nullable().default(null) });

export const gammaFieldConfig = z.object({
  /** Upper critical field H_c2 at the measuring temperature, tesla. */
  hc2T: z.number().positive().nullable().default(null),
  /** The joint fit with γ per measurement; null: the nearest one above. */
  jointFitStepId: z.string().nullable().default(null),
  /** Single fit steps above that add one (field, γ) point each. */
  fitStepIds: z.array(z.string()).max(40).default([]),
  /** γ_n from this fit step (normal state). */
  normalFitStepId: z.string().nullable().default(null),
  /** γ_n typed in mJ mol⁻¹ K⁻² (same basis as the fits). */
  gammaNMJ: measured.nullable().default(null),
});
export type GammaFieldConfig = z.infer<typeof gammaFieldConfig>;

interface FieldPoint { fieldT: number; gamma: number; stdError: number | null; from: string }

function jointFitOf(state: ChainState, id: string | null): JointFitSummary | null {
  if (id) {
    const named = state.jointFits?.[id];
    if (!named) throw new StepFailure("the chosen joint fit is not above this step", "jointFitStepId");
    return named;
  }
  return state.jointFit ?? null;
}

export const gammaFieldStep = defineStep({
  kind: "gamma-field",
  title: "γ(H) of a superconductor",
  schema: gammaFieldConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: [] }),
  compute(config, state) {
    if (config.hc2T === null) throw new StepFailure("give H_c2 at the measuring temperature (tesla)", "hc2T");
    const hc2 = config.hc2T;
    const joint = jointFitOf(state, config.jointFitStepId);
    const points: FieldPoint[] = [];
    const normal: FieldPoint[] = [];
    let basis: string | null = null;
    if (joint) {
      if (joint.shared.gamma) throw new StepFailure("γ is shared in that joint fit: fit it per measurement (leave gamma out of the shared parameters)", "jointFitStepId");
      if (!joint.measurements.every((m) => m.parameters.gamma)) throw new StepFailure(`the joint fit (model ${joint.model}) has no γ per measurement`, "jointFitStepId");
      basis = joint.basis;
      for (const m of joint.measurements) {
        const g = m.parameters.gamma!;
        (m.fieldT < hc2 ? points : normal).push({ fieldT: m.fieldT, gamma: g.value, stdError: g.stdError, from: m.label });
      }
    }
    for (const id of config.fitStepIds) {
      const f = state.fits[id];
      if (!f) throw new StepFailure("a chosen fit step is not above this step", "fitStepIds");
      if (!f.gamma) throw new StepFailure(`the chosen fit (model ${f.model}) has no γ`, "fitStepIds");
      if (basis !== null && f.basis !== basis) throw new StepFailure("the fits are on different bases (per formula unit vs per atom)", "fitStepIds");
      basis ??= f.basis;
      (f.fieldT < hc2 ? points : normal).push({ fieldT: f.fieldT, gamma: f.gamma.value, stdError: f.gamma.stdError, from: `fit over ${f.tMinK.toPrecision(3)}–${f.tMaxK.toPrecision(3)} K` });
    }
    if (!joint && config.fitStepIds.length === 0) throw new StepFailure("γ(H) needs a joint fit above with γ per measurement, or fit steps chosen here", "jointFitStepId");
    let gammaN: { value: number; stdError: number | null }, gammaNFrom: string;
    if (config.normalFitStepId) {
      const f = state.fits[config.normalFitStepId];
      if (!f) throw new StepFailure("the chosen normal-state fit is not above this step", "normalFitStepId");
      if (!f.gamma) throw new StepFailure(`the chosen normal-state fit (model ${f.model}) has no γ`, "normalFitStepId");
      if (basis !== null && f.basis !== basis) throw new StepFailure("the normal-state fit is on another basis than the γ(H) points", "normalFitStepId");
      gammaN = f.gamma;
      gammaNFrom = f.model.startsWith("joint ") ? `the normal-state joint fit (fields from ${f.fieldT} T)` : `the normal-state fit in ${f.fieldT} T`;
    } else if (config.gammaNMJ) {
      gammaN = { value: config.gammaNMJ.value * 1e-3, stdError: config.gammaNMJ.stdError === null ? null : config.gammaNMJ.stdError * 1e-3 };
      gammaNFrom = "the value given";
    } else if (normal.length) {
      const withSigma = normal.every((p) => p.stdError !== null && p.stdError > 0);
      const w = normal.map((p) => (withSigma ? 1 / p.stdError! ** 2 : 1));
      const sw = w.reduce((a, b) => a + b, 0);
      const mean = normal.reduce((a, p, i) => a + w[i]! * p.gamma, 0) / sw;
      gammaN = { value: mean, stdError: withSigma ? 1 / Math.sqrt(sw) : null };
      gammaNFrom = `the ${normal.length === 1 ? "fit" : "weighted mean of the fits"} at ${normal.map((p) => p.fieldT).join(", ")} T ≥ H_c2`;
    } else {
      throw new StepFailure("give γ_n: a normal-state fit, a value, or a measurement at or above H_c2 in the joint fit", "normalFitStepId");
    }
    points.sort((a, b) => a.fieldT - b.fieldT);
    const sigmaKnown = points.every((p) => p.stdError !== null && p.stdError > 0);
    try {
      const analysis = analyseGammaField({
        fieldT: points.map((p) => p.fieldT), gamma: points.map((p) => p.gamma), sigma: sigmaKnown ? points.map((p) => p.stdError!) : null,
        gammaN, hc2T: hc2,
      });
      const warnings: string[] = [];
      if (!sigmaKnown) warnings.push("some γ(H) carry no σ: both laws are fitted unweighted");
      if (points.length < 4) warnings.push(`${points.length} fields below H_c2: AICc needs at least four; the laws are compared by χ² only`);
      if (analysis.deltaAicc !== null && analysis.deltaAicc < 2) warnings.push(`ΔAICc = ${analysis.deltaAicc.toFixed(2)} < 2: the data do not prefer either law`);
      return {
        result: { ...analysis, hc2T: hc2, gammaN, gammaNFrom, basis: basis ?? "formula-unit", jointFitStepId: joint?.stepId ?? null, fields: points },
        warnings,
        state,
      };
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field === "hc2T" ? "hc2T" : err.field === "gammaN" ? "normalFitStepId" : "jointFitStepId");
      throw err;
    }
  },
});
