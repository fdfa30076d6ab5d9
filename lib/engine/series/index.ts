/**
 * Composition-series engine: trends of γ, Θ_D, D(E_F), m* / m, T_c against an axis.
 *
 *   fitTrend(points, { degree })   weighted linear/quadratic trend (QR), σ's, ±1σ band, 3σ outliers
 *   evaluateTrend(fit, x)          trend value and its standard error at x
 *   freeElectronGammaMJ(member)    γ_free from average valence and density [mJ mol⁻¹ K⁻²]
 */
export { fitTrend, evaluateTrend } from "./trend";
export type { TrendPoint, TrendDegree, TrendOptions, TrendParameter, TrendFit, BandPoint } from "./trend";
export { freeElectronGammaMJ } from "./freeElectron";
export type { FreeElectronMember } from "./freeElectron";
