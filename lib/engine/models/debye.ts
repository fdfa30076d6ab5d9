/**
 * Electronic term plus the full Debye lattice term:
 * C = γT + 9rR (T/Θ_D)³ ∫₀^{Θ_D/T} x⁴eˣ/(eˣ−1)² dx, γ [J mol⁻¹ K⁻²], Θ_D [K],
 * r atoms per formula unit (fixed, option `r`, default 1). Nonlinear in Θ_D (LM, analytic
 * Jacobian). Guess: Θ_D from the β of a rough C/T vs T² line, Θ_D = (12π⁴rR/(5β))^{1/3}.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";
import { debyeHeatCapacity, debyeHeatCapacityDThetaD } from "./debyeFunction";
import { GAMMA, param, temperatureSpan, type HeatCapacityModel, type ModelOptions, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

export const THETA_D = param("thetaD", "K", "K", 1, "Debye temperature Θ_D", [1e-3, 1e5]);

/** Θ_D [K] from β [J mol⁻¹ K⁻⁴]: Θ_D = (12π⁴ r R / (5β))^{1/3}. */
export function debyeTemperatureFromBeta(beta: number, r = 1): number {
  return Math.cbrt((12 * Math.PI ** 4 * r * R) / (5 * beta));
}

export const debye: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "debye",
  title: "γT + full Debye lattice term",
  formula: "C = γT + 9rR(T/Θ_D)³ ∫₀^{Θ_D/T} x⁴eˣ/(eˣ−1)² dx",
  parameters: [GAMMA, THETA_D],
  linear: false,
  evaluate: (T: number, p: Params, o?: ModelOptions) => p.gamma * T + debyeHeatCapacity(T, p.thetaD, o?.r ?? 1),
  gradient: (T: number, p: Params, o?: ModelOptions) => ({ gamma: T, thetaD: debyeHeatCapacityDThetaD(T, p.thetaD, o?.r ?? 1) }),
  guess: (data, o) => {
    const { gamma, beta } = guessGammaBeta(data);
    return { gamma, thetaD: Math.min(Math.max(debyeTemperatureFromBeta(beta, o?.r ?? 1), 10), 2000) };
  },
  // Θ_D from half the lowest temperature (C_D near Dulong–Petit) to 500 × the highest (T³ regime)
  separable: { linear: ["gamma"], ranges: (data) => { const { tMin, tMax } = temperatureSpan(data); return { thetaD: [Math.max(1e-3, tMin / 2), Math.min(1e5, 500 * tMax)] }; } },
});
