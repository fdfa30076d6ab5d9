/** Superconducting transitions: equal-area construction, residual γ, BCS reference values. */
export { zeta3, BCS_JUMP_RATIO, BCS_GAP_RATIO, gapEquationResidual, bcsGap, bcsJumpRatioFromGapEquation } from "./bcs";
export type { PolyFit } from "./localFit";
export { fitPolynomial } from "./localFit";
export type { TransitionWindows } from "./transition";
export { findTransition, interpolate, areaBetween } from "./transition";
export type { Windows, Construction } from "./construction";
export { construct, electronicOverT } from "./construction";
export type { ResidualGamma } from "./residual";
export { residualGamma } from "./residual";
export type { NormalStateSource, JumpInput, JumpResult } from "./jump";
export { analyzeJump } from "./jump";
export { analyseGammaField, type GammaFieldInput, type GammaFieldLaw, type GammaFieldResult } from "./gammaField";
