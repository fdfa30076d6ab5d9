/**
 * The free-electron γ overlay of a series: for each member, γ_free = (π²/2) z R / T_F per mole
 * formula unit, with z = Σ nᵢvᵢ conduction electrons per f.u. (average valence) and the electron
 * density n = z ρ N_A / M from the sample's mass density (Ashcroft & Mermin ch. 2). Composed from
 * lib/engine/derived; nothing retyped.
 */
import { electronDensityFromMassDensity, freeElectronGas, gammaFree, MILLI_PER_UNIT } from "../derived";

export interface FreeElectronMember {
  readonly molarMassGPerMol: number;
  /** Mass density [g cm⁻³]; null when the sample has none (then no overlay point). */
  readonly densityGPerCm3: number | null;
  /** z = Σ nᵢvᵢ per formula unit. */
  readonly electronsPerFormulaUnit: number;
}

/**
 * γ_free [mJ mol⁻¹ K⁻²] per mole formula unit, or null when the density is unknown or z = 0.
 * Throws InputError on a non-positive molar mass or density, or a negative z.
 */
export function freeElectronGammaMJ(member: FreeElectronMember): number | null {
  if (member.densityGPerCm3 === null || member.electronsPerFormulaUnit === 0) return null;
  const n = electronDensityFromMassDensity({ densityGPerCm3: member.densityGPerCm3, molarMassGPerMol: member.molarMassGPerMol, electronsPerFormulaUnit: member.electronsPerFormulaUnit });
  return gammaFree(freeElectronGas(n).fermiTemperatureK, member.electronsPerFormulaUnit) * MILLI_PER_UNIT;
}
