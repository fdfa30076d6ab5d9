/**
 * Density of states at the Fermi level from the Sommerfeld coefficient:
 * γ = (π²/3) k_B² N_A D(E_F)  ⇔  D(E_F) = 3γ / (π² k_B² N_A), both spin directions,
 * per formula unit when γ is per mole of formula units (Ashcroft & Mermin, Solid State
 * Physics, eq. 2.80).
 */
import { AVOGADRO_PER_MOL, BOLTZMANN_J_PER_K, ELECTRONVOLT_J } from "../constants";
import { quantity, type Quantity } from "../uncertainty";
import { checkMeasured, type Measured } from "./measured";

/** γ [J mol⁻¹ K⁻²] per unit D(E_F) [states J⁻¹ per particle]: (π²/3) k_B² N_A. */
const GAMMA_PER_DOS_SI = ((Math.PI ** 2) / 3) * BOLTZMANN_J_PER_K ** 2 * AVOGADRO_PER_MOL;

/**
 * The conversion factor γ [mJ mol⁻¹ K⁻²] / D(E_F) [states eV⁻¹ per f.u.], ≈ 2.357,
 * computed from CODATA 2018 k_B, N_A and e.
 */
export function gammaPerDosFactor(): number {
  return (GAMMA_PER_DOS_SI / ELECTRONVOLT_J) * 1e3;
}

/**
 * D(E_F) [states eV⁻¹ per formula unit, both spins] from γ [J mol⁻¹ K⁻²] per mole f.u.
 * (per atom when γ is per mole of atoms). Any sign is returned as computed: a negative γ
 * gives a negative, unphysical D (the caller warns).
 */
export function dosFromGamma(gammaJPerMolK2: number): number {
  return (gammaJPerMolK2 / GAMMA_PER_DOS_SI) * ELECTRONVOLT_J;
}

/** Inverse: γ [J mol⁻¹ K⁻²] from D(E_F) [states eV⁻¹ per particle]. */
export function gammaFromDos(dosPerEv: number): number {
  return (dosPerEv / ELECTRONVOLT_J) * GAMMA_PER_DOS_SI;
}

/**
 * D(E_F) as a Quantity with σ_D = σ_γ · D/γ (linear). `per` names the particle
 * ("f.u." or "atom") in the unit. Throws InputError on a non-finite γ.
 */
export function densityOfStates(gamma: Measured, per: "f.u." | "atom" = "f.u."): Quantity {
  checkMeasured(gamma, "gamma");
  const factor = dosFromGamma(1);
  return quantity("dosEF", "D(E_F)", gamma.value * factor, gamma.stdError === null ? null : gamma.stdError * factor, `states eV^-1 ${per}^-1`, "both spin directions");
}
