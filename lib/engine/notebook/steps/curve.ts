/** The fitted model as a smooth curve for plotting (registry models and user expressions alike). */
import { getModel } from "../../models";
import { compileExpression } from "../../expression";
import type { HeatCapacityFitResult } from "../../fit/heatCapacity";

/** n points evenly spaced in T² between tMin and tMax (even on the C/T vs T² plot). */
export function modelCurve(fit: HeatCapacityFitResult, expression: string | null, tMinK: number, tMaxK: number, n = 160): { temperatureK: number[]; heatCapacity: number[] } {
  const t2a = tMinK * tMinK, t2b = tMaxK * tMaxK;
  const T = Array.from({ length: n }, (_, i) => Math.sqrt(t2a + ((t2b - t2a) * i) / (n - 1)));
  const params = Object.fromEntries(fit.parameters.map((p) => [p.name, p.value]));
  if (expression) {
    const compiled = compileExpression(expression);
    const x = Float64Array.from(T);
    const p = Float64Array.from(compiled.parameters.map((name) => params[name] ?? 0));
    const out = new Float64Array(T.length);
    compiled.evaluate(x, p, out);
    return { temperatureK: T, heatCapacity: Array.from(out) };
  }
  const model = getModel(fit.modelName);
  return { temperatureK: T, heatCapacity: T.map((t) => model.evaluate(t, params, { r: fit.r })) };
}
