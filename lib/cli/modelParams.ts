/**
 * Checking parameter values given on the command line (`model --set`, `fit --fix/--start`)
 * against a registered model's spec: each value must be finite and inside the spec's bounds
 * [lower, upper] (SI, as in lib/engine/models). The message names the flag, the parameter, the
 * value and the allowed range in the display unit the user typed.
 */
import { InputError } from "../engine/errors";
import type { HeatCapacityModel } from "../engine/models";

const shown = (v: number) => (Number.isFinite(v) ? String(Number(v.toPrecision(6))) : v > 0 ? "∞" : "−∞");

/** Throws InputError (exit 2) for the first SI value outside its parameter's bounds. Unknown names are left to the caller. */
export function checkParameterValues(model: HeatCapacityModel, siValues: Readonly<Record<string, number>>, flag: string): void {
  for (const [name, v] of Object.entries(siValues)) {
    const spec = model.parameters.find((p) => p.name === name);
    if (!spec) continue;
    const f = spec.displayFactor;
    if (!Number.isFinite(v)) throw new InputError(`--${flag} ${name}: not a finite number`, { field: name });
    if (v < spec.lower || v > spec.upper) {
      const range = `[${shown(spec.lower * f)}, ${shown(spec.upper * f)}]`;
      throw new InputError(`--${flag} ${name}=${shown(v * f)}: ${spec.description} must lie in ${range} ${spec.displayUnit === "1" ? "" : spec.displayUnit}`.trimEnd() + ` for model ${model.name}`, { field: name });
    }
  }
}
