/**
 * Ferromagnetic spin waves (magnons) added to the Sommerfeld–Debye form:
 * C = γT + βT³ + B T^{3/2}. B [J mol⁻¹ K^{−5/2}]; linear in γ, β, B.
 */
import { BETA, GAMMA, param, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

const B = param("B", "ferromagnetic magnon coefficient", "B", "J/(mol*K^2.5)", "mJ/(mol*K^2.5)", 1e3, "ferromagnetic magnon coefficient B");
const basis = [(T: number) => T, (T: number) => T ** 3, (T: number) => T * Math.sqrt(T)];

export const magnon: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "magnon",
  title: "γT + βT³ + B·T^3/2 (magnons)",
  formula: "C = γT + βT³ + B·T^(3/2)",
  parameters: [GAMMA, BETA, B],
  linear: true,
  basis,
  evaluate: (T: number, p: Params) => p.gamma * T + p.beta * T ** 3 + p.B * T * Math.sqrt(T),
  gradient: (T: number) => ({ gamma: T, beta: T ** 3, B: T * Math.sqrt(T) }),
  guess: (data) => ({ ...guessGammaBeta(data), B: 0 }),
});
