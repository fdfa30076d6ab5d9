/**
 * fitHeatCapacity: fit a registered model or a user expression to C(T) over a window.
 *
 * data: temperatureK [K], heatCapacity [J mol⁻¹ K⁻¹], optional sigma (same unit, > 0).
 * options: model (registry name or {expression} over T), tMinK/tMaxK (inclusive window),
 * fixed {name: value}, free [names of parameters fixed by default to release], start,
 * bounds, scaleErrors, r (atoms per formula unit, default 1).
 * Linear models go to QR. Nonlinear registry models: a global search over their nonlinear
 * parameters with the amplitudes solved exactly (fit/global.ts, ranges from the model's
 * separable spec), then LM; with `start` for every free nonlinear parameter, LM from it,
 * checked against the search (option globalSearch). User expressions: expressionFit.ts.
 * Returns the FitResult (parameters in SI) plus window and model info and the physicist's
 * warnings (warnings.ts). Throws InputError for unequal lengths, non-finite or
 * non-positive T, σ ≤ 0, an unknown model or parameter, a required fixed parameter left
 * unset, or an empty window.
 */
import { InputError } from "../errors";
import { getModel } from "../models/registry";
import type { HeatCapacityModel, ModelOptions } from "../models/types";
import { compileExpression } from "../expression/compile";
import { fitCore, type CoreOptions, type ModelCore } from "./core";
import { checkSeries } from "./curve";
import { fitExpression } from "./expressionFit";
import { fitGlobal, type GlobalSearch } from "./global";
import type { FitResult } from "./result";
import { heatCapacityWarnings } from "./warnings";

export interface HeatCapacityInput {
  readonly temperatureK: ArrayLike<number>;
  readonly heatCapacity: ArrayLike<number>;
  readonly sigma?: ArrayLike<number>;
}

export interface HeatCapacityFitOptions {
  readonly model?: string | { readonly expression: string };
  readonly tMinK?: number;
  readonly tMaxK?: number;
  readonly fixed?: Readonly<Record<string, number>>;
  readonly free?: readonly string[];
  readonly start?: Readonly<Record<string, number>>;
  readonly bounds?: Readonly<Record<string, readonly [number | null, number | null]>>;
  readonly scaleErrors?: boolean;
  readonly r?: number;
  /**
   * Nonlinear models: search for the global minimum (default true). Without a start for
   * every free nonlinear parameter the search provides it; with one, LM runs from the given
   * start and the search only checks that no lower χ² exists (else converged: false).
   * false: LM from the start (or the model's guess) alone — for callers that pass a start
   * known to be close, e.g. from a neighbouring window.
   */
  readonly globalSearch?: boolean;
}

export interface FitWindow {
  readonly tMinK: number | null;
  readonly tMaxK: number | null;
  readonly nPoints: number;
  /** Indices of the points used, into the input arrays. */
  readonly indices: readonly number[];
}

export interface HeatCapacityFitResult extends FitResult {
  readonly modelName: string;
  readonly r: number;
  readonly window: FitWindow;
}

/** A ModelCore over a registry model (named parameters built once per vector evaluation). */
export function registryCore(model: HeatCapacityModel, options: ModelOptions): ModelCore {
  const names = model.parameters.map((p) => p.name);
  const record = (p: Float64Array) => Object.fromEntries(names.map((n, j) => [n, p[j]]));
  const grad = model.gradient;
  return {
    label: model.name,
    names,
    units: model.parameters.map((p) => p.unit),
    linear: model.linear,
    evaluate: (x, p, out) => {
      const rec = record(p);
      for (let i = 0; i < x.length; i++) out[i] = model.evaluate(x[i], rec, options);
    },
    jacobian: model.linear
      ? (x, _p, out) => model.basis!.forEach((phi, j) => x.forEach((t, i) => (out[j * x.length + i] = phi(t))))
      : grad
        ? (x, p, out) => {
            const rec = record(p);
            for (let i = 0; i < x.length; i++) {
              const g = grad(x[i], rec, options);
              names.forEach((n, j) => (out[j * x.length + i] = g[n]));
            }
          }
        : null,
  };
}

function selectWindow(T: Float64Array, tMin: number | undefined, tMax: number | undefined): number[] {
  for (const [name, v] of [["tMinK", tMin], ["tMaxK", tMax]] as const) if (v !== undefined && !Number.isFinite(v)) throw new InputError(`invalid ${name}: ${v}`, { field: name });
  if (tMin !== undefined && tMax !== undefined && tMin > tMax) throw new InputError(`invalid window: tMinK ${tMin} > tMaxK ${tMax}`, { field: "tMinK" });
  const idx: number[] = [];
  T.forEach((t, i) => {
    if ((tMin === undefined || t >= tMin) && (tMax === undefined || t <= tMax)) idx.push(i);
  });
  if (idx.length === 0) throw new InputError(`no points in the window [${tMin ?? "−∞"}, ${tMax ?? "∞"}] K`, { field: "tMinK" });
  return idx;
}

/** Fit C(T). See the module comment for units, defaults and failure modes. */
export function fitHeatCapacity(data: HeatCapacityInput, options: HeatCapacityFitOptions = {}): HeatCapacityFitResult {
  const all = checkSeries(data.temperatureK, data.heatCapacity, data.sigma, ["temperatureK", "heatCapacity", "sigma"]);
  all.x.forEach((t, i) => {
    if (t <= 0) throw new InputError(`invalid temperatureK: ${t} at point ${i + 1} (must be > 0 K)`, { field: "temperatureK", line: i + 1 });
  });
  const r = options.r ?? 1;
  if (!(r > 0)) throw new InputError(`invalid r: ${r} (atoms per formula unit must be > 0)`, { field: "r" });
  const idx = selectWindow(all.x, options.tMinK, options.tMaxK);
  const x = Float64Array.from(idx, (i) => all.x[i]);
  const y = Float64Array.from(idx, (i) => all.y[i]);
  const sigma = all.sigma ? Float64Array.from(idx, (i) => all.sigma![i]) : null;
  const spec = options.model ?? "sommerfeld";
  const setup = typeof spec === "string" ? registrySetup(getModel(spec), { temperatureK: x, heatCapacity: y }, options) : expressionSetup(spec.expression, options);
  const fit = setup.run(x, y, sigma, { ...setup, scaleErrors: options.scaleErrors ?? false });
  const warnings = heatCapacityWarnings(fit, { modelName: setup.core.label, temperatureK: x, heatCapacity: y, r, scaleErrors: options.scaleErrors ?? false });
  return Object.freeze({
    ...fit,
    warnings: Object.freeze([...fit.warnings, ...warnings]),
    modelName: setup.core.label,
    r,
    window: Object.freeze({ tMinK: options.tMinK ?? null, tMaxK: options.tMaxK ?? null, nPoints: idx.length, indices: Object.freeze(idx) }),
  });
}

function checkNames(names: readonly string[], options: HeatCapacityFitOptions): void {
  const given = [...Object.keys(options.fixed ?? {}), ...Object.keys(options.start ?? {}), ...Object.keys(options.bounds ?? {}), ...(options.free ?? [])];
  for (const k of given) if (!names.includes(k)) throw new InputError(`unknown parameter ${JSON.stringify(k)} (the model has ${names.join(", ")})`, { field: k });
}

function registrySetup(model: HeatCapacityModel, data: { temperatureK: Float64Array; heatCapacity: Float64Array }, options: HeatCapacityFitOptions) {
  const names = model.parameters.map((p) => p.name);
  checkNames(names, options);
  const given = (n: string) => options.fixed?.[n] !== undefined || options.start?.[n] !== undefined;
  const guess = names.every(given) ? {} : model.guess(data, { r: options.r });
  const fixed = model.parameters.map((p) => options.fixed?.[p.name] !== undefined || (p.fixedByDefault !== undefined && !options.free?.includes(p.name)));
  const start = Float64Array.from(model.parameters, (p) => {
    const v = options.fixed?.[p.name] ?? options.start?.[p.name] ?? (typeof p.fixedByDefault === "number" ? p.fixedByDefault : undefined) ?? (guess as Record<string, number | undefined>)[p.name];
    if (v === undefined || !Number.isFinite(v)) {
      if (p.fixedByDefault === "required") throw new InputError(`model ${model.name} needs ${p.name} (${p.description}) in fixed or start`, { field: p.name });
      if (!model.linear) throw new InputError(`start value needed for ${p.name}`, { field: p.name });
      return NaN;
    }
    return v;
  });
  const lower = Float64Array.from(model.parameters, (p) => options.bounds?.[p.name]?.[0] ?? p.lower);
  const upper = Float64Array.from(model.parameters, (p) => options.bounds?.[p.name]?.[1] ?? p.upper);
  model.parameters.forEach((p, j) => {
    const v = options.fixed?.[p.name] ?? options.start?.[p.name];
    if (v !== undefined && !(Number.isFinite(v) && v >= lower[j] && v <= upper[j])) throw new InputError(`invalid ${p.name}: ${v} (${p.description} must lie in [${lower[j]}, ${upper[j]}] ${p.unit})`, { field: p.name });
  });
  const core = registryCore(model, { r: options.r });
  const search = options.globalSearch === false ? null : registrySearch(model, data, options, fixed, lower, upper, start);
  const run = (x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions) => (search ? fitGlobal(core, x, y, sigma, opt, search) : fitCore(core, x, y, sigma, opt));
  return { core, start, fixed, lower, upper, run };
}

/** The global search of a nonlinear registry model, or null when it has no separable spec. */
function registrySearch(model: HeatCapacityModel, data: { temperatureK: Float64Array; heatCapacity: Float64Array }, options: HeatCapacityFitOptions, fixed: boolean[], lower: Float64Array, upper: Float64Array, start: Float64Array): GlobalSearch | null {
  const spec = model.separable;
  if (model.linear || !spec) return null;
  const names = model.parameters.map((p) => p.name);
  const free = names.map((_, j) => j).filter((j) => !fixed[j]);
  const linear = free.filter((j) => spec.linear.includes(names[j]));
  const nonlinear = free.filter((j) => !linear.includes(j));
  const ranges = spec.ranges(data, { r: options.r });
  if (nonlinear.length === 0 || nonlinear.some((j) => !ranges[names[j]])) return null;
  const axes = nonlinear.map((j) => {
    const [lo, hi] = ranges[names[j]];
    return { lo: Math.max(lo, lower[j]), hi: Math.min(hi, upper[j]) };
  });
  if (axes.some((a) => !(a.hi > a.lo))) return null;
  const given = nonlinear.every((j) => options.start?.[names[j]] !== undefined);
  return { linear, nonlinear, axes, extraStarts: [start], budget: 4000, startsOnly: given };
}

function expressionSetup(text: string, options: HeatCapacityFitOptions) {
  const compiled = compileExpression(text, { variable: "T" });
  const names = compiled.parameters;
  checkNames(names, options);
  const fixed = names.map((n) => options.fixed?.[n] !== undefined);
  const start = Float64Array.from(names, (n) => options.fixed?.[n] ?? options.start?.[n] ?? NaN);
  const lower = Float64Array.from(names, (n) => options.bounds?.[n]?.[0] ?? -Infinity);
  const upper = Float64Array.from(names, (n) => options.bounds?.[n]?.[1] ?? Infinity);
  const run = (x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions) => fitExpression(compiled, x, y, sigma, opt);
  return { core: { label: compiled.text }, start, fixed, lower, upper, run };
}
