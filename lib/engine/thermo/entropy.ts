/**
 * Entropy S(T) = ∫₀ᵀ C/T' dT' and enthalpy H(T) − H(0) = ∫₀ᵀ C dT' of a heat-capacity curve,
 * with the part from 0 to the lowest measured temperature T_min taken from the low-T fit
 * C = γT + βT³: S(T_min) = γT_min + βT_min³/3, H(T_min) − H(0) = γT_min²/2 + βT_min⁴/4.
 * SI: T [K], C [J mol⁻¹ K⁻¹], γ [J mol⁻¹ K⁻²], β [J mol⁻¹ K⁻⁴], S [J mol⁻¹ K⁻¹], H [J mol⁻¹].
 */
import { invalid } from "../errors";
import { covariance2, propagate, quantity, type Quantity } from "../uncertainty";
import { checkTable, cumulativeTrapezoid, simpson } from "./integrate";

/** The low-temperature fit used below T_min: γ, β with standard errors and covariance. */
export interface LowTemperatureFit {
  readonly gamma: number;
  readonly beta: number;
  readonly gammaStdError?: number;
  readonly betaStdError?: number;
  readonly covGammaBeta?: number;
}

export interface IntegratedCurve {
  readonly temperatureK: readonly number[];
  /** S [J mol⁻¹ K⁻¹] or H − H(0) [J mol⁻¹] at each temperature. */
  readonly values: readonly number[];
  /** σ at each temperature: extrapolation (fully correlated) and point errors combined; null if none given. */
  readonly stdErrors: readonly number[] | null;
  /** The 0 → T_min part from the fit, with its σ. */
  readonly extrapolation: Quantity;
  readonly method: "trapezoid on data" | "Simpson on model";
}

/** S(T_min) = γT_min + βT_min³/3 [J mol⁻¹ K⁻¹], σ through cov(γ, β). */
export function entropyBelow(tMinK: number, fit: LowTemperatureFit): Quantity {
  return extrapolate("entropyBelowTmin", "S(T_min)", "J mol^-1 K^-1", tMinK, fit, [tMinK, tMinK ** 3 / 3]);
}

/** H(T_min) − H(0) = γT_min²/2 + βT_min⁴/4 [J mol⁻¹], σ through cov(γ, β). */
export function enthalpyBelow(tMinK: number, fit: LowTemperatureFit): Quantity {
  return extrapolate("enthalpyBelowTmin", "H(T_min) − H(0)", "J mol^-1", tMinK, fit, [tMinK ** 2 / 2, tMinK ** 4 / 4]);
}

/**
 * S(T) at each data temperature by the cumulative trapezoid of C/T plus entropyBelow(T_min).
 * σ_C (optional, per point) is propagated as independent errors. Throws InputError on
 * mismatched lengths, T ≤ 0, non-increasing T.
 */
export function entropyFromData(temperatureK: readonly number[], heatCapacity: readonly number[], fit: LowTemperatureFit, sigmaC?: readonly number[]): IntegratedCurve {
  checkTable(temperatureK, heatCapacity, "temperatureK", "heatCapacity");
  if (temperatureK[0] <= 0) throw invalid("temperatureK[0]", temperatureK[0], "must be > 0 K");
  const y = heatCapacity.map((c, i) => c / temperatureK[i]);
  const sy = sigmaC?.map((s, i) => s / temperatureK[i]);
  return assemble(temperatureK, cumulativeTrapezoid(temperatureK, y, sy), entropyBelow(temperatureK[0], fit), "trapezoid on data");
}

/** H(T) − H(0) at each data temperature by the cumulative trapezoid of C plus enthalpyBelow(T_min). */
export function enthalpyFromData(temperatureK: readonly number[], heatCapacity: readonly number[], fit: LowTemperatureFit, sigmaC?: readonly number[]): IntegratedCurve {
  checkTable(temperatureK, heatCapacity, "temperatureK", "heatCapacity");
  if (temperatureK[0] <= 0) throw invalid("temperatureK[0]", temperatureK[0], "must be > 0 K");
  return assemble(temperatureK, cumulativeTrapezoid(temperatureK, heatCapacity, sigmaC), enthalpyBelow(temperatureK[0], fit), "trapezoid on data");
}

/**
 * S(T) of a smooth model C(T) (e.g. a fitted curve) at the given temperatures: Simpson from
 * T_min = temperatureK[0] between successive temperatures (n intervals each) plus entropyBelow.
 */
export function entropyOfModel(heatCapacityOf: (tK: number) => number, temperatureK: readonly number[], fit: LowTemperatureFit, n = 64): IntegratedCurve {
  return modelIntegral((t) => heatCapacityOf(t) / t, temperatureK, entropyBelow(temperatureK[0] ?? NaN, fit), n);
}

/** H(T) − H(0) of a smooth model C(T) at the given temperatures (Simpson plus enthalpyBelow). */
export function enthalpyOfModel(heatCapacityOf: (tK: number) => number, temperatureK: readonly number[], fit: LowTemperatureFit, n = 64): IntegratedCurve {
  return modelIntegral(heatCapacityOf, temperatureK, enthalpyBelow(temperatureK[0] ?? NaN, fit), n);
}

function modelIntegral(f: (t: number) => number, T: readonly number[], below: Quantity, n: number): IntegratedCurve {
  checkTable(T, T, "temperatureK", "temperatureK");
  const values = [below.value];
  for (let k = 1; k < T.length; k++) values.push(values[k - 1] + simpson(f, T[k - 1], T[k], n));
  const s = below.stdError;
  return Object.freeze({ temperatureK: T.slice(), values, stdErrors: s === null ? null : T.map(() => s), extrapolation: below, method: "Simpson on model" });
}

function assemble(T: readonly number[], integ: { integral: number[]; stdError: number[] | null }, below: Quantity, method: IntegratedCurve["method"]): IntegratedCurve {
  const values = integ.integral.map((v) => v + below.value);
  const s0 = below.stdError ?? 0;
  const hasErrors = integ.stdError !== null || below.stdError !== null;
  const stdErrors = hasErrors ? T.map((_, k) => Math.hypot(s0, integ.stdError?.[k] ?? 0)) : null;
  return Object.freeze({ temperatureK: T.slice(), values, stdErrors, extrapolation: below, method });
}

function extrapolate(name: string, symbol: string, unit: string, tMinK: number, fit: LowTemperatureFit, weights: [number, number]): Quantity {
  if (!Number.isFinite(tMinK) || tMinK <= 0) throw invalid("T_min", tMinK, "must be > 0 K");
  if (!Number.isFinite(fit.gamma) || !Number.isFinite(fit.beta)) throw invalid("fit", `γ = ${fit.gamma}, β = ${fit.beta}`, "not finite");
  const cov = covariance2(fit.gammaStdError ?? 0, fit.betaStdError ?? 0, fit.covGammaBeta ?? 0);
  const r = propagate(([g, b]) => weights[0] * g + weights[1] * b, [fit.gamma, fit.beta], cov, weights);
  const known = fit.gammaStdError !== undefined || fit.betaStdError !== undefined;
  return quantity(name, symbol, r.value, known ? r.stdError : null, unit, `from C = γT + βT³ below T_min = ${tMinK} K`);
}
