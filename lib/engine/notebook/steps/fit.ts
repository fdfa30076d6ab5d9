/**
 * Fit step: a registry model or a user expression over a temperature window, weighted by the
 * data's σ, unweighted, by an assumed relative σ (p % of C) or an assumed absolute σ
 * (fit/weighting.ts), with an optional window scan and a model comparison over the same window.
 * With `recommend`, the model and window are chosen by the model-and-window recommendation
 * (scan/recommend.ts) inside [tMinK, tMaxK], and γ and β carry its systematic σ; when nothing
 * is recommended the step fails with the reason (no fallback window).
 * Needs molar data (after normalisation): γ and β come out per mole formula unit or per atom.
 */
import { z } from "zod";
import { fitHeatCapacity } from "../../fit/heatCapacity";
import { scanWindows, compareModels, recommendFit, DEFAULT_CANDIDATES, type Recommendation } from "../../scan";
import { applyWeighting, describeQuality, type AppliedWeighting } from "../../fit/weighting";
import { MODELS } from "../../models";
import { InputError } from "../../errors";
import type { FitSummary } from "../types";
import { StepFailure, requireDataset, defineStep } from "./shared";
import { modelCurve } from "./curve";
import { packSources } from "../pointSource";

const paramMap = z.record(z.string(), z.number().finite());

export const fitConfig = z.object({
  model: z.string().min(1).default("sommerfeld"),
  /** A mathjs expression over T; used when model is "expression". */
  expression: z.string().max(500).nullable().default(null),
  tMinK: z.number().positive().nullable().default(null),
  tMaxK: z.number().positive().nullable().default(null),
  weighting: z.enum(["sigma", "none", "relative", "absolute"]).default("sigma"),
  /** σ = this % of C, for weighting "relative". */
  relativeSigmaPercent: z.number().positive().max(100).nullable().default(null),
  /** The same σ for every point in J mol⁻¹ K⁻¹ (SI, on the data's molar basis), for weighting "absolute". */
  absoluteSigmaSI: z.number().positive().finite().nullable().default(null),
  /** Choose model and window by the recommendation (inside tMinK…tMaxK) instead of model and window. */
  recommend: z.boolean().default(false),
  scaleErrors: z.boolean().default(false),
  fixed: paramMap.default({}),
  start: paramMap.default({}),
  scan: z.boolean().default(false),
  compare: z.array(z.string()).max(8).default(["sommerfeld", "sommerfeld-t5", "nuclear"]),
});
export type FitConfig = z.infer<typeof fitConfig>;

/** What the fit hands down (the chain fills in stepId). */
function summary(fit: ReturnType<typeof fitHeatCapacity>, basis: FitSummary["basis"], fieldT: number, tMinK: number, tMaxK: number, rec: Recommendation | null): FitSummary {
  const p = (name: string) => fit.parameters.find((x) => x.name === name);
  const g = p("gamma"), b = p("beta");
  const cov = fit.covariance;
  const gi = cov?.names.indexOf("gamma") ?? -1, bi = cov?.names.indexOf("beta") ?? -1;
  return {
    stepId: "", model: fit.model, basis, fieldT, tMinK, tMaxK,
    gamma: g ? { value: g.value, stdError: g.stdError, ...(rec ? { systematicError: rec.gammaSystematicError } : {}) } : null,
    beta: b ? { value: b.value, stdError: b.stdError, ...(rec ? { systematicError: rec.betaSystematicError } : {}) } : null,
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

/** The σ of the fit from the configured weighting; "sigma" on data without σ falls back to unweighted (with a warning). */
export function weightingOf(config: FitConfig, heatCapacity: readonly number[], sigma: readonly number[] | null | undefined): AppliedWeighting {
  if (config.weighting === "relative" && config.relativeSigmaPercent === null) throw new StepFailure("give the relative σ in % of C (weighting by a relative σ)", "relativeSigmaPercent");
  if (config.weighting === "absolute" && config.absoluteSigmaSI === null) throw new StepFailure("give the absolute σ (weighting by an absolute σ)", "absoluteSigmaSI");
  try {
    if (config.weighting === "relative") return applyWeighting(heatCapacity, sigma, { kind: "relative", percent: config.relativeSigmaPercent ?? NaN });
    if (config.weighting === "absolute") return applyWeighting(heatCapacity, sigma, { kind: "absolute", sigma: config.absoluteSigmaSI ?? NaN });
    if (config.weighting === "sigma" && sigma) return applyWeighting(heatCapacity, sigma, { kind: "sigma" });
    return applyWeighting(heatCapacity, sigma, { kind: "none" });
  } catch (err) {
    if (err instanceof InputError) throw new StepFailure(err.message, config.weighting === "relative" ? "relativeSigmaPercent" : "absoluteSigmaSI");
    throw err;
  }
}

/** A compact copy of the recommendation for the step output (the scan plot needs γ per window and candidate). */
function recommendationOutput(rec: Recommendation) {
  const { candidates, ...rest } = rec;
  return {
    ...rest,
    candidates: candidates.map((c) => ({
      model: c.model, title: c.title, acceptableCount: c.acceptableCount,
      cells: c.cells.map((x) => ({ tMinK: x.tMinK, tMaxK: x.tMaxK, nPoints: x.nPoints, gamma: x.gamma, gammaStdError: x.gammaStdError, aicc: x.aicc, acceptable: x.acceptable })),
    })),
  };
}

/** Run the recommendation inside the configured range; StepFailure with its reason when nothing is recommended. */
function recommendation(config: FitConfig, input: { temperatureK: readonly number[]; heatCapacity: readonly number[]; sigma?: readonly number[] }, r: number): Recommendation {
  const keep = input.temperatureK.map((t, i) => i).filter((i) => (config.tMinK === null || input.temperatureK[i]! >= config.tMinK) && (config.tMaxK === null || input.temperatureK[i]! <= config.tMaxK));
  if (keep.length === 0) throw new StepFailure("no points between tMinK and tMaxK", "tMinK");
  const sub = (a: readonly number[]) => keep.map((i) => a[i]!);
  const userModel = config.model === "expression" ? (config.expression ? { expression: config.expression } : undefined) : DEFAULT_CANDIDATES.includes(config.model) ? undefined : config.model;
  try {
    return recommendFit({ temperatureK: sub(input.temperatureK), heatCapacity: sub(input.heatCapacity), ...(input.sigma ? { sigma: sub(input.sigma) } : {}) }, { r, ...(userModel ? { userModel, userStart: config.start } : {}) });
  } catch (err) {
    if (err instanceof InputError) throw new StepFailure(err.message, err.field ?? "recommend");
    throw err;
  }
}

/** √(Σ (C − f)²/dof) from the fit's unweighted residuals [J mol⁻¹ K⁻¹]; null without dof. */
function residualSpread(fit: ReturnType<typeof fitHeatCapacity>): number | null {
  if (!(fit.dof > 0)) return null;
  let ss = 0;
  for (const r of fit.residuals) {
    if (r === null) return null;
    ss += r * r;
  }
  return Math.sqrt(ss / fit.dof);
}

/** Starting values (SI) at the recommendation's own solution for its window. */
function recommendedStart(rec: Recommendation): Record<string, number> | undefined {
  const cell = rec.candidates.find((c) => c.model === rec.model)?.cells.find((c) => c.tMinK === rec.window?.tMinK && c.tMaxK === rec.window?.tMaxK);
  if (!cell) return undefined;
  return { ...cell.extra, ...(cell.gamma !== null ? { gamma: cell.gamma } : {}), ...(cell.beta !== null ? { beta: cell.beta } : {}) };
}

export const fitStep = defineStep({
  kind: "fit",
  title: "Model fit",
  schema: fitConfig,
  initial: { model: "sommerfeld" },
  dependencies: () => ({ measurementIds: [], sampleFields: ["atomsPerFormulaUnit"] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "a fit");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("fit molar data: add a normalisation step above this fit", "model");
    const isExpression = config.model === "expression";
    // (with `recommend`, a recommended registry model replaces config.model below)
    if (isExpression && !config.expression) throw new StepFailure("write the model expression, e.g. g*T + b*T^3", "expression");
    if (!isExpression && !MODELS[config.model as keyof typeof MODELS]) throw new StepFailure(`unknown model ${JSON.stringify(config.model)}`, "model");
    const weighting = weightingOf(config, data.heatCapacity, data.sigma);
    const input = { temperatureK: data.temperatureK, heatCapacity: data.heatCapacity, ...(weighting.sigma ? { sigma: weighting.sigma } : {}) };
    const r = data.basis === "atom" ? 1 : ctx.sample.atomsPerFormulaUnit;
    const rec = config.recommend ? recommendation(config, input, r) : null;
    if (rec && !rec.recommended) throw new StepFailure(rec.reason, "recommend");
    const chosenModel = rec && rec.model !== "expression" ? rec.model! : config.model;
    const fitsExpression = chosenModel === "expression";
    const window = rec
      ? { tMinK: rec.window!.tMinK, tMaxK: rec.window!.tMaxK }
      : { ...(config.tMinK !== null ? { tMinK: config.tMinK } : {}), ...(config.tMaxK !== null ? { tMaxK: config.tMaxK } : {}) };
    const fixed = Object.keys(config.fixed).length ? config.fixed : undefined;
    const common = { ...(fixed ? { fixed } : {}), scaleErrors: config.scaleErrors, r };
    let fit;
    try {
      // under `recommend` every parameter is free (as the recommendation fitted them) and the fit starts at its solution
      const start = rec && rec.model !== "expression" ? recommendedStart(rec) : config.start;
      fit = fitHeatCapacity(input, { ...(rec ? { scaleErrors: config.scaleErrors, r } : common), ...window, model: fitsExpression ? { expression: config.expression! } : chosenModel, start });
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
    const warnings = [...fit.warnings];
    if (rec && fixed) warnings.push(`the recommendation fits every parameter freely: the fixed values (${Object.keys(fixed).join(", ")}) are not used`);
    if (config.weighting === "sigma" && !data.sigma) warnings.push("the data carry no σ: the fit is unweighted and errors are scaled by the residual variance (choose a relative or absolute σ to weight it)");
    const inWindow = new Set(fit.window.indices);
    const lo = data.temperatureK[fit.window.indices[0] ?? 0]!, hi = data.temperatureK[fit.window.indices[fit.window.indices.length - 1] ?? 0]!;
    const span = { tMinK: data.temperatureK[0]!, tMaxK: data.temperatureK[data.temperatureK.length - 1]! };
    let scan = null, comparison = null;
    try {
      if (config.scan && !fitsExpression) scan = scanWindows(input, { model: chosenModel, r, ...(fixed && chosenModel === config.model ? { fixed } : {}), ...scanGrid(data.temperatureK, lo, hi) });
      if (config.compare.length > 1 && !fitsExpression) {
        comparison = compareModels(input, config.compare.filter((m) => MODELS[m as keyof typeof MODELS]), window, common).map(({ fit: f, ...row }) => ({ ...row, gamma: f.parameters.find((p) => p.name === "gamma") ?? null, beta: f.parameters.find((p) => p.name === "beta") ?? null }));
      }
    } catch (err) {
      if (!(err instanceof InputError)) throw err;
      warnings.push(`window scan or model comparison not possible: ${err.message}`);
    }
    const curve = modelCurve(fit, fitsExpression ? config.expression : null, Math.min(lo, span.tMinK), Math.max(hi, span.tMaxK));
    const residualStdDev = residualSpread(fit);
    const handed = summary(fit, data.basis, data.fieldT, lo, hi, rec);
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
        fitVariable: "C(T)",
        weighting: { kind: weighting.kind, sigmaKnown: weighting.sigmaKnown, text: weighting.text, relativeSigmaPercent: config.weighting === "relative" ? config.relativeSigmaPercent : null, absoluteSigmaSI: config.weighting === "absolute" ? config.absoluteSigmaSI : null },
        quality: { reducedChiSquare: weighting.sigmaKnown ? fit.reducedChiSquare : null, residualStdDev, text: describeQuality(weighting.sigmaKnown, fit.reducedChiSquare, residualStdDev) },
        recommendation: rec ? recommendationOutput(rec) : null,
        // γ and β as handed down (with the systematic σ of a recommended fit), for readers of the stored output (series)
        summary: handed,
      },
      warnings,
      state: { ...state, fit: handed },
    };
  },
});
