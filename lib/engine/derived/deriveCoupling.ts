/**
 * The coupling and magnetic part of deriveAll: λ from γ_band, McMillan T_c (σ through the
 * full γ, β, γ_band covariance, since Θ_D comes from β of the same fit), λ from a measured
 * T_c, the Wilson ratio and the Kadowaki–Woods ratio.
 */
import { propagate, quantity, type Quantity } from "../uncertainty";
import { thetaDFromBeta } from "./debye";
import { lambdaFromBandGamma, lambdaFromMcMillanQuantity, mcMillanTc } from "./coupling";
import { kadowakiWoodsRatio, wilsonRatio, type MolarSusceptibilityUnit } from "./magnetic";
import { varianceOf, type Measured } from "./measured";
import { debyeTemperature } from "./debye";

export interface CouplingInput {
  /** Band-structure γ [J mol⁻¹ K⁻²] per mole formula unit (σ optional). */
  readonly gammaBand?: Measured;
  /** Coulomb pseudopotential μ* for McMillan (0.10–0.13 common practice); no default. */
  readonly muStar?: number;
  /** Measured superconducting T_c [K], for λ from McMillan's inverse. */
  readonly tcK?: number;
}

export interface MagneticInput {
  /** Molar (per mole formula unit) Pauli susceptibility with its unit. */
  readonly chi?: Measured & { readonly unit: MolarSusceptibilityUnit };
  /** Resistivity T² coefficient A [μΩ cm K⁻²]. */
  readonly kwA?: Measured;
}

interface Needs extends CouplingInput {
  readonly gamma: Measured;
  readonly beta: Measured;
  readonly formula: { atomsPerFormulaUnit: number };
}

/** λ and McMillan quantities; warns when μ* is needed but missing. Throws InputError on invalid μ* or T_c. */
export function couplingQuantities(input: Needs, covGB: number[][], warnings: string[]): { quantities: Quantity[]; lambda?: number } {
  const qs: Quantity[] = [];
  const r = input.formula.atomsPerFormulaUnit;
  const haveTheta = input.beta.value > 0;
  if ((input.gammaBand || input.tcK !== undefined) && input.muStar === undefined) warnings.push("McMillan T_c / λ skipped: give μ* (0.10–0.13 common practice)");
  let lambda: number | undefined;
  if (input.gammaBand) {
    const l = lambdaFromBandGamma(input.gamma, input.gammaBand);
    lambda = l.value;
    qs.push(l);
    if (input.muStar !== undefined && haveTheta && l.value >= 0) qs.push(mcMillanFromFit(input, input.gammaBand, input.muStar, covGB, r));
  }
  if (input.tcK !== undefined && input.muStar !== undefined && haveTheta) {
    qs.push(lambdaFromMcMillanQuantity(input.tcK, debyeTemperature(input.beta, r), input.muStar));
  }
  return { quantities: qs, lambda };
}

function mcMillanFromFit(input: Needs, band: Measured, muStar: number, covGB: number[][], r: number): Quantity {
  const f = ([g, b, gb]: readonly number[]) => mcMillanTc(Math.max(0, g / gb - 1), thetaDFromBeta(b, r), muStar);
  const x = [input.gamma.value, input.beta.value, band.value];
  const tc = f(x);
  if (tc === 0) return quantity("tcMcMillan", "T_c (McMillan)", 0, null, "K", `λ ≤ μ*(1+0.62λ): no superconductivity predicted (μ* = ${muStar})`);
  const cov = [
    [covGB[0][0], covGB[0][1], 0],
    [covGB[1][0], covGB[1][1], 0],
    [0, 0, varianceOf(band)],
  ];
  const known = input.gamma.stdError !== null || input.beta.stdError !== null || band.stdError !== null;
  return quantity("tcMcMillan", "T_c (McMillan)", tc, known ? propagate(f, x, cov).stdError : null, "K", `McMillan 1968 with λ = γ/γ_band − 1, Θ_D from β, μ* = ${muStar}; σ includes cov(γ, β)`);
}

/** Wilson and Kadowaki–Woods ratios when χ or A is given. */
export function magneticQuantities(input: MagneticInput & { gamma: Measured }): Quantity[] {
  const qs: Quantity[] = [];
  if (input.chi) qs.push(wilsonRatio(input.chi, input.chi.unit, input.gamma));
  if (input.kwA) qs.push(kadowakiWoodsRatio(input.kwA, input.gamma));
  return qs;
}
