/**
 * Checked evaluation of a registered model: every parameter must be a finite number within
 * the bounds of its spec (e.g. Θ_D > 0), and every C(T) finite. The first tier of errors:
 * InputError naming the parameter (field = its name), never a silent NaN.
 */
import { InputError } from "../errors";
import type { HeatCapacityModel, ModelOptions, Params } from "./types";

/** Throw InputError for the first parameter of `params` that is missing, not finite or out of bounds. */
export function checkModelParameters(model: HeatCapacityModel, params: Params): void {
  for (const spec of model.parameters) {
    const v = params[spec.name];
    if (typeof v !== "number" || !Number.isFinite(v)) throw new InputError(`invalid ${spec.name}: ${v} (${spec.description} must be a finite number)`, { field: spec.name });
    if (v < spec.lower || v > spec.upper) {
      const range = `${Number.isFinite(spec.lower) ? `≥ ${spec.lower}` : ""}${Number.isFinite(spec.lower) && Number.isFinite(spec.upper) ? " and " : ""}${Number.isFinite(spec.upper) ? `≤ ${spec.upper}` : ""}`;
      throw new InputError(`invalid ${spec.name}: ${v} (${spec.description} must be ${range} ${spec.unit})`, { field: spec.name });
    }
  }
}

/**
 * C(T) [J mol⁻¹ K⁻¹] of `model` at each temperature [K] (each > 0), parameters in SI.
 * InputError for an invalid parameter or temperature, or a value that is not finite.
 */
export function evaluateHeatCapacity(model: HeatCapacityModel, temperatureK: readonly number[], params: Params, options?: ModelOptions): number[] {
  checkModelParameters(model, params);
  return temperatureK.map((t, i) => {
    if (!(t > 0 && Number.isFinite(t))) throw new InputError(`invalid temperatureK: ${t} at point ${i + 1} (must be a finite number > 0 K)`, { field: "temperatureK", line: i + 1 });
    const c = model.evaluate(t, params, options);
    if (!Number.isFinite(c)) throw new InputError(`invalid parameters for ${model.name}: C(${t} K) is not finite (${c})`, { field: "parameters" });
    return c;
  });
}
