/**
 * Addenda step: subtract the empty-platform (+ grease) curve, interpolated or smoothed onto the
 * sample temperatures, with σ propagated. Works on the whole-sample curve (J/K), before
 * normalisation.
 */
import { z } from "zod";
import { subtractAddenda } from "../../corrections";
import { InputError } from "../../errors";
import type { Dataset } from "../types";
import { StepFailure, requireDataset, thinCurve, defineStep } from "./shared";

export const addendaConfig = z.object({
  addendaMeasurementId: z.string().min(1, "choose the addenda measurement"),
  method: z.enum(["linear", "smooth"]).default("smooth"),
  smoothingDegree: z.number().int().min(1).max(12).nullable().default(null),
  outsideRange: z.enum(["refuse", "flag"]).default("flag"),
});
export type AddendaConfig = z.infer<typeof addendaConfig>;

export const addendaStep = defineStep({
  kind: "addenda",
  title: "Addenda subtraction",
  schema: addendaConfig,
  dependencies: (c) => ({ measurementIds: [c.addendaMeasurementId], sampleFields: [] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "the addenda step");
    if (data.basis !== "sample") throw new StepFailure("addenda are subtracted from the whole-sample curve (J/K): put this step before normalisation", "addendaMeasurementId");
    const add = ctx.measurements[config.addendaMeasurementId];
    if (!add) throw new StepFailure("the addenda measurement is not available to this analysis", "addendaMeasurementId");
    if (add.basis !== "sample") throw new StepFailure(`${add.label} is not a whole-platform curve in J/K`, "addendaMeasurementId");
    let r;
    try {
      r = subtractAddenda(
        { temperatureK: data.temperatureK, heatCapacityJPerK: data.heatCapacity, ...(data.sigma ? { sigma: data.sigma } : {}) },
        { temperatureK: add.temperatureK, heatCapacityJPerK: add.heatCapacity, ...(add.sigma ? { sigma: add.sigma } : {}) },
        { method: config.method, ...(config.smoothingDegree !== null ? { smoothingDegree: config.smoothingDegree } : {}), outsideRange: config.outsideRange },
      );
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
    const dataset: Dataset = {
      ...data,
      temperatureK: r.temperatureK,
      heatCapacity: r.heatCapacityJPerK,
      sigma: r.sigma ?? null,
      source: r.sourceIndex.map((i) => data.source[i]!),
    };
    const total = r.sourceIndex.map((i) => data.heatCapacity[i]!);
    const fractions = r.addendaJPerK.map((a, k) => a / total[k]!);
    return {
      result: {
        addendaLabel: add.label,
        method: config.method,
        provenance: r.provenance,
        excluded: r.excluded,
        maxAddendaFraction: Math.max(...fractions),
        // For the plot: at most 600 points, evenly by index (the chain below uses every point).
        curve: thinCurve({ temperatureK: r.temperatureK, totalJPerK: total, addendaJPerK: r.addendaJPerK, netJPerK: r.heatCapacityJPerK }),
        curvePoints: r.temperatureK.length,
      },
      warnings: r.warnings,
      state: { ...state, dataset },
    };
  },
});
