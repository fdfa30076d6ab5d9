/**
 * Einstein modes on top of the Sommerfeld–Debye form:
 * C = γT + βT³ + 3 n_E R x² eˣ/(eˣ−1)², x = Θ_E/T.
 * n_E [dimensionless]: Einstein oscillators (atoms, 3 modes each) per formula unit;
 * Θ_E [K]. Limits: 3n_E R at T ≫ Θ_E; 3n_E R x² e^{−x} at T ≪ Θ_E.
 * Reference: Einstein, Ann. Phys. 22 (1907) 180.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";
import { BETA, GAMMA, param, temperatureSpan, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

/** Einstein heat capacity of n_E oscillators per formula unit [J mol⁻¹ K⁻¹]. */
export function einsteinHeatCapacity(temperatureK: number, thetaEK: number, modes = 1): number {
  if (temperatureK <= 0) return 0;
  const x = thetaEK / temperatureK;
  if (x > 700) return 0;
  if (x < 1e-8) return 3 * modes * R * (1 - (x * x) / 12);
  const em1 = Math.expm1(x);
  return (3 * modes * R * x * x * (em1 + 1)) / (em1 * em1);
}

export const einstein: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "einstein",
  title: "γT + βT³ + Einstein modes",
  formula: "C = γT + βT³ + 3n_E R x²eˣ/(eˣ−1)², x = Θ_E/T",
  parameters: [GAMMA, BETA, param("nE", "1", "1", 1, "Einstein oscillators per formula unit", [0, Infinity]), param("thetaE", "K", "K", 1, "Einstein temperature Θ_E", [1e-3, 1e5])],
  linear: false,
  evaluate: (T: number, p: Params) => p.gamma * T + p.beta * T ** 3 + einsteinHeatCapacity(T, p.thetaE, p.nE),
  guess: (data) => {
    const t = Array.from(data.temperatureK).sort((a, b) => a - b);
    return { ...guessGammaBeta(data), nE: 0.01, thetaE: 5 * t[Math.floor(t.length / 2)] };
  },
  // Θ_E/T from 1/5 of the lowest T (mode saturated) to 40 × the highest (mode frozen, e^{−40})
  separable: { linear: ["gamma", "beta", "nE"], ranges: (data) => { const { tMin, tMax } = temperatureSpan(data); return { thetaE: [Math.max(1e-3, tMin / 5), Math.min(1e5, 40 * tMax)] }; } },
});
