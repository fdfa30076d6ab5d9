/**
 * Electron–phonon coupling: λ from the band-structure γ, and McMillan's T_c formula
 * (McMillan, Phys. Rev. 167, 331 (1968), eq. 18 with ω-prefactor Θ_D/1.45):
 *   T_c = (Θ_D/1.45) exp[−1.04(1+λ) / (λ − μ*(1+0.62λ))],
 * and its closed-form inverse
 *   λ = [1.04 + μ* ln(Θ_D/1.45T_c)] / [(1 − 0.62μ*) ln(Θ_D/1.45T_c) − 1.04].
 */
import { invalid } from "../errors";
import { propagate, covariance2, quantity, type Quantity } from "../uncertainty";
import { checkMeasured, requirePositive, varianceOf, type Measured } from "./measured";

/**
 * λ = γ/γ_band − 1 (γ = (1+λ) γ_band). Both γ in the same unit and basis; dimensionless result
 * with σ from both inputs (uncorrelated). Throws InputError if γ_band ≤ 0.
 */
export function lambdaFromBandGamma(gamma: Measured, gammaBand: Measured): Quantity {
  checkMeasured(gamma, "gamma");
  checkMeasured(gammaBand, "gammaBand");
  requirePositive(gammaBand.value, "gammaBand");
  const r = propagate(([g, b]) => g / b - 1, [gamma.value, gammaBand.value], covariance2(Math.sqrt(varianceOf(gamma)), Math.sqrt(varianceOf(gammaBand))));
  const known = gamma.stdError !== null || gammaBand.stdError !== null;
  return quantity("lambda", "λ", r.value, known ? r.stdError : null, "1", "λ = γ/γ_band − 1 (electron–phonon and other mass enhancement)");
}

/**
 * McMillan T_c [K] from λ, Θ_D [K] and μ* (dimensionless; 0.10–0.13 common practice).
 * Returns 0 when λ ≤ μ*(1+0.62λ) (the formula predicts no superconductivity).
 * Throws InputError on Θ_D ≤ 0, λ < 0 or μ* outside [0, 1).
 */
export function mcMillanTc(lambda: number, thetaDK: number, muStar: number): number {
  requirePositive(thetaDK, "thetaD");
  checkCouplings(lambda, muStar);
  const denominator = lambda - muStar * (1 + 0.62 * lambda);
  if (denominator <= 0) return 0;
  return (thetaDK / 1.45) * Math.exp((-1.04 * (1 + lambda)) / denominator);
}

/**
 * λ from a measured T_c [K], Θ_D [K] and μ* by inverting McMillan's formula exactly.
 * Throws InputError if T_c ≤ 0, T_c ≥ Θ_D/1.45, or the inversion has no positive solution
 * (denominator ≤ 0: T_c too high for this Θ_D and μ* within McMillan's form).
 */
export function lambdaFromMcMillan(tcK: number, thetaDK: number, muStar: number): number {
  requirePositive(tcK, "Tc");
  requirePositive(thetaDK, "thetaD");
  checkCouplings(0, muStar);
  const L = Math.log(thetaDK / (1.45 * tcK));
  const denominator = (1 - 0.62 * muStar) * L - 1.04;
  if (L <= 0 || denominator <= 0) throw invalid("Tc", tcK, `too high for Θ_D = ${thetaDK} K and μ* = ${muStar} in McMillan's formula`);
  return (1.04 + muStar * L) / denominator;
}

/** McMillan T_c as a Quantity [K], σ propagated from λ and Θ_D (uncorrelated). */
export function mcMillanTcQuantity(lambda: Measured, thetaD: Measured, muStar: number): Quantity {
  checkMeasured(lambda, "lambda");
  checkMeasured(thetaD, "thetaD");
  const tc = mcMillanTc(lambda.value, thetaD.value, muStar);
  if (tc === 0) return quantity("tcMcMillan", "T_c (McMillan)", 0, null, "K", `λ ≤ μ*(1+0.62λ): no superconductivity predicted (μ* = ${muStar})`);
  const cov = covariance2(Math.sqrt(varianceOf(lambda)), Math.sqrt(varianceOf(thetaD)));
  const r = propagate(([l, t]) => mcMillanTc(l, t, muStar), [lambda.value, thetaD.value], cov);
  return quantity("tcMcMillan", "T_c (McMillan)", tc, lambda.stdError === null && thetaD.stdError === null ? null : r.stdError, "K", `McMillan 1968, μ* = ${muStar}`);
}

/** λ from T_c as a Quantity, σ from Θ_D only (T_c taken as exact). */
export function lambdaFromMcMillanQuantity(tcK: number, thetaD: Measured, muStar: number): Quantity {
  checkMeasured(thetaD, "thetaD");
  const value = lambdaFromMcMillan(tcK, thetaD.value, muStar);
  const r = thetaD.stdError === null ? null : propagate(([t]) => lambdaFromMcMillan(tcK, t, muStar), [thetaD.value], [[varianceOf(thetaD)]]).stdError;
  return quantity("lambdaMcMillan", "λ (McMillan)", value, r, "1", `inverted McMillan formula, T_c = ${tcK} K, μ* = ${muStar}`);
}

function checkCouplings(lambda: number, muStar: number): void {
  if (!Number.isFinite(lambda) || lambda < 0) throw invalid("lambda", lambda, "must be ≥ 0");
  if (!Number.isFinite(muStar) || muStar < 0 || muStar >= 1) throw invalid("muStar", muStar, "must be in [0, 1)");
}
