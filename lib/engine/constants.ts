/**
 * Physical constants: CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93,
 * 025010 (2021); NIST SP 961). k_B, h, e, N_A and c are exact since the 2019 SI redefinition;
 * ħ and R follow from exact constants and are therefore exact too (to double precision).
 * All values in SI.
 */

export interface Constant {
  readonly symbol: string;
  readonly name: string;
  readonly value: number;
  readonly unit: string;
  /** Standard uncertainty in the same unit; 0 for exact constants. */
  readonly uncertainty: number;
  readonly exact: boolean;
  readonly source: string;
}

const CODATA = "CODATA 2018";

function entry(symbol: string, name: string, value: number, unit: string, uncertainty = 0): Constant {
  return Object.freeze({ symbol, name, value, unit, uncertainty, exact: uncertainty === 0, source: CODATA });
}

/** Boltzmann constant k_B [J/K], exact. */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Planck constant h [J s], exact. */
export const PLANCK_J_S = 6.62607015e-34;
/** Reduced Planck constant ħ = h/2π [J s]. */
export const HBAR_J_S = PLANCK_J_S / (2 * Math.PI);
/** Elementary charge e [C], exact. */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Avogadro constant N_A [1/mol], exact. */
export const AVOGADRO_PER_MOL = 6.02214076e23;
/** Molar gas constant R = N_A k_B [J/(mol K)], exact. */
export const GAS_CONSTANT_J_PER_MOL_K = AVOGADRO_PER_MOL * BOLTZMANN_J_PER_K;
/** Speed of light in vacuum c [m/s], exact. */
export const SPEED_OF_LIGHT_M_PER_S = 299792458;
/** Electron mass m_e [kg], CODATA 2018: 9.1093837015(28)e-31. */
export const ELECTRON_MASS_KG = 9.1093837015e-31;
/** Bohr magneton μ_B [J/T], CODATA 2018: 9.2740100783(28)e-24. */
export const BOHR_MAGNETON_J_PER_T = 9.2740100783e-24;
/** Vacuum magnetic permeability μ0 [N/A²], CODATA 2018: 1.25663706212(19)e-6. */
export const VACUUM_PERMEABILITY_N_PER_A2 = 1.25663706212e-6;
/** Bohr radius a0 [m], CODATA 2018: 5.29177210903(80)e-11. */
export const BOHR_RADIUS_M = 5.29177210903e-11;
/** One electronvolt in joules (= e numerically), exact. */
export const ELECTRONVOLT_J = ELEMENTARY_CHARGE_C;

/** The catalogue, for display and for the test that iterates over every entry. */
export const CONSTANTS: readonly Constant[] = Object.freeze([
  entry("k_B", "Boltzmann constant", BOLTZMANN_J_PER_K, "J K^-1"),
  entry("h", "Planck constant", PLANCK_J_S, "J s"),
  entry("hbar", "reduced Planck constant", HBAR_J_S, "J s"),
  entry("e", "elementary charge", ELEMENTARY_CHARGE_C, "C"),
  entry("N_A", "Avogadro constant", AVOGADRO_PER_MOL, "mol^-1"),
  entry("R", "molar gas constant", GAS_CONSTANT_J_PER_MOL_K, "J mol^-1 K^-1"),
  entry("c", "speed of light in vacuum", SPEED_OF_LIGHT_M_PER_S, "m s^-1"),
  entry("m_e", "electron mass", ELECTRON_MASS_KG, "kg", 0.0000000028e-31),
  entry("mu_B", "Bohr magneton", BOHR_MAGNETON_J_PER_T, "J T^-1", 0.0000000028e-24),
  entry("mu_0", "vacuum magnetic permeability", VACUUM_PERMEABILITY_N_PER_A2, "N A^-2", 0.00000000019e-6),
  entry("a_0", "Bohr radius", BOHR_RADIUS_M, "m", 0.00000000080e-11),
]);

/**
 * The constants a user expression may name when its caller opts in (joint fits): SI values,
 * CODATA 2018 (R and k_B, N_A exact; μ_B 9.2740100783(28)e-24 J T⁻¹). Never fitted.
 */
export const NAMED_CONSTANTS: Readonly<Record<"R" | "kB" | "muB" | "NA", number>> = Object.freeze({
  R: GAS_CONSTANT_J_PER_MOL_K,
  kB: BOLTZMANN_J_PER_K,
  muB: BOHR_MAGNETON_J_PER_T,
  NA: AVOGADRO_PER_MOL,
});
