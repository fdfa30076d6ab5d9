/**
 * Joint fit step: one model fitted to every measurement of the chain's curve at once (the data
 * step chose them, typically one sample in several fields), each with its applied field H and
 * window; parameters shared by all measurements or fitted per measurement (fit/joint.ts).
 * Needs molar data. Hands down a JointFitSummary (for the γ(H) step), and — when γ and β are
 * both shared, as in a normal-state fit across fields above H_c2 — a fit summary, so derived
 * quantities and the transition step can use them.
 */
import { z } from "zod";
import { fitJoint, JOINT_MODELS, type JointMeasurement } from "../../fit";
import { parameterSpecOf } from "../../fit/jointModels";
import { MODELS } from "../../models";
import { InputError } from "../../errors";
import type { FitSummary, JointFitSummary } from "../types";
import { StepFailure, requireDataset, defineStep } from "./shared";

const paramMap = z.record(z.string(), z.number().finite());
const edge = z.number().positive().nullable().default(null);

export const jointFitConfig = z.object({
  /** A joint model (JOINT_MODELS), a single-curve registry model, or "expression". */
  model: z.string().min(1).default("normal-state"),
  /** A mathjs expression over T and H with the constants R, kB, muB, NA; used when model is "expression". */
  expression: z.string().max(500).nullable().default(null),
  /** Names of the parameters shared by all measurements; null: the model's own choice. */
  shared: z.array(z.string().min(1).max(40)).max(20).nullable().default(null),
  /** Window for every measurement (K), inclusive. */
  tMinK: edge,
  tMaxK: edge,
  /** Windows of single measurements, by measurement id (override the common window). */
  windows: z.record(z.string(), z.object({ tMinK: edge, tMaxK: edge })).default({}),
  /** SI; keys "name" (shared, or every measurement) or "name#k" (k = the measurement's position, from 1). */
  fixed: paramMap.default({}),
  start: paramMap.default({}),
  scaleErrors: z.boolean().default(false),
});
export type JointFitConfig = z.infer<typeof jointFitConfig>;

/** The parameter key named in an engine error field ("start.g#3" → "start"). */
function configField(field: string | undefined): string | undefined {
  if (!field) return undefined;
  const head = field.split(/[.[]/)[0]!;
  return head === "measurements" ? "windows" : head === "model" || head === "shared" || head === "start" || head === "fixed" ? head : undefined;
}

/** Display symbol of each parameter from its model's spec; a user expression's parameters keep their names. */
function symbolsOf(model: string, names: readonly string[]): Record<string, string> {
  return Object.fromEntries(names.map((n) => [n, parameterSpecOf(model, n)?.symbol ?? n]));
}

export const jointFitStep = defineStep({
  kind: "joint-fit",
  title: "Joint fit across fields",
  schema: jointFitConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: ["atomsPerFormulaUnit"] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "a joint fit");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("fit molar data: add a normalisation step above this joint fit", "model");
    const isExpression = config.model === "expression";
    if (isExpression && !config.expression) throw new StepFailure("write the model expression, e.g. g*T + b*T^3 + a*H^2/T^2", "expression");
    if (!isExpression && !Object.hasOwn(JOINT_MODELS, config.model) && !Object.hasOwn(MODELS, config.model)) throw new StepFailure(`unknown model ${JSON.stringify(config.model)}`, "model");
    // The curve's points by measurement, in the data step's order (each in T order, as the curve is).
    const order = data.measurements ?? [...new Set(data.source.map((s) => s.measurementId))].map((id) => ({ id, label: ctx.measurements[id]?.label ?? id, fieldT: ctx.measurements[id]?.fieldT ?? data.fieldT }));
    const byId = new Map(order.map((m) => [m.id, [] as number[]]));
    data.source.forEach((s, i) => byId.get(s.measurementId)?.push(i));
    const used = order.filter((m) => (byId.get(m.id)?.length ?? 0) > 0);
    if (used.length < 1) throw new StepFailure("the curve above has no points");
    for (const id of Object.keys(config.windows)) if (!used.some((m) => m.id === id)) throw new StepFailure("a window names a measurement that is not in the curve above", "windows");
    const pick = (idx: number[], a: readonly number[]) => idx.map((i) => a[i]!);
    const measurements: JointMeasurement[] = used.map((m) => {
      const idx = byId.get(m.id)!;
      const w = config.windows[m.id];
      return {
        label: m.label, fieldT: m.fieldT,
        temperatureK: pick(idx, data.temperatureK), heatCapacity: pick(idx, data.heatCapacity), sigma: data.sigma ? pick(idx, data.sigma) : null,
        tMinK: w?.tMinK ?? config.tMinK, tMaxK: w?.tMaxK ?? config.tMaxK,
      };
    });
    const r = data.basis === "atom" ? 1 : ctx.sample.atomsPerFormulaUnit;
    let fit;
    try {
      fit = fitJoint(measurements, {
        model: isExpression ? { expression: config.expression! } : config.model,
        ...(config.shared ? { shared: config.shared } : {}),
        start: config.start, fixed: config.fixed, scaleErrors: config.scaleErrors, r,
      });
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, configField(err.field));
      throw err;
    }
    const warnings = [...fit.warnings];
    if (!data.sigma) warnings.push("the data carry no σ: the joint fit is unweighted and errors are scaled by the residual variance");
    if (used.length === 1) warnings.push("the curve above holds one measurement: this is an ordinary fit (choose several measurements in the data step)");
    const value = (name: string) => fit.parameters.find((p) => p.key === name) ?? null;
    const sharedValues = Object.fromEntries(fit.shared.map((name) => [name, { value: value(name)?.value ?? NaN, stdError: value(name)?.stdError ?? null }]));
    const jointFit: JointFitSummary = {
      stepId: "", model: fit.model, basis: data.basis, shared: sharedValues,
      measurements: fit.measurements.map((m, k) => ({ measurementId: used[k]!.id, label: m.label, fieldT: m.fieldT, tMinK: m.window.tMinK, tMaxK: m.window.tMaxK, parameters: m.parameters })),
    };
    // γ and β shared: hand them down as a fit (covariance from the joint fit).
    let handed: FitSummary | null = null;
    const g = value("gamma"), b = value("beta");
    if (g && b && g.measurement === null && b.measurement === null) {
      const cov = fit.covariance;
      const gi = cov?.names.indexOf("gamma") ?? -1, bi = cov?.names.indexOf("beta") ?? -1;
      handed = {
        stepId: "", model: `joint ${fit.model}`, basis: data.basis,
        fieldT: Math.min(...fit.measurements.map((m) => m.fieldT)),
        tMinK: Math.min(...fit.measurements.map((m) => m.window.tMinK)), tMaxK: Math.max(...fit.measurements.map((m) => m.window.tMaxK)),
        gamma: { value: g.value, stdError: g.stdError }, beta: { value: b.value, stdError: b.stdError },
        covGammaBeta: cov && gi >= 0 && bi >= 0 ? (cov.matrix[gi]![bi] ?? null) : null,
      };
    }
    return {
      result: { fit, basis: data.basis, measurementIds: used.map((m) => m.id), handsDownFit: handed !== null, symbols: symbolsOf(fit.model, fit.parameters.map((p) => p.name)) },
      warnings,
      state: { ...state, jointFit, ...(handed ? { fit: handed } : {}) },
    };
  },
});
