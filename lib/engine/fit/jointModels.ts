/**
 * Models for joint fits of C(T) measured in several applied fields H (tesla). Each is a
 * mathjs expression in T [K] and H [T] with the CODATA 2018 constants R, kB, muB (SI,
 * constants.ts), compiled once; its declarative spec says per parameter the SI and display
 * units, the display symbol, bounds, whether it is shared by default between measurements,
 * and for the nonlinear ones the search range of the global start (from the data's
 * temperatures and fields). C in J mol⁻¹ K⁻¹.
 *
 *  zeeman-schottky:  C = γT + βT³ + n R x² eˣ/(1 + eˣ)², x = Δ/T, Δ = g μ_B |H| / k_B
 *     (two-level Schottky term of a Kramers doublet split by the field; written with e⁻ˣ so
 *     large x underflows to 0 instead of overflowing). Reference: Gopal, Specific Heats at Low
 *     Temperatures (1966), ch. 4; Tari, The Specific Heat of Matter at Low Temperatures
 *     (2003), ch. 6 (from memory).
 *  zeeman-schottky-internal: the same with Δ = √(Δ₀² + (g μ_B H / k_B)²), a zero-field
 *     splitting Δ₀ (internal/exchange field adding in quadrature: common practice).
 *  nuclear-field:    C = γT + βT³ + a H²/T²  (high-T tail of the nuclear Schottky anomaly,
 *     A(H) ∝ H² for a hyperfine field proportional to the applied one).
 *  nuclear-field-a0: C = γT + βT³ + (A₀ + a H²)/T² (with a zero-field part A₀).
 *  normal-state:     C = γT + βT³ (normal state of a superconductor above H_c2: all shared).
 *  normal-state-t5:  C = γT + βT³ + δT⁵.
 */
import { compileExpression, type CompiledExpression } from "../expression/compile";
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K } from "../constants";
import { MODELS } from "../models/registry";

export interface JointParameterSpec {
  readonly name: string;
  /** SI unit in mathjs syntax. */
  readonly unit: string;
  readonly displayUnit: string;
  /** display value = SI value × displayFactor. */
  readonly displayFactor: number;
  /** Display symbol as light markup ("γ", "A_0"; lib/display/typeset.ts renders it). */
  readonly symbol: string;
  readonly label: string;
  readonly description: string;
  readonly defaultShared: boolean;
  readonly lower: number;
  readonly upper: number;
}

/** What the search ranges are computed from: the windowed temperatures and the fields. */
export interface JointRangeData {
  readonly temperatureK: ArrayLike<number>;
  readonly fieldsT: readonly number[];
}

export interface JointModelSpec {
  readonly name: string;
  readonly title: string;
  /** Plain text with Unicode. */
  readonly formula: string;
  /** The model as a mathjs expression in T, H and R, kB, muB, NA (what is compiled). */
  readonly expression: string;
  readonly parameters: readonly JointParameterSpec[];
  /** C(T, H) [J mol⁻¹ K⁻¹] for named SI parameters. */
  evaluate(temperatureK: number, fieldT: number, params: Readonly<Record<string, number>>): number;
  /**
   * Global start: a search interval per nonlinear parameter (log-spaced when both ends > 0)
   * from the data of the measurements it applies to; the amplitudes are solved exactly.
   */
  ranges(data: JointRangeData): Readonly<Record<string, readonly [number, number]>>;
  /** true when the model cannot determine its parameters unless some field is non-zero. */
  readonly needsField: boolean;
}

type Spec = Omit<JointParameterSpec, "lower" | "upper" | "defaultShared"> & Partial<Pick<JointParameterSpec, "lower" | "upper" | "defaultShared">>;

function p(spec: Spec): JointParameterSpec {
  return Object.freeze({ lower: -Infinity, upper: Infinity, defaultShared: true, ...spec });
}

const GAMMA = p({ name: "gamma", unit: "J/(mol*K^2)", displayUnit: "mJ/(mol*K^2)", displayFactor: 1e3, symbol: "γ", label: "Sommerfeld coefficient", description: "Sommerfeld coefficient γ" });
const BETA = p({ name: "beta", unit: "J/(mol*K^4)", displayUnit: "mJ/(mol*K^4)", displayFactor: 1e3, symbol: "β", label: "lattice T³ coefficient", description: "lattice T³ coefficient β" });
const DELTA = p({ name: "delta", unit: "J/(mol*K^6)", displayUnit: "mJ/(mol*K^6)", displayFactor: 1e3, symbol: "δ", label: "T⁵ dispersion coefficient", description: "T⁵ dispersion coefficient δ" });
const N = p({ name: "n", unit: "1", displayUnit: "1", displayFactor: 1, symbol: "n", label: "two-level centres per formula unit", description: "two-level centres per formula unit", lower: 0 });
const G = p({ name: "g", unit: "1", displayUnit: "1", displayFactor: 1, symbol: "g", label: "g-factor of the doublet", description: "effective g-factor of the split doublet", lower: 0, upper: 100 });
const DELTA0 = p({ name: "delta0", unit: "K", displayUnit: "K", displayFactor: 1, symbol: "Δ_0", label: "zero-field splitting", description: "zero-field splitting Δ₀/k_B", lower: 0, upper: 1e5 });
const A_FIELD = p({ name: "a", unit: "J*K/(mol*T^2)", displayUnit: "mJ*K/(mol*T^2)", displayFactor: 1e3, symbol: "a", label: "nuclear tail per field²", description: "nuclear tail coefficient per field², A(H) = a H²" });
const A_ZERO = p({ name: "A0", unit: "J*K/mol", displayUnit: "mJ*K/mol", displayFactor: 1e3, symbol: "A_0", label: "zero-field nuclear tail", description: "zero-field nuclear tail coefficient A₀" });

/** μ_B/k_B [K/T] for the g range. */
const MU_B_OVER_K_B = BOHR_MAGNETON_J_PER_T / BOLTZMANN_J_PER_K;

function span(t: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < t.length; i++) [lo, hi] = [Math.min(lo, t[i]), Math.max(hi, t[i])];
  return [lo, hi];
}

/**
 * g such that the Zeeman gap of the fields spans 1/20 of the lowest T (only the tail seen) to
 * 40 × the highest (frozen out), as the single-curve Schottky search does for Δ; within [1e-3, 100].
 */
function gRange(data: JointRangeData): [number, number] {
  const [tMin, tMax] = span(data.temperatureK);
  const fields = data.fieldsT.map(Math.abs).filter((h) => h > 0);
  if (!fields.length) return [0.1, 10];
  const [hMin, hMax] = span(fields);
  const lo = Math.max(1e-3, tMin / 20 / (MU_B_OVER_K_B * hMax));
  const hi = Math.min(100, (40 * tMax) / (MU_B_OVER_K_B * hMin));
  return hi > lo ? [lo, hi] : [0.1, 10];
}

function gapRange(data: JointRangeData): [number, number] {
  const [tMin, tMax] = span(data.temperatureK);
  return [Math.max(1e-6, tMin / 20), Math.min(1e5, 40 * tMax)];
}

function define(spec: Omit<JointModelSpec, "evaluate" | "needsField"> & { needsField?: boolean }): JointModelSpec {
  const compiled = compileJointExpression(spec.expression);
  const names = compiled.parameters;
  const missing = spec.parameters.map((q) => q.name).filter((n) => !names.includes(n));
  if (missing.length || names.length !== spec.parameters.length) throw new Error(`joint model ${spec.name}: parameters ${names.join(", ")} do not match its spec`);
  const x = new Float64Array(1);
  const out = new Float64Array(1);
  return Object.freeze({
    needsField: false,
    ...spec,
    parameters: Object.freeze(names.map((n) => spec.parameters.find((q) => q.name === n)!)),
    evaluate(temperatureK: number, fieldT: number, params: Readonly<Record<string, number>>): number {
      x[0] = temperatureK;
      compiled.evaluate(x, Float64Array.from([...names.map((n) => params[n]), fieldT]), out, 0);
      return out[0];
    },
  });
}

/** Compile a joint-fit expression: variable T, extra variable H, the named constants. */
export function compileJointExpression(text: string): CompiledExpression {
  return compileExpression(text, { variable: "T", extraVariables: ["H"], namedConstants: true });
}

const ZEEMAN_X = "(g*muB*abs(H)/(kB*T))";
const ZEEMAN_INTERNAL_X = "(sqrt(delta0^2 + (g*muB*H/kB)^2)/T)";
const schottkyTerm = (x: string) => `n*R*${x}^2*exp(-${x})/(1+exp(-${x}))^2`;

export const JOINT_MODELS: Readonly<Record<string, JointModelSpec>> = Object.freeze(
  Object.fromEntries(
    [
      define({
        name: "zeeman-schottky",
        title: "γT + βT³ + Zeeman-split two-level Schottky",
        formula: "C = γT + βT³ + n R x² eˣ/(1 + eˣ)², x = Δ/T, Δ = g μB H/kB",
        expression: `gamma*T + beta*T^3 + ${schottkyTerm(ZEEMAN_X)}`,
        parameters: [GAMMA, BETA, N, G],
        ranges: (data) => ({ g: gRange(data) }),
        needsField: true,
      }),
      define({
        name: "zeeman-schottky-internal",
        title: "γT + βT³ + two-level Schottky, zero-field splitting and Zeeman gap in quadrature",
        formula: "C = γT + βT³ + n R x² eˣ/(1 + eˣ)², x = Δ/T, Δ = √(Δ₀² + (g μB H/kB)²)",
        expression: `gamma*T + beta*T^3 + ${schottkyTerm(ZEEMAN_INTERNAL_X)}`,
        parameters: [GAMMA, BETA, N, G, DELTA0],
        ranges: (data) => ({ g: gRange(data), delta0: gapRange(data) }),
        needsField: true,
      }),
      define({
        name: "zeeman-schottky-nuclear",
        title: "γT + βT³ + Zeeman-split two-level Schottky + nuclear tail a H²/T²",
        formula: "C = γT + βT³ + n R x² eˣ/(1 + eˣ)² + a H²/T², x = Δ/T, Δ = g μ_B H/k_B",
        expression: `gamma*T + beta*T^3 + ${schottkyTerm(ZEEMAN_X)} + a*H^2/T^2`,
        parameters: [GAMMA, BETA, N, G, A_FIELD],
        ranges: (data) => ({ g: gRange(data) }),
        needsField: true,
      }),
      define({
        name: "nuclear-field",
        title: "γT + βT³ + nuclear tail a H²/T²",
        formula: "C = γT + βT³ + a H²/T²",
        expression: "gamma*T + beta*T^3 + a*H^2/T^2",
        parameters: [GAMMA, BETA, A_FIELD],
        ranges: () => ({}),
        needsField: true,
      }),
      define({
        name: "nuclear-field-a0",
        title: "γT + βT³ + nuclear tail (A₀ + a H²)/T²",
        formula: "C = γT + βT³ + (A₀ + a H²)/T²",
        expression: "gamma*T + beta*T^3 + (A0 + a*H^2)/T^2",
        parameters: [GAMMA, BETA, A_ZERO, A_FIELD],
        ranges: () => ({}),
        needsField: true,
      }),
      define({
        name: "normal-state",
        title: "normal state γT + βT³ (fields above Hc2)",
        formula: "C = γT + βT³",
        expression: "gamma*T + beta*T^3",
        parameters: [GAMMA, BETA],
        ranges: () => ({}),
      }),
      define({
        name: "normal-state-t5",
        title: "normal state γT + βT³ + δT⁵ (fields above Hc2)",
        formula: "C = γT + βT³ + δT⁵",
        expression: "gamma*T + beta*T^3 + delta*T^5",
        parameters: [GAMMA, BETA, DELTA],
        ranges: () => ({}),
      }),
    ].map((m) => [m.name, m]),
  ),
);

/**
 * The spec of parameter `name` of `model`: a joint model's or a single-curve registry model's
 * (their names do not overlap); undefined for a user expression's parameter.
 */
export function parameterSpecOf(model: string, name: string): { readonly symbol: string; readonly label: string } | undefined {
  const specs = Object.hasOwn(JOINT_MODELS, model) ? JOINT_MODELS[model]!.parameters : Object.hasOwn(MODELS, model) ? MODELS[model as keyof typeof MODELS].parameters : [];
  return specs.find((q) => q.name === name);
}
