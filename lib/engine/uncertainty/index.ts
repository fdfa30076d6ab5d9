/** Uncertainty: the shared Quantity type and first-order propagation through a covariance. */
export type { Quantity } from "./quantity";
export { quantity, scaleQuantity, relativeError, withSystematic } from "./quantity";
export type { Matrix } from "./covariance";
export { covarianceFromErrors, covariance2, correlationOf, checkCovariance } from "./covariance";
export type { Propagated, ScalarFunction } from "./propagate";
export { propagate, propagatePowerLaw, numericalGradient } from "./propagate";
