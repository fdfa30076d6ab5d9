/**
 * fitJoint: one model fitted to several C(T) measurements of one sample at once, each with its
 * applied field H [T] and temperature window. Parameters named in `shared` appear once; the
 * others once per measurement (keys "name#k", k from 1). Everything SI: T [K], C and σ
 * [J mol⁻¹ K⁻¹], H [T].
 *
 * The stacked problem: the residuals of all curves in one vector, weighted by σ (all
 * measurements give σ, or none: then unweighted with the covariance scaled by the residual
 * variance, as the single fit); standard errors and correlations from the joint covariance;
 * χ², dof and AICc over all points (result.ts). Linear models: QR. Nonlinear ones get a global
 * start: the amplitudes (γ, β, n, a …) solved exactly on a grid over the nonlinear parameters
 * (named and registry models: ranges from the data; at most 3 axes), or a deterministic
 * multi-start (expressions); with per-measurement nonlinear parameters, first a fit with them
 * tied (shared), whose end point is one more start of the untied search. Then
 * Levenberg–Marquardt on the stacked problem. A fit that ends above a χ² the search met is
 * `converged: false`. With one measurement the result equals fitHeatCapacity's.
 *
 * Models: JOINT_MODELS (jointModels.ts), the single-curve registry (no H; γ, β, δ, ε shared by
 * default) or {expression} in T and H with the constants R, kB, muB, NA (default: nothing
 * shared). Throws InputError naming the field (`measurements[2].temperatureK`, `shared`,
 * `start.g#3`, …) for: no measurements, unequal lengths, non-finite values, T ≤ 0, σ ≤ 0, σ
 * given for some measurements only, an unknown or ill-formed parameter key, a value outside
 * its bounds, a window with too few points, dof ≤ 0, every field zero for a field model, more
 * than MAX_MEASUREMENTS measurements, MAX_JOINT_PARAMETERS free parameters or
 * MAX_JACOBIAN_ENTRIES points × free parameters.
 */
import { InputError } from "../errors";
import { fitCore, type CoreOptions } from "./core";
import { checkSeries } from "./curve";
import { fitSeparableCore } from "./expressionFit";
import { fitGlobal } from "./global";
import { buildLayout, jointCore, localModel, type Layout, type LocalModel, type Stacked } from "./jointCore";
import type { FitResult } from "./result";
import type { Axis } from "./separable";
import { jointResult } from "./jointResult";

export interface JointMeasurement {
  readonly label: string;
  readonly fieldT: number;
  readonly temperatureK: readonly number[];
  readonly heatCapacity: readonly number[];
  readonly sigma?: readonly number[] | null;
  readonly tMinK?: number | null;
  readonly tMaxK?: number | null;
}

export interface JointFitOptions {
  readonly model: string | { readonly expression: string };
  /** Names of parameters shared by all measurements (default: the model's default shared set). */
  readonly shared?: readonly string[];
  /** SI, keys "name" (shared, or every measurement) or "name#k". */
  readonly start?: Readonly<Record<string, number>>;
  readonly fixed?: Readonly<Record<string, number>>;
  readonly scaleErrors?: boolean;
  /** Atoms per formula unit for registry lattice models (default 1). */
  readonly r?: number;
}

export interface JointParameter {
  /** "gamma" when shared, "n#2" per measurement (k from 1). */
  readonly key: string;
  readonly name: string;
  /** 1-based measurement index, or null when shared. */
  readonly measurement: number | null;
  readonly value: number;
  readonly stdError: number | null;
  readonly unit: string;
  readonly fixed: boolean;
  readonly atBound?: boolean;
}

export interface JointMeasurementResult {
  readonly index: number;
  readonly label: string;
  readonly fieldT: number;
  readonly window: { readonly tMinK: number; readonly tMaxK: number; readonly nPoints: number };
  readonly temperatureK: number[];
  readonly heatCapacity: number[];
  readonly sigma: number[] | null;
  readonly inWindow: boolean[];
  readonly fitted: (number | null)[];
  readonly residuals: (number | null)[];
  readonly chiSquare: number;
  readonly curve: { readonly temperatureK: number[]; readonly heatCapacity: number[] };
  readonly parameters: Record<string, { readonly value: number; readonly stdError: number | null }>;
}

export interface JointFitResult {
  readonly model: string;
  readonly title: string;
  readonly formula: string;
  readonly expression: string | null;
  readonly parameters: JointParameter[];
  readonly shared: string[];
  readonly perMeasurement: string[];
  readonly covariance: { readonly names: string[]; readonly matrix: number[][] } | null;
  readonly correlation: { readonly names: string[]; readonly matrix: number[][] } | null;
  readonly chiSquare: number;
  readonly dof: number;
  readonly reducedChiSquare: number | null;
  readonly aicc: number | null;
  readonly nPoints: number;
  readonly weighted: boolean;
  readonly converged: boolean;
  readonly errorsScaledByReducedChiSquare: boolean;
  readonly message: string;
  readonly evaluations: number;
  readonly measurements: JointMeasurementResult[];
  readonly warnings: string[];
}

/** Fit `options.model` jointly to `measurements`. See the module comment. */
export function fitJoint(measurements: readonly JointMeasurement[], options: JointFitOptions): JointFitResult {
  if (!Array.isArray(measurements) || measurements.length === 0) throw new InputError("no measurements to fit (give at least one)", { field: "measurements" });
  if (measurements.length > MAX_MEASUREMENTS) throw new InputError(`${measurements.length} measurements, at most ${MAX_MEASUREMENTS} in one joint fit`, { field: "measurements" });
  const r = options.r ?? 1;
  if (!(r > 0 && Number.isFinite(r))) throw new InputError(`invalid r: ${r} (atoms per formula unit must be > 0)`, { field: "r" });
  const model = localModel(options.model, r);
  const series = measurements.map(checkMeasurement);
  const shared = sharedSet(model, options.shared);
  const layout = buildLayout(model, shared, measurements.length);
  const data = stack(series);
  const opt = coreOptions(model, layout, options, series);
  checkCounts(model, layout, opt, series, data);
  const fit = runFit(model, layout, data, opt, series, options);
  return jointResult(model, layout, fit, series, data);
}

/** A checked measurement: arrays, its window and the in-window indices. */
export interface CheckedMeasurement {
  readonly label: string;
  readonly fieldT: number;
  readonly T: Float64Array;
  readonly C: Float64Array;
  readonly sigma: Float64Array | null;
  readonly tMinK: number | null;
  readonly tMaxK: number | null;
  readonly indices: number[];
}

function checkMeasurement(m: JointMeasurement, k: number): CheckedMeasurement {
  const at = `measurements[${k}]`;
  if (!m || typeof m !== "object") throw new InputError(`invalid ${at}: not a measurement`, { field: at });
  if (!(typeof m.fieldT === "number" && Number.isFinite(m.fieldT))) throw new InputError(`invalid ${at}.fieldT: ${String(m.fieldT)} (a finite field in tesla)`, { field: `${at}.fieldT` });
  const list = (v: unknown) => Array.isArray(v) || (ArrayBuffer.isView(v) && !(v instanceof DataView));
  if (!list(m.temperatureK)) throw new InputError(`invalid ${at}.temperatureK: not a list of numbers`, { field: `${at}.temperatureK` });
  if (!list(m.heatCapacity)) throw new InputError(`invalid ${at}.heatCapacity: not a list of numbers`, { field: `${at}.heatCapacity` });
  if (m.sigma != null && !list(m.sigma)) throw new InputError(`invalid ${at}.sigma: not a list of numbers`, { field: `${at}.sigma` });
  let s;
  try {
    s = checkSeries(m.temperatureK, m.heatCapacity, m.sigma ?? undefined, [`${at}.temperatureK`, `${at}.heatCapacity`, `${at}.sigma`]);
  } catch (e) {
    if (e instanceof InputError) throw new InputError(e.baseMessage, { field: e.where?.field, line: e.where?.line });
    throw e;
  }
  s.x.forEach((t, i) => {
    if (t <= 0) throw new InputError(`invalid ${at}.temperatureK: ${t} at point ${i + 1} (must be > 0 K)`, { field: `${at}.temperatureK`, line: i + 1 });
  });
  const edge = (v: number | null | undefined, name: string) => {
    if (v == null) return null;
    if (!(typeof v === "number" && Number.isFinite(v))) throw new InputError(`invalid ${at}.${name}: ${String(v)}`, { field: `${at}.${name}` });
    return v;
  };
  const [lo, hi] = [edge(m.tMinK, "tMinK"), edge(m.tMaxK, "tMaxK")];
  if (lo !== null && hi !== null && lo > hi) throw new InputError(`invalid window of ${at}: tMinK ${lo} > tMaxK ${hi}`, { field: `${at}.tMinK` });
  const indices: number[] = [];
  s.x.forEach((t, i) => (lo === null || t >= lo) && (hi === null || t <= hi) && indices.push(i));
  return { label: String(m.label ?? `measurement ${k + 1}`), fieldT: m.fieldT, T: s.x, C: s.y, sigma: s.sigma, tMinK: lo, tMaxK: hi, indices };
}

function sharedSet(model: LocalModel, shared: readonly string[] | undefined): Set<string> {
  if (shared === undefined) return new Set(model.defaultShared);
  if (!Array.isArray(shared)) throw new InputError("invalid shared: a list of parameter names", { field: "shared" });
  for (const n of shared) {
    if (!model.names.includes(n)) throw new InputError(`invalid shared: ${JSON.stringify(n)} is not a parameter of ${model.name} (it has ${model.names.join(", ")})`, { field: "shared" });
  }
  return new Set(shared);
}

function stack(series: readonly CheckedMeasurement[]): Stacked {
  const all = series.flatMap((s, k) => s.indices.map((i) => [k, i] as const));
  const weighted = series.map((s) => s.sigma !== null);
  const some = weighted.indexOf(true);
  const none = weighted.indexOf(false);
  if (some >= 0 && none >= 0) throw new InputError(`σ missing for measurements[${none}] while measurements[${some}] has σ (give σ for every measurement or for none)`, { field: `measurements[${none}].sigma` });
  return {
    T: Float64Array.from(all, ([k, i]) => series[k].T[i]),
    y: Float64Array.from(all, ([k, i]) => series[k].C[i]),
    sigma: some >= 0 ? Float64Array.from(all, ([k, i]) => series[k].sigma![i]) : null,
    k: Int32Array.from(all, ([k]) => k),
    fieldsT: series.map((s) => s.fieldT),
  };
}

/** "name" or "name#k" → the stacked indices it sets; InputError naming `flag.key` otherwise. */
function keyIndices(layout: Layout, model: LocalModel, key: string, flag: string, count: number): number[] {
  const m = /^([^#]+)(?:#(\d+))?$/.exec(key);
  const field = `${flag}.${key}`;
  if (!m || !model.names.includes(m[1])) throw new InputError(`invalid ${field}: ${JSON.stringify(m?.[1] ?? key)} is not a parameter of ${model.name} (it has ${model.names.join(", ")})`, { field });
  const [name, kText] = [m[1], m[2]];
  if (kText === undefined) return layout.keys.map((_, j) => j).filter((j) => layout.names[j] === name);
  const k = Number(kText);
  if (layout.shared.includes(name)) throw new InputError(`invalid ${field}: ${name} is shared, give ${flag}.${name}`, { field });
  if (!(k >= 1 && k <= count)) throw new InputError(`invalid ${field}: measurement ${k} does not exist (1 to ${count})`, { field });
  return [layout.keys.indexOf(`${name}#${k}`)];
}

function coreOptions(model: LocalModel, layout: Layout, options: JointFitOptions, series: readonly CheckedMeasurement[]): CoreOptions {
  const n = layout.keys.length;
  const local = (j: number) => model.names.indexOf(layout.names[j]);
  const lower = Float64Array.from(layout.keys, (_, j) => model.lower[local(j)]);
  const upper = Float64Array.from(layout.keys, (_, j) => model.upper[local(j)]);
  const start = new Float64Array(n).fill(NaN);
  const fixed = new Array<boolean>(n).fill(false);
  const assign = (values: Readonly<Record<string, number>> | undefined, flag: string, hold: boolean) => {
    if (values !== undefined && (values === null || typeof values !== "object")) throw new InputError(`invalid ${flag}: a record of parameter values`, { field: flag });
    for (const [key, v] of Object.entries(values ?? {})) {
      const idx = keyIndices(layout, model, key, flag, series.length);
      const j0 = idx[0];
      if (!(typeof v === "number" && Number.isFinite(v) && v >= lower[j0] && v <= upper[j0])) throw new InputError(`invalid ${flag}.${key}: ${String(v)} (must be a finite number in [${lower[j0]}, ${upper[j0]}] ${model.units[local(j0)]})`.replace(/ \)$/, ")"), { field: `${flag}.${key}` });
      for (const j of idx) {
        if (hold || !fixed[j]) start[j] = v;
        if (hold) fixed[j] = true;
      }
    }
  };
  // defaults of registry parameters (held unless given a start), then starts, then fixed values
  const given = new Set(Object.keys(options.start ?? {}).map((k) => k.split("#")[0]));
  layout.keys.forEach((_, j) => {
    const d = model.fixedByDefault[local(j)];
    if (typeof d === "number" && !given.has(layout.names[j])) [start[j], fixed[j]] = [d, true];
  });
  assign(options.start, "start", false);
  assign(options.fixed, "fixed", true);
  layout.keys.forEach((key, j) => {
    if (model.fixedByDefault[local(j)] === "required" && !fixed[j]) throw new InputError(`model ${model.name} needs ${layout.names[j]} in fixed (fixed.${key})`, { field: `fixed.${key}` });
  });
  return { start, fixed, lower, upper, scaleErrors: options.scaleErrors ?? false };
}

function checkCounts(model: LocalModel, layout: Layout, opt: CoreOptions, series: readonly CheckedMeasurement[], data: Stacked): void {
  series.forEach((s, k) => {
    const own = layout.keys.filter((_, j) => layout.measurement[j] === k && !opt.fixed[j]).length;
    const need = Math.max(1, own);
    if (s.indices.length < need) {
      const where = s.tMinK !== null || s.tMaxK !== null ? `its window [${s.tMinK ?? "min"}, ${s.tMaxK ?? "max"}] K holds` : "it has";
      throw new InputError(`measurements[${k}] (${s.label}): ${where} ${s.indices.length} point${s.indices.length === 1 ? "" : "s"}, at least ${need} needed for its ${own} own free parameter${own === 1 ? "" : "s"}`, { field: `measurements[${k}].${s.tMinK !== null ? "tMinK" : s.tMaxK !== null ? "tMaxK" : "temperatureK"}` });
    }
  });
  const nFree = opt.fixed.filter((f) => !f).length;
  if (nFree > MAX_JOINT_PARAMETERS) throw new InputError(`${nFree} free parameters, at most ${MAX_JOINT_PARAMETERS} in one joint fit (share more of them)`, { field: "shared" });
  if (data.T.length * nFree > MAX_JACOBIAN_ENTRIES) throw new InputError(`${data.T.length} points × ${nFree} free parameters exceed the limit of ${MAX_JACOBIAN_ENTRIES / 1e6} million for one joint fit (narrow the windows or share more parameters)`, { field: "measurements" });
  if (data.T.length - nFree <= 0) throw new InputError(`${data.T.length} points in all windows cannot determine ${nFree} free parameters (dof = ${data.T.length - nFree} ≤ 0)`, { field: "measurements" });
  if (model.needsField && series.every((s) => s.fieldT === 0)) throw new InputError(`model ${model.name} needs a non-zero field in at least one measurement (all fieldT are 0)`, { field: "measurements[0].fieldT" });
}

const GRID_BUDGET = 4000;
/** Limits that keep one joint fit bounded in memory and time (the Jacobian is points × free parameters). */
export const MAX_MEASUREMENTS = 64;
export const MAX_JOINT_PARAMETERS = 128;
export const MAX_JACOBIAN_ENTRIES = 2e7;

/** Choose and run the search; see the module comment. */
function runFit(model: LocalModel, layout: Layout, data: Stacked, opt: CoreOptions, series: readonly CheckedMeasurement[], options: JointFitOptions): FitResult {
  const core = jointCore(model, layout, data);
  const x = Float64Array.from(data.T, (_, i) => i);
  if (model.linear) return fitCore(core, x, data.y, data.sigma, opt);
  const free = layout.keys.map((_, j) => j).filter((j) => !opt.fixed[j]);
  const linear = free.filter((j) => model.linearNames.includes(layout.names[j]));
  const nonlinear = free.filter((j) => !linear.includes(j));
  const startsGiven = nonlinear.every((j) => Number.isFinite(opt.start[j]));
  const perNonlinear = nonlinear.filter((j) => layout.measurement[j] !== null);
  const axes = model.ranges ? searchAxes(model, layout, data, series, nonlinear, opt) : null;
  if (model.kind === "registry") opt = { ...opt, start: registryStart(model, layout, series, opt) };
  const guessStart = opt.start.every(Number.isFinite) ? [new Float64Array(opt.start)] : [];
  const grid = axes !== null && axes.length <= 3;
  const scale = absSpan(data.T);
  const sep = { core, linearParameters: layout.keys.filter((_, j) => model.linearNames.includes(layout.names[j])), derivativeTerms: model.derivativeTerms, xScale: scale };
  if (startsGiven) return axes ? fitGlobal(core, x, data.y, data.sigma, opt, { linear, nonlinear, axes, extraStarts: [opt.start], budget: GRID_BUDGET, startsOnly: true }) : fitSeparableCore(sep, x, data.y, data.sigma, opt);
  if (perNonlinear.length > 0 && series.length > 1) {
    // tie the per-measurement nonlinear parameters, fit, and start the untied search from there too
    const tiedLayout = buildLayout(model, new Set([...layout.shared, ...perNonlinear.map((j) => layout.names[j])]), series.length);
    const tie = tieOptions(layout, tiedLayout, opt);
    const tied = runFit(model, tiedLayout, data, tie.opt, series, options);
    const at = (key: string, name: string) => tied.parameters[tiedLayout.keys.includes(key) ? tiedLayout.keys.indexOf(key) : tiedLayout.keys.indexOf(name)].value;
    const untied = Float64Array.from(layout.keys, (key, j) => (opt.fixed[j] ? opt.start[j] : at(key, layout.names[j])));
    const budget = grid ? GRID_BUDGET : Math.max(300, Math.min(40000, Math.floor(4e7 / (data.T.length * (model.derivativeTerms + 8)))));
    const fit = fitGlobal(core, x, data.y, data.sigma, opt, { linear, nonlinear, axes: grid ? axes : null, extraStarts: [untied], budget, xScale: scale });
    return tie.nested ? checkAgainstTied(fit, tied, [...new Set(perNonlinear.map((j) => layout.names[j]))]) : fit;
  }
  if (grid) return fitGlobal(core, x, data.y, data.sigma, opt, { linear, nonlinear, axes, extraStarts: guessStart, budget: GRID_BUDGET });
  if (model.kind === "registry" && !axes) return fitCore(core, x, data.y, data.sigma, opt);
  return fitSeparableCore(sep, x, data.y, data.sigma, opt);
}

function absSpan(T: Float64Array): [number, number] {
  let lo = Infinity;
  let hi = 0;
  for (const v of T) if (v !== 0) [lo, hi] = [Math.min(lo, Math.abs(v)), Math.max(hi, Math.abs(v))];
  return [lo, hi];
}

/** One axis per nonlinear free key from the model's ranges (per measurement: its own data), clipped to the bounds; null when a range is missing. */
function searchAxes(model: LocalModel, layout: Layout, data: Stacked, series: readonly CheckedMeasurement[], nonlinear: readonly number[], opt: CoreOptions): Axis[] | null {
  const all = model.ranges!({ temperatureK: data.T, fieldsT: data.fieldsT });
  const axes: Axis[] = [];
  for (const j of nonlinear) {
    const k = layout.measurement[j];
    const ranges = k === null ? all : model.ranges!({ temperatureK: Float64Array.from(series[k].indices, (i) => series[k].T[i]), fieldsT: [series[k].fieldT] });
    const range = ranges[layout.names[j]];
    if (!range) return null;
    const axis = { lo: Math.max(range[0], opt.lower[j]), hi: Math.min(range[1], opt.upper[j]) };
    if (!(axis.hi > axis.lo)) return null;
    axes.push(axis);
  }
  return axes;
}

/** Registry models: the model's guess (pooled data for shared keys, each measurement's own for the rest) where no start is given. */
function registryStart(model: LocalModel, layout: Layout, series: readonly CheckedMeasurement[], opt: CoreOptions): Float64Array {
  const pick = (s: CheckedMeasurement, a: Float64Array) => s.indices.map((i) => a[i]);
  const pooled = model.guess!(Float64Array.from(series.flatMap((s) => pick(s, s.T))), Float64Array.from(series.flatMap((s) => pick(s, s.C))));
  const own = series.map((s) => model.guess!(Float64Array.from(pick(s, s.T)), Float64Array.from(pick(s, s.C))));
  return Float64Array.from(opt.start, (v, j) => {
    if (Number.isFinite(v)) return v;
    const k = layout.measurement[j];
    const g = (k === null ? pooled : own[k])[layout.names[j]];
    return g !== undefined && Number.isFinite(g) ? g : NaN;
  });
}

/**
 * Options of the tied problem: a tied key is fixed when any of its measurements' keys is (at that
 * value), else starts from the first given start. `nested` is true when the tied problem is a
 * special case of the untied one (no two different fixed values tied together).
 */
function tieOptions(layout: Layout, tied: Layout, opt: CoreOptions): { opt: CoreOptions; nested: boolean } {
  const from = (key: string) => layout.keys.map((_, j) => j).filter((j) => layout.keys[j] === key || (layout.names[j] === key && layout.measurement[j] !== null));
  const src = tied.keys.map(from);
  const held = src.map((js) => js.filter((j) => opt.fixed[j]));
  const nested = held.every((js) => js.every((j) => opt.start[j] === opt.start[js[0]]));
  return {
    nested,
    opt: {
      ...opt,
      start: Float64Array.from(src, (js, t) => (held[t].length ? opt.start[held[t][0]] : (js.map((j) => opt.start[j]).find(Number.isFinite) ?? NaN))),
      fixed: held.map((js) => js.length > 0),
      lower: Float64Array.from(src, (js) => opt.lower[js[0]]),
      upper: Float64Array.from(src, (js) => opt.upper[js[0]]),
    },
  };
}

/** The untied problem contains the tied one: ending above its χ² is not a minimum. */
function checkAgainstTied(fit: FitResult, tied: FitResult, names: readonly string[]): FitResult {
  const [a, b] = [fit.chiSquare ?? Infinity, tied.chiSquare ?? Infinity];
  if (!(a > b * (1 + 1e-9) + 1e-300)) return Object.freeze({ ...fit, evaluations: fit.evaluations + tied.evaluations, message: `${fit.message}; one more start from the fit with ${names.join(", ")} shared (χ² = ${b.toPrecision(6)})` });
  const why = `ended at χ² = ${a.toPrecision(6)} although the fit with the per-measurement nonlinear parameters tied met χ² = ${b.toPrecision(6)}: not the global minimum`;
  return Object.freeze({ ...fit, converged: false, message: `${fit.message}; ${why}`, warnings: Object.freeze([...fit.warnings, `not converged: ${why}`]) });
}
