/**
 * A wide-range demo curve (INVENTED DATA) for the lattice views: zero field, 2–120 K, the whole
 * Debye lattice (not only its T³ start) plus a weak Einstein-like mode, as an alloy with a
 * localised soft mode might show:
 *     C = γT + C_Debye(T; Θ_D, r) + 3 n_E R x² eˣ/(eˣ − 1)²,  x = Θ_E/T
 * with the sample's own γ and Θ_D (seed.ts) and n_E = 0.02 oscillators per formula unit at
 * Θ_E = 70 K — so (C − γT)/T³ peaks near Θ_E/4.93 ≈ 14 K and the effective Θ_D(T) dips there.
 * Addenda already subtracted (a second instrument's export, invented); σ 0.5 %.
 */
import { debyeHeatCapacity } from "../../engine/models/debyeFunction";
import { einsteinHeatCapacity } from "../../engine/models/einstein";

export const WIDE_RANGE = { tMinK: 2, tMaxK: 120, points: 140, einsteinModes: 0.02, thetaEK: 70, relNoise: 0.005 } as const;

/** Molar heat capacity J mol⁻¹ K⁻¹ (per formula unit) of the wide-range curve. */
export function wideRangeHeatCapacity(gammaMJ: number, thetaDK: number, atomsPerFormulaUnit: number, T: number): number {
  return gammaMJ * 1e-3 * T + debyeHeatCapacity(T, thetaDK, atomsPerFormulaUnit) + einsteinHeatCapacity(T, WIDE_RANGE.thetaEK, WIDE_RANGE.einsteinModes);
}
