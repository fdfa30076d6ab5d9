/**
 * Padamsee α-model superconductor plus the lattice:
 * C = γ_n T_c c_α(T/T_c) + βT³, c_α from alphaFunction.ts (BCS gap shape scaled to
 * Δ(0) = α k_B T_c; c_α(t) = t above T_c). γ_n [J mol⁻¹ K⁻²], T_c [K], α dimensionless
 * (BCS 1.764), β [J mol⁻¹ K⁻⁴]. Nonlinear (LM with numerical derivatives).
 * Reference: Padamsee, Neighbor & Shiffman, J. Low Temp. Phys. 12 (1973) 387.
 */
import { alphaModelReducedHeatCapacity } from "./alphaFunction";
import { BCS_GAP_RATIO } from "./bcsGap";
import { BETA, param, temperatureSpan, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

export const alphaModel: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "alpha-model",
  title: "α-model superconductor + βT³",
  formula: "C = γ_n T_c c_α(T/T_c) + βT³",
  parameters: [
    param("gammaN", "J/(mol*K^2)", "mJ/(mol*K^2)", 1e3, "normal-state Sommerfeld coefficient γ_n", [0, Infinity]),
    param("tc", "K", "K", 1, "transition temperature T_c", [1e-6, 1e3]),
    param("alpha", "1", "1", 1, "gap ratio α = Δ(0)/(k_B T_c)", [0.1, 10]),
    BETA,
  ],
  linear: false,
  // the integral is skipped when γ_n = 0 (the global search reads the β column that way)
  evaluate: (T: number, p: Params) => (p.gammaN === 0 ? 0 : p.gammaN * p.tc * alphaModelReducedHeatCapacity(T / p.tc, p.alpha)) + p.beta * T ** 3,
  guess: (data) => {
    let tc = data.temperatureK[0];
    let best = -Infinity;
    for (let i = 0; i < data.temperatureK.length; i++) {
      const v = data.heatCapacity[i] / data.temperatureK[i];
      if (v > best) [best, tc] = [v, data.temperatureK[i]];
    }
    const above = Array.from(data.temperatureK, (_, i) => i).filter((i) => data.temperatureK[i] > 1.05 * tc);
    const sub = above.length >= 3 ? { temperatureK: above.map((i) => data.temperatureK[i]), heatCapacity: above.map((i) => data.heatCapacity[i]) } : data;
    const { gamma, beta } = guessGammaBeta(sub);
    return { gammaN: Math.max(gamma, 1e-6), tc, alpha: BCS_GAP_RATIO, beta };
  },
  // T_c within the data (a transition outside it cannot be located), α over 0.5–5
  separable: { linear: ["gammaN", "beta"], ranges: (data) => { const { tMin, tMax } = temperatureSpan(data); return { tc: [tMin, tMax], alpha: [0.5, 5] }; } },
});
