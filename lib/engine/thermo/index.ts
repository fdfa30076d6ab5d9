/** Thermodynamic integrals of C(T): entropy and enthalpy with the low-T extrapolation from a fit. */
export { checkTable, cumulativeTrapezoid, simpson } from "./integrate";
export type { LowTemperatureFit, IntegratedCurve } from "./entropy";
export { entropyBelow, enthalpyBelow, entropyFromData, enthalpyFromData, entropyOfModel, enthalpyOfModel } from "./entropy";
