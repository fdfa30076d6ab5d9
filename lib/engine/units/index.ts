/**
 * Units: the one mathjs units adapter. SI inside, the user's units at the edges.
 *
 *   parseUnit(text)                        unit text (mathjs or instrument spelling) → ParsedUnit
 *   normaliseUnitText(text)                the rewriting parseUnit applies, for display/debug
 *   heatCapacityBasis(unit)                "sample" (J/K) | "molar" (J/(mol K)) | "specific" (J/(kg K))
 *   toSI(values, unitText, quantity)       temperature → K, heatCapacity → basis SI, field → T (μ0H)
 *   siFactor / siUnitOf                    the factor and SI unit toSI uses
 *   formatUncertainty(value, σ)            "4.213(25)", "12.3(1.5)", "1.2345(56)e-5"
 *   formatWithUnit / formatGamma / formatBeta   SI value → "1.234(12) mJ mol⁻¹ K⁻²"
 */
export { parseUnit, normaliseUnitText } from "./parse";
export type { ParsedUnit } from "./parse";
export { heatCapacityBasis, siFactor, siUnitOf, toSI } from "./convert";
export type { HeatCapacityBasis, Quantity } from "./convert";
export { DISPLAY_UNITS, displayFactor, formatBeta, formatGamma, formatUncertainty, formatWithUnit } from "./format";
export type { DisplayUnit, UncertaintyFormat } from "./format";
