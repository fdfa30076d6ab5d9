/**
 * Nuclear (hyperfine) Schottky tail added to the Sommerfeld–Debye form, the high-T side of
 * a nuclear Schottky anomaly: C = γT + βT³ + A/T². A [J K mol⁻¹]; linear in γ, β, A.
 * Important below ~1 K, more so in applied field.
 */
import { BETA, GAMMA, param, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

const A = param("A_N", "nuclear hyperfine coefficient", "A", "J*K/mol", "mJ*K/mol", 1e3, "nuclear hyperfine tail coefficient A_N");
const basis = [(T: number) => T, (T: number) => T ** 3, (T: number) => 1 / (T * T)];

export const nuclear: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "nuclear",
  title: "γT + βT³ + A/T² (nuclear tail)",
  formula: "C = γT + βT³ + A/T²",
  parameters: [GAMMA, BETA, A],
  linear: true,
  basis,
  evaluate: (T: number, p: Params) => p.gamma * T + p.beta * T ** 3 + p.A / (T * T),
  gradient: (T: number) => ({ gamma: T, beta: T ** 3, A: 1 / (T * T) }),
  guess: (data) => ({ ...guessGammaBeta(data), A: 0 }),
});
