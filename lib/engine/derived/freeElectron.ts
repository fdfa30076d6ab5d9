/**
 * The free-electron (Sommerfeld) gas at density n (Ashcroft & Mermin, Solid State Physics,
 * ch. 2): k_F = (3π²n)^{1/3}, E_F = ħ²k_F²/(2m_e), T_F = E_F/k_B, v_F = ħk_F/m_e,
 * r_s = (3/(4πn))^{1/3}; and its Sommerfeld coefficient γ_free = (π²/2) z R / T_F per mole
 * of formula units carrying z electrons each.
 */
import { BOHR_RADIUS_M, BOLTZMANN_J_PER_K, ELECTRON_MASS_KG, GAS_CONSTANT_J_PER_MOL_K, HBAR_J_S } from "../constants";
import { invalid } from "../errors";
import { requirePositive } from "./measured";

export interface FreeElectronGas {
  readonly electronDensityPerM3: number;
  readonly fermiWavevectorPerM: number;
  readonly fermiEnergyJ: number;
  readonly fermiTemperatureK: number;
  readonly fermiVelocityMPerS: number;
  /** Wigner–Seitz radius over the Bohr radius, dimensionless. */
  readonly rsOverA0: number;
}

/**
 * All free-electron parameters from n [m⁻³] (SI throughout, m_e the bare electron mass).
 * Throws InputError if n ≤ 0.
 */
export function freeElectronGas(electronDensityPerM3: number): FreeElectronGas {
  const n = requirePositive(electronDensityPerM3, "electronDensity");
  const kF = Math.cbrt(3 * Math.PI ** 2 * n);
  const EF = (HBAR_J_S * kF) ** 2 / (2 * ELECTRON_MASS_KG);
  return Object.freeze({
    electronDensityPerM3: n,
    fermiWavevectorPerM: kF,
    fermiEnergyJ: EF,
    fermiTemperatureK: EF / BOLTZMANN_J_PER_K,
    fermiVelocityMPerS: (HBAR_J_S * kF) / ELECTRON_MASS_KG,
    rsOverA0: Math.cbrt(3 / (4 * Math.PI * n)) / BOHR_RADIUS_M,
  });
}

/**
 * γ_free = (π²/2) z R / T_F [J mol⁻¹ K⁻²] per mole of formula units with z conduction
 * electrons each (equivalently (π²/3) k_B² N_A D_free(E_F), D_free = 3z/(2E_F)).
 * Throws InputError if T_F ≤ 0 or z < 0.
 */
export function gammaFree(fermiTemperatureK: number, electronsPerFormulaUnit: number): number {
  requirePositive(fermiTemperatureK, "fermiTemperature");
  if (!Number.isFinite(electronsPerFormulaUnit) || electronsPerFormulaUnit < 0) {
    throw invalid("electronsPerFormulaUnit", electronsPerFormulaUnit, "must be ≥ 0");
  }
  return ((Math.PI ** 2) / 2) * electronsPerFormulaUnit * GAS_CONSTANT_J_PER_MOL_K / fermiTemperatureK;
}

/**
 * Electronic heat capacity over the classical 3/2 k_B per electron at temperature T:
 * C_el / (3/2 z R) = (π²/3) T/T_F (first Sommerfeld order, T ≪ T_F). It is the reason γ is
 * small: ~2 % at 300 K for T_F = 5×10⁴ K, below 1 % only once T_F ≳ 10⁵ K.
 * Throws InputError if T < 0 or T_F ≤ 0.
 */
export function electronicToClassicalRatio(temperatureK: number, fermiTemperatureK: number): number {
  if (!Number.isFinite(temperatureK) || temperatureK < 0) throw invalid("temperature", temperatureK, "must be ≥ 0 K");
  return ((Math.PI ** 2) / 3) * (temperatureK / requirePositive(fermiTemperatureK, "fermiTemperature"));
}
