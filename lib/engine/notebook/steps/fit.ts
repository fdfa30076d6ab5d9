/**
 * Fit step: a registry model or a user expression over a temperature window, weighted by the
 * data's σ (or not), with an optional window scan and a model comparison over the same window.
 * Needs molar data (after normalisation): γ and β come out per mole formula unit or per atom.
 */
import { z } from "zod";
import { fitHeatCapacity } from "../../fit/heatCapacity";
import { scanWindows, compareModels } from "../../scan";
import { MODELS } from "../../models";
import { InputError } from "../../errors";
import type { FitSummary } from "../types";
import { StepFailure, requireDataset, type StepDefinition } from "./shared";
import { modelCurve } from "./curve";
import { packSources } from "../pointSource";

const paramMap = z.record(z.string(), z.number().finite());

export const fitConfig = z.object({
  model: z.string().min(1).default("sommerfeld"),
  /** A mathjs expression over T; used when model is "expression". */
  expression: z.string().max(500).nullable().default(null),
  tMinK: z.number().positive().nullable().default(null),
  tMaxK: z.number().positive().nullable().default(null),
  weighting: z.enum(["sigma", "none"]).default("sigma"),
  scaleErrors: z.boolean().default(false),
  fixed: paramMap.default({}),
  start: paramMap.default({}),
  scan: z.boolean().default(false),
  compare: z.array(z.string()).max(8).default(["sommerfeld", "sommerfeld-t5", "nuclear"]),
});
export type FitConfig = z.infer<typeof fitConfig>;

/** What the fit hands down (the chain fills in stepId). */
function summary(fit: ReturnType<typeof fitHeatCapacity>, basis: FitSummary["basis"], fieldT: number, tMinK: number, tMaxK: number): FitSummary {
  const p = (name: string) => fit.parameters.find((x) => x.name === name);
  const g = p("gamma"), b = p("beta");
  const cov = fit.covariance;
  const gi = cov?.names.indexOf("gamma") ?? -1, bi = cov?.names.indexOf("beta") ?? -1;
  return {
    stepId: "", model: fit.model, basis, fieldT, tMinK, tMaxK,
    gamma: g ? { value: g.value, stdError: g.stdError } : null,
    beta: b ? { value: b.value, stdError: b.stdError } : null,
    covGammaBeta: cov && gi >= 0 && bi >= 0 ? (cov.matrix[gi]![bi] ?? null) : null,
  };
}

/**
 * The scan grid around the chosen window (our choice for the notebook): lower edges from the
 * lowest point up to the middle of the window, upper edges from there to 1.5 × the window's
 * upper edge — data temperatures, at most 16 of each, so the scan asks "does γ hold if the
 * window moves or shrinks?" without fitting far outside the range a physicist would use.
 */
function scanGrid(T: readonly number[], lo: number, hi: number): { tMinGridK: number[]; tMaxGridK: number[] } {
  const mid = (lo + hi) / 2;
  const pick = (a: number, b: number) => {
    const inside = T.filter((t) => t >= a && t <= b);
    if (inside.length <= 16) return inside;
    return Array.from({ length: 16 }, (_, k) => inside[Math.round((k * (inside.length - 1)) / 15)]!);
  };
  return { tMinGridK: [...new Set(pick(T[0]!, mid))], tMaxGridK: [...new Set(pick(mid, Math.min(1.5 * hi, T[T.length - 1]!)))] };
}

export const fitStep: StepDefinition<FitConfig> = {
  kind: "fit",
  title: "Model fit",
  schema: fitConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: ["atomsPerFormulaUnit"] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "a fit");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("fit molar data: add a normalisation step above this fit", "model");
    const isExpression = config.model === "expression";
    if (isExpression && !config.expression) throw new StepFailure("write the model expression, e.g. g*T + b*T^3", "expression");
    if (!isExpression && !MODELS[config.model as keyof typeof MODELS]) throw new StepFailure(`unknown model ${JSON.stringify(config.model)}`, "model");
    const input = { temperatureK: data.temperatureK, heatCapacity: data.heatCapacity, ...(config.weighting === "sigma" && data.sigma ? { sigma: data.sigma } : {}) };
    const r = data.basis === "atom" ? 1 : ctx.sample.atomsPerFormulaUnit;
    const window = { ...(config.tMinK !== null ? { tMinK: config.tMinK } : {}), ...(config.tMaxK !== null ? { tMaxK: config.tMaxK } : {}) };
    const fixed = Object.keys(config.fixed).length ? config.fixed : undefined;
    const common = { ...(fixed ? { fixed } : {}), scaleErrors: config.scaleErrors, r };
    let fit;
    try {
      fit = fitHeatCapacity(input, { ...common, ...window, model: isExpression ? { expression: config.expression! } : config.model, start: config.start });
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
    const warnings = [...fit.warnings];
    if (config.weighting === "sigma" && !data.sigma) warnings.push("the data carry no σ: the fit is unweighted and errors are scaled by the residual variance");
    const inWindow = new Set(fit.window.indices);
    const lo = data.temperatureK[fit.window.indices[0] ?? 0]!, hi = data.temperatureK[fit.window.indices[fit.window.indices.length - 1] ?? 0]!;
    const span = { tMinK: data.temperatureK[0]!, tMaxK: data.temperatureK[data.temperatureK.length - 1]! };
    let scan = null, comparison = null;
    try {
      if (config.scan && !isExpression && fit.model !== "expression") scan = scanWindows(input, { model: config.model, r, ...(fixed ? { fixed } : {}), ...scanGrid(data.temperatureK, lo, hi) });
      if (config.compare.length > 1 && !isExpression) {
        comparison = compareModels(input, config.compare.filter((m) => MODELS[m as keyof typeof MODELS]), window, common).map(({ fit: f, ...row }) => ({ ...row, gamma: f.parameters.find((p) => p.name === "gamma") ?? null, beta: f.parameters.find((p) => p.name === "beta") ?? null }));
      }
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      warnings.push(`window scan or model comparison not possible: ${err.message}`);
    }
    const curve = modelCurve(fit, isExpression ? config.expression : null, Math.min(lo, span.tMinK), Math.max(hi, span.tMaxK));
    return {
      result: {
        fit,
        basis: data.basis,
        window: { tMinK: lo, tMaxK: hi, requestedMinK: config.tMinK, requestedMaxK: config.tMaxK, nPoints: fit.window.nPoints },
        points: {
          temperatureK: data.temperatureK, heatCapacity: data.heatCapacity, sigma: data.sigma,
          inWindow: data.temperatureK.map((_, i) => inWindow.has(i)), source: packSources(data.source),
        },
        curve,
        scan,
        comparison,
      },
      warnings,
      state: { ...state, fit: summary(fit, data.basis, data.fieldT, lo, hi) },
    };
  },
};
