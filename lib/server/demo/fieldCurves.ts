/**
 * Demo curves in magnetic fields. INVENTED DATA, chosen to be physically consistent so that
 * fits recover the values written here; every file made from them says so in its first line.
 *
 * 1. The superconducting Nb sample (NM-01, spec in seed.ts: γ_n = 7.7 mJ mol⁻¹ K⁻², Θ_D = 276 K,
 *    δ = 2×10⁻⁶ mJ mol⁻¹ K⁻⁶, T_c(0) = 9.1 K, γ_r(0)/γ_n = 0.03, T_c spread 0.08 K) gets an
 *    invented upper critical field H_c2(0) = 1.8 T (real Nb has a far lower one) and
 *    - mixed-state curves at 0.25, 0.5, 1 and 1.5 T: the two-fluid form of curves.ts with
 *        T_c(H) = T_c(0)·√(1 − H/H_c2(0))          (from a parabolic H_c2(T) = H_c2(0)(1 − t²), common practice)
 *        γ(H)/γ_n = 0.03 + 0.97·H/H_c2(0)           (LINEAR law: fully gapped, vortex-core states)
 *        T_c spread = 0.08 K + 0.1 K/T · H           (broader step in field)
 *      Below T_c(H) − spread this is exactly C = γ(H)T + [β + 3(γ_n − γ(H))·⟨T_c⁻²⟩]T³ + δT⁵,
 *      ⟨T_c⁻²⟩ the mean of 1/(T_c(H) + kσ)² over k = −1, −½, 0, ½, 1 (σ the spread).
 *      Same lattice as zero field; no nuclear term (real ⁹³Nb would add A/T² ∝ H² below ~1 K).
 *    - normal-state curves at 2 T (existing) and 3 T: C = γ_n T + βT³ + δT⁵ in both
 *      (β = 12π⁴R/(5Θ_D³) = 0.09245 mJ mol⁻¹ K⁻⁴).
 *    True values per field (γ in mJ mol⁻¹ K⁻², β_eff the T³ coefficient below T_c(H) − spread,
 *    in mJ mol⁻¹ K⁻⁴; the parabolic T_c(H) makes it nearly field-independent):
 *        H (T)   T_c(H) (K)  γ(H)/γ_n  γ(H)    spread (K)  β_eff
 *        0       9.100       0.0300    0.2310  0.080       0.36307
 *        0.25    8.444       0.1647    1.2684  0.105       0.36310
 *        0.5     7.734       0.2994    2.3057  0.130       0.36315
 *        1       6.067       0.5689    4.3804  0.180       0.36339
 *        1.5     3.715       0.8383    6.4552  0.230       0.36460
 *        2, 3    normal      1         7.7     —           0.09245
 * 2. A dilute magnetic alloy Cu₀.₉₉₆Mn₀.₀₀₄ (MA-01) at 0, 2, 4 and 6 T:
 *        C = γT + βT³ + n·R·x²eˣ/(1 + eˣ)² + a_N·H²/T²,   x = Δ/T,  Δ = g·μ_B·H/k_B
 *    with γ = 0.71 mJ mol⁻¹ K⁻², Θ_D = 340 K (β = 12π⁴R/(5Θ_D³) ≈ 0.04946 mJ mol⁻¹ K⁻⁴),
 *    n = 0.004 (one two-level centre per Mn atom), g = 2.04, a_N = 3.2 µJ K mol⁻¹ T⁻².
 *    The Mn moments are treated as free spin-½ doublets (an invented simplification: real Mn in
 *    Cu carries S = 5/2 and its moments interact). a_N is of the size of copper's nuclear
 *    Zeeman tail R·I(I+1)/3·(γ_N ħ H/k_B T)² with I = 3/2 (estimate, Cu nuclear moments from
 *    memory). Zero field: no Schottky and no nuclear term. μ_B, k_B, R: CODATA 2018.
 *        H (T)   Δ/k_B (K)   A = a_N·H² (mJ K mol⁻¹)
 *        0       0           0
 *        2       2.7406      0.0128
 *        4       5.4812      0.0512
 *        6       8.2218      0.1152
 *    Files: 0.4–16 K, 130 points; Nb mixed state 0.6–20 K, 150 points; Nb normal 1.8–20 K,
 *    100 points; σ = 0.4 % of the total (sample + addenda) + 2 nJ/K, seeded normal noise.
 */
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K, GAS_CONSTANT_J_PER_MOL_K as R } from "../../engine/constants";
import { schottkyHeatCapacity } from "../../engine/models/schottky";
import type { CurveSpec } from "./curves";

/** Invented H_c2(0) of the demo Nb sample [T]. */
export const DEMO_HC2_T = 1.8;
/** Fields [T] of the demo Nb sample's mixed-state curves (below H_c2(0)). */
export const MIXED_STATE_FIELDS_T = [0.25, 0.5, 1, 1.5] as const;
/** Fields [T] of the demo Nb sample's normal-state curves (above H_c2(0)); the first is the one the demo analysis uses. */
export const NORMAL_STATE_FIELDS_T = [2, 3] as const;

/**
 * The zero-field superconducting spec moved to field H [T] < H_c2(0): T_c, residual γ fraction
 * (linear in H) and T_c spread as in the header. Throws for H outside [0, H_c2(0)).
 */
export function mixedStateSpec(zeroField: CurveSpec, fieldT: number, hc2T = DEMO_HC2_T): CurveSpec {
  if (!zeroField.tcK) throw new Error("mixedStateSpec: the zero-field spec has no T_c");
  if (!(fieldT >= 0 && fieldT < hc2T)) throw new Error(`mixedStateSpec: field ${fieldT} T is not below H_c2(0) = ${hc2T} T`);
  const h = fieldT / hc2T;
  const r0 = zeroField.residualGammaFraction ?? 0;
  return {
    ...zeroField,
    tcK: zeroField.tcK * Math.sqrt(1 - h),
    residualGammaFraction: r0 + (1 - r0) * h,
    tcSpreadK: (zeroField.tcSpreadK ?? 0) + 0.1 * fieldT,
  };
}

export interface MagneticAlloySpec {
  gammaMJ: number; // mJ mol⁻¹ K⁻²
  thetaDK: number;
  /** Two-level centres per formula unit. */
  n: number;
  /** Landé factor of the doublet. */
  g: number;
  /** Nuclear coefficient: A(H) = a_N·H² [mJ K mol⁻¹ T⁻²]. */
  nuclearPerT2MJ: number;
}

/** The demo's dilute magnetic alloy (INVENTED). */
export const MAGNETIC_ALLOY = {
  formula: "Cu0.996Mn0.004",
  /** How the trade names a dilute alloy; used in the sample's and measurements' labels. */
  label: "CuMn 0.4 at.%",
  massMg: 41.7,
  densityGPerCm3: 8.93,
  fieldsT: [0, 2, 4, 6] as const,
  spec: { gammaMJ: 0.71, thetaDK: 340, n: 0.004, g: 2.04, nuclearPerT2MJ: 0.0032 } satisfies MagneticAlloySpec,
};

/** Zeeman splitting of a doublet Δ/k_B [K] = g μ_B H / k_B for H in tesla. */
export function zeemanGapK(g: number, fieldT: number): number {
  return (g * BOHR_MAGNETON_J_PER_T * fieldT) / BOLTZMANN_J_PER_K;
}

/** Molar heat capacity J/(mol K) of the magnetic alloy at T [K] in field H [T] (formula in the header). */
export function magneticAlloyHeatCapacity(spec: MagneticAlloySpec, T: number, fieldT: number): number {
  const beta = (12 * Math.PI ** 4 * R) / (5 * spec.thetaDK ** 3);
  const schottky = fieldT === 0 ? 0 : schottkyHeatCapacity(T, zeemanGapK(spec.g, fieldT), 1, spec.n);
  const nuclear = (spec.nuclearPerT2MJ * 1e-3 * fieldT * fieldT) / (T * T);
  return spec.gammaMJ * 1e-3 * T + beta * T ** 3 + schottky + nuclear;
}
