/**
 * The results a step reports, as one flat list: fit parameters (γ, β, …, in the fit's SI units,
 * with χ²_red) from steps of kind "fit" and "joint-fit" (keys name#k per measurement), and derived quantities (γ, β, Θ_D, D(E_F), m* / m, λ …,
 * in display units) from steps of kind "derive". The one place that knows those output shapes
 * (lib/engine/notebook/steps/fit.ts and derive.ts).
 */
import { resultOf } from "../../engine/notebook/registry";
import { parameterSpecOf } from "../../engine/fit/jointModels";
import { toTrade } from "../../engine/units/named";

export interface ResultValue {
  /** Stable key within a revision: "<kind>#<k>:<name>", k counting steps of that kind from 1. */
  key: string;
  stepKind: "fit" | "joint-fit" | "derive";
  name: string;
  symbol: string;
  value: number;
  stdError: number | null;
  unit: string;
  note?: string;
}

/** A parameter's symbol from its model's spec (registry or joint model); a user expression's parameter keeps its own name. */
function symbolOf(model: string, name: string): string {
  return parameterSpecOf(model, name)?.symbol ?? name;
}

/** Results of one step output (null or failed outputs give none). `k` numbers steps of the kind. */
export function stepResults(kind: string, output: unknown, k: number): ResultValue[] {
  const o = output as { ok?: boolean; kind?: string; result?: unknown } | null;
  if (!o || !o.ok || !o.result) return [];
  const typed = { kind, ok: true, result: o.result };
  const fitResult = resultOf(typed, "fit");
  if (fitResult) {
    const fit = fitResult.fit;
    const out: ResultValue[] = (fit?.parameters ?? []).map((p) => ({
      key: `fit#${k}:${p.name}`, stepKind: "fit", name: p.name, symbol: symbolOf(fit.modelName, p.name), value: p.value, stdError: p.stdError, unit: p.unit, ...(p.fixed ? { note: "fixed" } : {}),
    }));
    if (typeof fit?.reducedChiSquare === "number") out.push({ key: `fit#${k}:reducedChiSquare`, stepKind: "fit", name: "reducedChiSquare", symbol: "χ²_red", value: fit.reducedChiSquare, stdError: null, unit: "1" });
    return out;
  }
  const joint = resultOf(typed, "joint-fit");
  if (joint) {
    const out: ResultValue[] = joint.fit.parameters.map((p) => ({
      key: `joint-fit#${k}:${p.key}`, stepKind: "joint-fit", name: p.key, symbol: `${symbolOf(joint.fit.model, p.name)}${p.measurement === null ? "" : ` (${p.measurement})`}`, value: p.value, stdError: p.stdError, unit: p.unit, ...(p.fixed ? { note: "fixed" } : {}),
    }));
    if (joint.fit.reducedChiSquare !== null) out.push({ key: `joint-fit#${k}:reducedChiSquare`, stepKind: "joint-fit", name: "reducedChiSquare", symbol: "χ²_red", value: joint.fit.reducedChiSquare, stdError: null, unit: "1" });
    return out;
  }
  const derive = resultOf(typed, "derive");
  if (derive) {
    return derive.quantities.map(toTrade).map((q) => ({ key: `derive#${k}:${q.name}`, stepKind: "derive", name: q.name, symbol: q.symbol, value: q.value, stdError: q.stdError, unit: q.unit, ...(q.note ? { note: q.note } : {}) }));
  }
  return [];
}

/** Results of a whole chain, in step order. */
export function chainResults(steps: readonly { kind: string; output: unknown }[]): ResultValue[] {
  const seen: Record<string, number> = {};
  return steps.flatMap((s) => {
    seen[s.kind] = (seen[s.kind] ?? 0) + 1;
    return stepResults(s.kind, s.output, seen[s.kind]!);
  });
}
