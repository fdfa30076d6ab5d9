/**
 * Declarative heat-capacity model specs. A model is a pure evaluate(T, params) with named
 * parameters in SI units (J, K, mol), its formula and units in the doc comment, and this
 * spec beside it: parameter units (SI and display), bounds, guess(data), linear or not,
 * and for linear models the basis functions (C = Σ_k p_k φ_k(T)).
 */

export interface ParameterSpec {
  readonly name: string;
  /** SI unit in mathjs syntax, e.g. "J/(mol*K^2)". */
  readonly unit: string;
  /** Display unit and factor: display value = SI value × displayFactor. */
  readonly displayUnit: string;
  readonly displayFactor: number;
  readonly lower: number;
  readonly upper: number;
  readonly description: string;
  /** Held fixed unless the caller frees it: a default value, or "required" (caller must give it). */
  readonly fixedByDefault?: number | "required";
}

export interface ModelOptions {
  /** Atoms per formula unit for lattice terms (Debye, Einstein); default 1. */
  readonly r?: number;
}

export interface HeatCapacityData {
  readonly temperatureK: ArrayLike<number>;
  readonly heatCapacity: ArrayLike<number>;
}

export type Params = Readonly<Record<string, number>>;

export interface HeatCapacityModel {
  readonly name: string;
  readonly title: string;
  /** The formula in words/symbols, for display. */
  readonly formula: string;
  readonly parameters: readonly ParameterSpec[];
  readonly linear: boolean;
  /** Linear models: φ_k(T) in parameter order, C = Σ p_k φ_k(T). */
  readonly basis?: readonly ((temperatureK: number) => number)[];
  /** C(T) in J mol⁻¹ K⁻¹. */
  evaluate(temperatureK: number, params: Params, options?: ModelOptions): number;
  /** ∂C/∂p per parameter (analytic), or absent for numerical derivatives. */
  gradient?(temperatureK: number, params: Params, options?: ModelOptions): Params;
  /** Starting values from the data (nonlinear models; linear ones need none but give some). */
  guess(data: HeatCapacityData, options?: ModelOptions): Params;
  /** Nonlinear models: which parameters are amplitudes, and where to search the others. */
  readonly separable?: SeparableSpec;
}

/**
 * The structure the global start uses (fit/global.ts): C is affine in the `linear`
 * parameters once the others are fixed; `ranges` gives a physically sensible search interval
 * for each nonlinear parameter from the data (searched log-spaced when both ends are > 0).
 */
export interface SeparableSpec {
  readonly linear: readonly string[];
  ranges(data: HeatCapacityData, options?: ModelOptions): Readonly<Record<string, readonly [number, number]>>;
}

/** Lowest and highest temperature of the data [K]. */
export function temperatureSpan(data: HeatCapacityData): { tMin: number; tMax: number } {
  let tMin = Infinity;
  let tMax = -Infinity;
  for (let i = 0; i < data.temperatureK.length; i++) {
    tMin = Math.min(tMin, data.temperatureK[i]);
    tMax = Math.max(tMax, data.temperatureK[i]);
  }
  return { tMin, tMax };
}

/** Parameter spec helper. */
export function param(
  name: string,
  unit: string,
  displayUnit: string,
  displayFactor: number,
  description: string,
  bounds: [number, number] = [-Infinity, Infinity],
  fixedByDefault?: number | "required",
): ParameterSpec {
  return Object.freeze({ name, unit, displayUnit, displayFactor, lower: bounds[0], upper: bounds[1], description, fixedByDefault });
}

export const GAMMA = param("gamma", "J/(mol*K^2)", "mJ/(mol*K^2)", 1e3, "Sommerfeld coefficient γ");
export const BETA = param("beta", "J/(mol*K^4)", "mJ/(mol*K^4)", 1e3, "lattice T³ coefficient β");
