/**
 * Residual Sommerfeld coefficient in the superconducting state: C_el/T extrapolated to T → 0
 * by a straight line in T² over T ≤ fraction × T_c. For a fully gapped superconductor the
 * intrinsic C_es/T is exponentially small there, so the intercept is the normal (non-
 * superconducting) part γ_r; γ_r/γ_n estimates the non-superconducting volume fraction.
 * The intercept does not depend on β (βT² is absorbed by the slope).
 */
import { fitPolynomial } from "./localFit";

export interface ResidualGamma {
  readonly gammaR: number;
  readonly stdError: number;
  readonly nPoints: number;
  readonly upToK: number;
}

/**
 * γ_r [J mol⁻¹ K⁻²] ± σ from y = C_el/T at T ≤ upToK; null when fewer than 3 points lie there
 * (no extrapolation possible).
 */
export function residualGamma(T: readonly number[], y: readonly number[], upToK: number, sigmaY?: readonly number[]): ResidualGamma | null {
  const idx = T.map((t, i) => (t <= upToK ? i : -1)).filter((i) => i >= 0);
  if (idx.length < 3) return null;
  const fit = fitPolynomial(idx.map((i) => T[i] ** 2), idx.map((i) => y[i]), 1, sigmaY && idx.map((i) => sigmaY[i]));
  return Object.freeze({ gammaR: fit.at(0), stdError: fit.stdErrorAt(0), nPoints: idx.length, upToK });
}
