/**
 * Thermal effective-mass ratio m* / m = γ/γ_free (Ashcroft & Mermin, Solid State Physics,
 * Table 2.3 lists measured γ against the free-electron value for simple metals).
 */
import { quantity, type Quantity } from "../uncertainty";
import { checkMeasured, requirePositive, type Measured } from "./measured";

/**
 * m* / m = γ/γ_free, dimensionless, with σ = σ_γ/γ_free (γ_free taken as exact: it follows
 * from density and valence, which carry no stated error). Both γ in the same unit and basis.
 * Throws InputError if γ_free ≤ 0.
 */
export function thermalMassRatio(gamma: Measured, gammaFreeSameUnit: number): Quantity {
  checkMeasured(gamma, "gamma");
  const g0 = requirePositive(gammaFreeSameUnit, "gammaFree");
  return quantity("massRatio", "m*/m", gamma.value / g0, gamma.stdError === null ? null : gamma.stdError / g0, "1", "thermal effective mass γ/γ_free");
}
