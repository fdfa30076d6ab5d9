/**
 * Debye temperature from the T³ lattice coefficient (Debye, Ann. Phys. 39, 789 (1912)):
 * C_lat = (12π⁴/5) r R (T/Θ_D)³ = βT³  ⇔  Θ_D = (12π⁴ r R / (5β))^{1/3}.
 */
import { GAS_CONSTANT_J_PER_MOL_K } from "../constants";
import { quantity, type Quantity } from "../uncertainty";
import { checkMeasured, requirePositive, type Measured } from "./measured";

const DEBYE_T3_FACTOR = (12 * Math.PI ** 4) / 5;

/**
 * Θ_D [K] from β [J mol⁻¹ K⁻⁴] per mole of formula units with r atoms per formula unit
 * (or β per mole of atoms with r = 1: the same Θ_D). Throws InputError if β ≤ 0 or r ≤ 0.
 */
export function thetaDFromBeta(betaJPerMolK4: number, atomsPerFormulaUnit: number): number {
  requirePositive(betaJPerMolK4, "beta");
  requirePositive(atomsPerFormulaUnit, "atomsPerFormulaUnit");
  return Math.cbrt((DEBYE_T3_FACTOR * atomsPerFormulaUnit * GAS_CONSTANT_J_PER_MOL_K) / betaJPerMolK4);
}

/** Inverse: β [J mol⁻¹ K⁻⁴] = 12π⁴ r R / (5 Θ_D³). Throws InputError if Θ_D ≤ 0 or r ≤ 0. */
export function betaFromThetaD(thetaDK: number, atomsPerFormulaUnit: number): number {
  requirePositive(thetaDK, "thetaD");
  requirePositive(atomsPerFormulaUnit, "atomsPerFormulaUnit");
  return (DEBYE_T3_FACTOR * atomsPerFormulaUnit * GAS_CONSTANT_J_PER_MOL_K) / thetaDK ** 3;
}

/**
 * Θ_D as a Quantity [K] with σ_Θ = Θ_D σ_β / (3β) (first order; Θ ∝ β^{−1/3}).
 * Throws InputError if β ≤ 0.
 */
export function debyeTemperature(beta: Measured, atomsPerFormulaUnit: number): Quantity {
  checkMeasured(beta, "beta");
  const theta = thetaDFromBeta(beta.value, atomsPerFormulaUnit);
  const sigma = beta.stdError === null ? null : (theta * beta.stdError) / (3 * beta.value);
  return quantity("thetaD", "Θ_D", theta, sigma, "K", `from β with r = ${atomsPerFormulaUnit} atoms per formula unit`);
}
