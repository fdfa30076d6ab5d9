/**
 * Two-level Schottky anomaly on top of the Sommerfeld–Debye form:
 * C = γT + βT³ + n R x² g e^{−x} / (1 + g e^{−x})², x = Δ/T,
 * Δ [K] the level splitting (gap), g = g₁/g₀ the degeneracy ratio (fixed, default 1),
 * n [dimensionless] two-level centres per formula unit. For g = 1 the maximum is
 * C ≈ 0.4392 nR at T ≈ Δ/2.40. Reference: Schottky, Phys. Z. 23 (1922) 448; Gopal,
 * Specific Heats at Low Temperatures (1966), ch. 4.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";
import { BETA, GAMMA, param, temperatureSpan, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

/** Two-level Schottky heat capacity per mole of formula units [J mol⁻¹ K⁻¹]. */
export function schottkyHeatCapacity(temperatureK: number, gapK: number, degeneracyRatio = 1, amount = 1): number {
  if (temperatureK <= 0) return 0;
  const x = gapK / temperatureK;
  if (x > 700) return 0;
  const ge = degeneracyRatio * Math.exp(-x);
  return (amount * R * x * x * ge) / ((1 + ge) * (1 + ge));
}

export const schottky: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "schottky",
  title: "γT + βT³ + two-level Schottky",
  formula: "C = γT + βT³ + nR x² g e^{−x}/(1 + g e^{−x})², x = Δ/T",
  parameters: [
    GAMMA,
    BETA,
    param("n", "1", "1", 1, "two-level centres per formula unit", [0, Infinity]),
    param("gap", "K", "K", 1, "level splitting Δ/k_B", [1e-6, 1e5]),
    param("g", "1", "1", 1, "degeneracy ratio g₁/g₀", [1e-6, 1e6], 1),
  ],
  linear: false,
  evaluate: (T: number, p: Params) => p.gamma * T + p.beta * T ** 3 + schottkyHeatCapacity(T, p.gap, p.g, p.n),
  guess: (data) => {
    const gb = guessGammaBeta(data);
    let best = 0;
    let tAt = data.temperatureK[0];
    for (let i = 0; i < data.temperatureK.length; i++) {
      const T = data.temperatureK[i];
      const excess = data.heatCapacity[i] - gb.gamma * T - gb.beta * T ** 3;
      if (excess > best) [best, tAt] = [excess, T];
    }
    return { ...gb, n: best > 0 ? best / (0.44 * R) : 1e-3, gap: 2.4 * tAt, g: 1 };
  },
  // Δ from 1/20 of the lowest T (only the 1/T² tail in the data) to 40 × the highest (frozen out);
  // g, when freed, over 0.05–20
  separable: { linear: ["gamma", "beta", "n"], ranges: (data) => { const { tMin, tMax } = temperatureSpan(data); return { gap: [Math.max(1e-6, tMin / 20), Math.min(1e5, 40 * tMax)], g: [0.05, 20] }; } },
});
