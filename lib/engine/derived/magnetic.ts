/**
 * Ratios of γ to magnetic and transport coefficients.
 *
 * Wilson ratio R_W = (π² k_B² / (3 μ0 μ_B²)) χ/γ in SI (Sommerfeld–Wilson), with χ the molar
 * (Pauli) susceptibility in m³/mol and γ in J mol⁻¹ K⁻². Convention: χ is the SI volume
 * susceptibility times molar volume, M = χ_vol H, B = μ0(H + M); cgs-emu molar χ [emu/mol =
 * cm³/mol] converts as χ_SI = 4π × 10⁻⁶ χ_cgs (the standard emu → SI relation, from memory,
 * resting on the conventional μ0 = 4π × 10⁻⁷ that defines the emu; CODATA 2018 μ0 differs by
 * 5 × 10⁻¹⁰ relative and is used in the SI formula). For a free-electron gas R_W = 1.
 *
 * Kadowaki–Woods ratio A/γ² with A the T² coefficient of resistivity, ρ = ρ0 + AT²
 * (Kadowaki & Woods, Solid State Commun. 58, 507 (1986): ≈ 1.0 × 10⁻⁵ μΩ cm K² mol² mJ⁻² for
 * heavy-fermion compounds).
 */
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K, VACUUM_PERMEABILITY_N_PER_A2 } from "../constants";
import { invalid } from "../errors";
import { propagatePowerLaw, covariance2, quantity, type Quantity } from "../uncertainty";
import { checkMeasured, requirePositive, varianceOf, type Measured } from "./measured";

export type MolarSusceptibilityUnit = "m3/mol" | "emu/mol";

/** The Kadowaki–Woods universal value, μΩ cm K² mol² mJ⁻² (Kadowaki & Woods 1986). */
export const KADOWAKI_WOODS_UNIVERSAL = 1.0e-5;

/** Molar χ in m³/mol from a value in `unit` (emu/mol ×4π×10⁻⁶). Throws InputError on an unknown unit. */
export function molarSusceptibilitySI(value: number, unit: MolarSusceptibilityUnit): number {
  if (unit === "m3/mol") return value;
  if (unit === "emu/mol") return value * 4 * Math.PI * 1e-6;
  throw invalid("chi unit", unit, "expected m3/mol or emu/mol");
}

/**
 * R_W (dimensionless) from χ [unit, molar] and γ [J mol⁻¹ K⁻², same mole basis], σ from both.
 * χ should be the Pauli part (core diamagnetism and Van Vleck removed by the caller).
 * Throws InputError if γ ≤ 0.
 */
export function wilsonRatio(chi: Measured, unit: MolarSusceptibilityUnit, gamma: Measured): Quantity {
  checkMeasured(chi, "chi");
  checkMeasured(gamma, "gamma");
  requirePositive(gamma.value, "gamma");
  const factor = molarSusceptibilitySI(1, unit);
  const c = ((Math.PI ** 2) * BOLTZMANN_J_PER_K ** 2) / (3 * VACUUM_PERMEABILITY_N_PER_A2 * BOHR_MAGNETON_J_PER_T ** 2);
  const cov = covariance2(Math.sqrt(varianceOf(chi)) * factor, Math.sqrt(varianceOf(gamma)));
  const r = propagatePowerLaw(c, [chi.value * factor, gamma.value], [1, -1], cov);
  return quantity("wilsonRatio", "R_W", r.value, chi.stdError === null && gamma.stdError === null ? null : r.stdError, "1", `SI, μ0 convention B = μ0(H+M); χ given in ${unit}`);
}

/**
 * A/γ² [μΩ cm K² mol² mJ⁻²] from A [μΩ cm K⁻²] and γ [J mol⁻¹ K⁻²] (converted to mJ inside),
 * with σ. Throws InputError if γ ≤ 0 or A ≤ 0.
 */
export function kadowakiWoodsRatio(aMicroOhmCmPerK2: Measured, gamma: Measured): Quantity {
  checkMeasured(aMicroOhmCmPerK2, "kwA");
  checkMeasured(gamma, "gamma");
  requirePositive(aMicroOhmCmPerK2.value, "kwA");
  requirePositive(gamma.value, "gamma");
  const cov = covariance2(Math.sqrt(varianceOf(aMicroOhmCmPerK2)), Math.sqrt(varianceOf(gamma)) * 1e3);
  const r = propagatePowerLaw(1, [aMicroOhmCmPerK2.value, gamma.value * 1e3], [1, -2], cov);
  const note = `A/γ² = ${(r.value / KADOWAKI_WOODS_UNIVERSAL).toPrecision(3)} × the Kadowaki–Woods value 1.0e-5`;
  return quantity("kadowakiWoods", "A/γ²", r.value, aMicroOhmCmPerK2.stdError === null && gamma.stdError === null ? null : r.stdError, "μΩ cm K^2 mol^2 mJ^-2", note);
}
