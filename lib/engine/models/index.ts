/** Heat-capacity models (one file per physical concept) and their registry. */
export { MODELS, getModel } from "./registry";
export { evaluateHeatCapacity, checkModelParameters } from "./evaluate";
export type { HeatCapacityModel, ParameterSpec, ModelOptions, HeatCapacityData, Params, SeparableSpec } from "./types";
export { temperatureSpan } from "./types";
export { sommerfeld, sommerfeldT5, sommerfeldT7 } from "./sommerfeld";
export { nuclear } from "./nuclear";
export { magnon } from "./magnon";
export { debye, debyeTemperatureFromBeta } from "./debye";
export { einstein, einsteinHeatCapacity } from "./einstein";
export { schottky, schottkyHeatCapacity } from "./schottky";
export { bcs } from "./bcs";
export { alphaModel } from "./alphaModel";
export { debyeHeatCapacity, debyeHeatCapacityDThetaD, debyeIntegral3, debyeD3, debyeReducedHeatCapacity, t3LawDeviation } from "./debyeFunction";
export { solveBcsGap, bcsGapSquared, bcsGapSquaredSlope, BCS_GAP_RATIO, BCS_GAP_SLOPE_AT_TC, ZETA3 } from "./bcsGap";
export { alphaModelReducedHeatCapacity, alphaModelReducedEntropy } from "./alphaFunction";
export { gaussLegendre, integrateGauss } from "./quadrature";
