/**
 * Sommerfeld–Debye low-temperature series (all linear in their coefficients):
 *   sommerfeld:    C = γT + βT³
 *   sommerfeld-t5: C = γT + βT³ + δT⁵          (lattice dispersion)
 *   sommerfeld-t7: C = γT + βT³ + δT⁵ + εT⁷
 * γ [J mol⁻¹ K⁻²], β [J mol⁻¹ K⁻⁴], δ [J mol⁻¹ K⁻⁶], ε [J mol⁻¹ K⁻⁸]; T in K; C in J mol⁻¹ K⁻¹.
 * Valid for T ≪ Θ_D (the T³ law drifts from the Debye function: see t3LawDeviation).
 */
import { BETA, GAMMA, param, type HeatCapacityModel, type Params } from "./types";
import { guessGammaBeta } from "./linearGuess";

export const DELTA = param("δ", "T⁵ dispersion coefficient", "delta", "J/(mol*K^6)", "mJ/(mol*K^6)", 1e3, "T⁵ dispersion coefficient δ");
export const EPSILON = param("ε", "T⁷ dispersion coefficient", "epsilon", "J/(mol*K^8)", "mJ/(mol*K^8)", 1e3, "T⁷ dispersion coefficient ε");

const POWERS = [1, 3, 5, 7];
const SPECS = [GAMMA, BETA, DELTA, EPSILON];

function series(name: string, title: string, formula: string, terms: number): HeatCapacityModel {
  const parameters = SPECS.slice(0, terms);
  const basis = POWERS.slice(0, terms).map((k) => (T: number) => T ** k);
  return Object.freeze<HeatCapacityModel>({
    name,
    title,
    formula,
    parameters,
    linear: true,
    basis,
    evaluate: (T: number, p: Params) => parameters.reduce((s, spec, k) => s + p[spec.name] * basis[k](T), 0),
    gradient: (T: number) => Object.fromEntries(parameters.map((spec, k) => [spec.name, basis[k](T)])),
    guess: (data) => ({ ...guessGammaBeta(data), delta: 0, epsilon: 0 }),
  });
}

export const sommerfeld = series("sommerfeld", "Sommerfeld–Debye γT + βT³", "C = γT + βT³", 2);
export const sommerfeldT5 = series("sommerfeld-t5", "γT + βT³ + δT⁵", "C = γT + βT³ + δT⁵", 3);
export const sommerfeldT7 = series("sommerfeld-t7", "γT + βT³ + δT⁵ + εT⁷", "C = γT + βT³ + δT⁵ + εT⁷", 4);
