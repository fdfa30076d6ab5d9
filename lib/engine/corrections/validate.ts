/**
 * Input checks shared by the corrections: equal lengths, finite values, T > 0, σ > 0.
 * Errors name the curve, the field and the 1-based point number (as `line`).
 */
import { InputError, invalid } from "../errors";
import type { SampleCurve } from "./types";

/** Throw InputError unless the curve is non-empty, consistent and physical. */
export function checkCurve(curve: SampleCurve, name: string): void {
  const n = curve?.temperatureK?.length;
  if (!n) throw new InputError(`invalid ${name}: no points`, { field: `${name}.temperatureK` });
  if (curve.heatCapacityJPerK?.length !== n) {
    throw new InputError(`invalid ${name}: ${curve.heatCapacityJPerK?.length ?? 0} heat-capacity values for ${n} temperatures`, { field: `${name}.heatCapacityJPerK` });
  }
  if (curve.sigma && curve.sigma.length !== n) {
    throw new InputError(`invalid ${name}: ${curve.sigma.length} uncertainties for ${n} temperatures`, { field: `${name}.sigma` });
  }
  for (let i = 0; i < n; i++) {
    const at = (field: string) => ({ field: `${name}.${field}`, line: i + 1 });
    const t = curve.temperatureK[i];
    if (!(Number.isFinite(t) && t > 0)) throw invalid(`${name}.temperatureK`, t, "must be finite and > 0", at("temperatureK"));
    const c = curve.heatCapacityJPerK[i];
    if (!Number.isFinite(c)) throw invalid(`${name}.heatCapacityJPerK`, c, "must be finite", at("heatCapacityJPerK"));
    const s = curve.sigma?.[i];
    if (s !== undefined && !(Number.isFinite(s) && s > 0)) throw invalid(`${name}.sigma`, s, "must be finite and > 0", at("sigma"));
  }
}

/** Throw InputError unless value is a finite number > 0. */
export function checkPositive(name: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) throw invalid(name, value, "must be a finite number > 0");
  return value;
}
