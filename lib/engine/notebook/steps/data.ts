/**
 * Data step: which measurements of the sample, the temperature range, and points left out by
 * hand (each with the reason kept). Points of several measurements are merged in T order.
 */
import { z } from "zod";
import type { ChainContext, ChainState, Dataset } from "../types";
import { StepFailure, defineStep } from "./shared";

export const dataConfig = z.object({
  measurementIds: z.array(z.string().min(1)).min(1, "choose at least one measurement"),
  tMinK: z.number().positive().nullable().default(null),
  tMaxK: z.number().positive().nullable().default(null),
  excluded: z.array(z.object({ measurementId: z.string(), index: z.number().int().min(0), reason: z.string().trim().min(1, "say why the point is left out").max(500) })).default([]),
});
export type DataConfig = z.infer<typeof dataConfig>;

function basisOf(b: "sample" | "molar" | "specific"): Dataset["basis"] {
  return b === "molar" ? "formula-unit" : b;
}

export const dataStep = defineStep({
  kind: "data",
  title: "Data selection",
  schema: dataConfig,
  dependencies: (c) => ({ measurementIds: c.measurementIds, sampleFields: [] }),
  compute(config, state: ChainState, ctx: ChainContext) {
    if (config.tMinK !== null && config.tMaxK !== null && config.tMinK >= config.tMaxK) throw new StepFailure("the lower temperature bound must be below the upper one", "tMinK");
    const ms = config.measurementIds.map((id) => {
      const m = ctx.measurements[id];
      if (!m) throw new StepFailure(`measurement ${id} is not one of this sample's`, "measurementIds");
      if (m.kind !== "sample") throw new StepFailure(`${m.label} is an addenda measurement; choose it in an addenda step`, "measurementIds");
      return m;
    });
    const basis = basisOf(ms[0]!.basis);
    if (ms.some((m) => basisOf(m.basis) !== basis)) throw new StepFailure("the chosen measurements are on different bases (per sample, per mole, per mass)", "measurementIds");
    const fields = new Set(ms.map((m) => m.fieldT));
    const warnings: string[] = [];
    if (fields.size > 1) warnings.push(`the chosen measurements were taken in different fields (${[...fields].join(", ")} T): fit them together with a joint fit step, or one field at a time`);
    const excluded = new Set(config.excluded.map((e) => `${e.measurementId}:${e.index}`));
    const rows: { t: number; c: number; s: number | null; id: string; i: number }[] = [];
    let outOfRange = 0;
    for (const m of ms) {
      for (let i = 0; i < m.temperatureK.length; i++) {
        const t = m.temperatureK[i]!;
        if ((config.tMinK !== null && t < config.tMinK) || (config.tMaxK !== null && t > config.tMaxK)) { outOfRange++; continue; }
        if (excluded.has(`${m.id}:${i}`)) continue;
        rows.push({ t, c: m.heatCapacity[i]!, s: m.sigma ? m.sigma[i]! : null, id: m.id, i });
      }
    }
    if (rows.length === 0) throw new StepFailure("no points are left in the chosen range", "tMinK");
    rows.sort((a, b) => a.t - b.t);
    const withSigma = ms.every((m) => m.sigma);
    if (!withSigma && ms.some((m) => m.sigma)) warnings.push("only some measurements carry σ: the fit will be unweighted");
    const dataset: Dataset = {
      temperatureK: rows.map((r) => r.t),
      heatCapacity: rows.map((r) => r.c),
      sigma: withSigma ? rows.map((r) => r.s!) : null,
      basis,
      fieldT: ms[0]!.fieldT,
      source: rows.map((r) => ({ measurementId: r.id, index: r.i })),
      measurements: ms.map((m) => ({ id: m.id, label: m.label, fieldT: m.fieldT })),
    };
    return {
      result: {
        points: rows.length, outOfRange, excluded: config.excluded, basis, fieldT: dataset.fieldT,
        tMinK: dataset.temperatureK[0], tMaxK: dataset.temperatureK[dataset.temperatureK.length - 1],
        measurements: ms.map((m) => ({ id: m.id, label: m.label, fieldT: m.fieldT })),
      },
      warnings,
      // Fits above stay available (e.g. a normal-state fit for a transition step further down).
      state: { ...state, dataset },
    };
  },
});
