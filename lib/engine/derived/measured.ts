/**
 * Input type for derived quantities: a measured value with its standard error (null if
 * unknown), plus the checks every module applies to it.
 */
import { invalid } from "../errors";

export interface Measured {
  readonly value: number;
  readonly stdError: number | null;
}

/** Display factor J → mJ for γ [J mol⁻¹ K⁻²] and β [J mol⁻¹ K⁻⁴]. */
export const MILLI_PER_UNIT = 1e3;

/** Check a Measured input: finite value, stdError null or finite ≥ 0. Throws InputError naming `name`. */
export function checkMeasured(m: Measured, name: string): void {
  if (!Number.isFinite(m.value)) throw invalid(name, m.value, "not a finite number");
  if (m.stdError !== null && (!Number.isFinite(m.stdError) || m.stdError < 0)) {
    throw invalid(`${name} standard error`, m.stdError, "must be finite and ≥ 0", { field: name });
  }
}

/** Require a finite, strictly positive number; throws InputError "invalid NAME: VALUE (must be > 0)". */
export function requirePositive(value: number, name: string): number {
  if (!Number.isFinite(value) || value <= 0) throw invalid(name, value, "must be a finite number > 0");
  return value;
}

/** Variance of a Measured (0 when its stdError is null). */
export function varianceOf(m: Measured): number {
  return m.stdError === null ? 0 : m.stdError * m.stdError;
}
