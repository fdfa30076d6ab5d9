/**
 * Normalisation step: the curve per mole formula unit or per mole of atoms, from the sample's
 * mass and its formula's molar mass (or from molar/specific data as imported).
 */
import { z } from "zod";
import { normalise, changeMolarBasis, specificToMolar } from "../../corrections";
import { InputError } from "../../errors";
import type { Dataset } from "../types";
import { StepFailure, requireDataset, defineStep } from "./shared";

export const normaliseConfig = z.object({
  per: z.enum(["formula-unit", "atom"]).default("formula-unit"),
  /** Overrides the sample's recorded mass (mg) for this analysis only. */
  massMg: z.number().positive().nullable().default(null),
});
export type NormaliseConfig = z.infer<typeof normaliseConfig>;

export const normaliseStep = defineStep({
  kind: "normalise",
  title: "Per-mole normalisation",
  schema: normaliseConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: ["massMg", "molarMassGPerMol", "atomsPerFormulaUnit", "formula"] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "normalisation");
    const { molarMassGPerMol, atomsPerFormulaUnit, formula } = ctx.sample;
    const sigma = data.sigma ?? undefined;
    let t: number[], c: number[], s: number[] | undefined, moles: number | null = null, scale = 0, warnings: string[] = [];
    try {
      if (data.basis === "sample") {
        const massMg = config.massMg ?? ctx.sample.massMg;
        if (!massMg) throw new StepFailure("the sample has no mass: enter it on the sample or in this step", "massMg");
        const r = normalise({ temperatureK: data.temperatureK, heatCapacityJPerK: data.heatCapacity, ...(sigma ? { sigma } : {}) }, { massMg, molarMassGPerMol, atomsPerFormulaUnit, per: config.per });
        [t, c, s, moles, scale, warnings] = [r.temperatureK, r.heatCapacityJPerMolK, r.sigma, r.moles, r.scaleRelativeUncertainty, r.warnings];
      } else if (data.basis === "specific") {
        const r = specificToMolar({ temperatureK: data.temperatureK, heatCapacityJPerKgK: data.heatCapacity, ...(sigma ? { sigma } : {}) }, { molarMassGPerMol, atomsPerFormulaUnit, per: config.per });
        [t, c, s] = [r.temperatureK, r.heatCapacityJPerMolK, r.sigma];
      } else {
        const r = changeMolarBasis({ temperatureK: [...data.temperatureK], heatCapacityJPerMolK: [...data.heatCapacity], ...(sigma ? { sigma: [...sigma] } : {}), per: data.basis }, config.per, atomsPerFormulaUnit);
        [t, c, s] = [r.temperatureK, r.heatCapacityJPerMolK, r.sigma];
      }
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
    const dataset: Dataset = { ...data, temperatureK: t, heatCapacity: c, sigma: s ?? null, basis: config.per };
    return {
      result: { from: data.basis, per: config.per, formula, molarMassGPerMol, atomsPerFormulaUnit, moles, massMg: config.massMg ?? ctx.sample.massMg, scaleRelativeUncertainty: scale },
      warnings,
      state: { ...state, dataset },
    };
  },
});
