/**
 * The machinery under fitJoint: one model over T and H ("local model": a named joint model, a
 * registry model, which does not use H, or a user expression in T and H), the layout of the
 * stacked parameter vector (shared parameters once, the others once per measurement, in the
 * model's parameter order), and a ModelCore over the stacked points. The core's independent
 * variable x is the index of a point in the stacked data, so the shared search and LM code
 * (global.ts, separable.ts, lm.ts) work on any subset of points unchanged.
 */
import { InputError } from "../errors";
import { MODELS } from "../models/registry";
import type { HeatCapacityModel } from "../models/types";
import type { ModelCore } from "./core";
import { compileJointExpression, JOINT_MODELS, type JointRangeData } from "./jointModels";

/** A model of C(T; p, H) with the structure the joint search needs. */
export interface LocalModel {
  readonly name: string;
  readonly title: string;
  readonly formula: string;
  readonly expression: string | null;
  readonly kind: "joint" | "registry" | "expression";
  readonly names: readonly string[];
  readonly units: readonly string[];
  readonly lower: readonly number[];
  readonly upper: readonly number[];
  readonly defaultShared: readonly string[];
  /** Names in which C is jointly affine (all of them when `linear`). */
  readonly linearNames: readonly string[];
  readonly linear: boolean;
  /** Compiled size (derivative terms) for the work budget of an expression search. */
  readonly derivativeTerms: number;
  /** Registry defaults: a value held fixed unless the caller frees it, or "required". */
  readonly fixedByDefault: readonly (number | "required" | undefined)[];
  /** out[i] = C(T_i; p) with p = [parameters…, H]. */
  evaluate(T: Float64Array, p: Float64Array, out: Float64Array): void;
  /** Column-major ∂C/∂p (parameters only), or null for numerical derivatives. */
  readonly jacobian: ((T: Float64Array, p: Float64Array, out: Float64Array) => void) | null;
  /** Search intervals of the nonlinear parameters, or null (then a multi-start). */
  readonly ranges: ((data: JointRangeData) => Readonly<Record<string, readonly [number, number]>>) | null;
  /** Registry models: starting values from the data. */
  readonly guess: ((T: Float64Array, C: Float64Array) => Readonly<Record<string, number>>) | null;
  readonly needsField: boolean;
}

/** The local model named `spec`: JOINT_MODELS, then the single-curve registry, or an expression. */
export function localModel(spec: string | { readonly expression: string }, r: number): LocalModel {
  if (typeof spec === "string") {
    if (Object.hasOwn(JOINT_MODELS, spec)) return fromJoint(spec);
    if (Object.hasOwn(MODELS, spec)) return fromRegistry(MODELS[spec], r);
    throw new InputError(`invalid model: ${JSON.stringify(spec)} (known: ${[...Object.keys(JOINT_MODELS), ...Object.keys(MODELS)].join(", ")}; or give {expression})`, { field: "model" });
  }
  if (!spec || typeof spec.expression !== "string") throw new InputError("invalid model: give a model name or {expression}", { field: "model" });
  return fromExpression(spec.expression, spec.expression, "user expression", null, null);
}

function fromExpression(text: string, name: string, title: string, joint: (typeof JOINT_MODELS)[string] | null, formula: string | null): LocalModel {
  const c = compileJointExpression(text);
  const n = c.parameters.length;
  let scratch = new Float64Array(0);
  const specOf = (k: string) => joint?.parameters.find((q) => q.name === k);
  return {
    name,
    title,
    formula: formula ?? `C = ${text}`,
    expression: text,
    kind: joint ? "joint" : "expression",
    names: c.parameters,
    units: c.parameters.map((k) => specOf(k)?.unit ?? ""),
    lower: c.parameters.map((k) => specOf(k)?.lower ?? -Infinity),
    upper: c.parameters.map((k) => specOf(k)?.upper ?? Infinity),
    defaultShared: joint ? joint.parameters.filter((q) => q.defaultShared).map((q) => q.name) : [],
    linearNames: c.linearParameters,
    linear: c.linear,
    derivativeTerms: c.derivativeTerms,
    fixedByDefault: new Array(n).fill(undefined),
    evaluate: (T, p, out) => c.evaluate(T, p, out, 0),
    jacobian: (T, p, out) => {
      if (scratch.length !== T.length) scratch = new Float64Array(T.length);
      c.valueAndJacobian(T, p, scratch, out);
    },
    ranges: joint ? joint.ranges : null,
    guess: null,
    needsField: joint?.needsField ?? false,
  };
}

function fromJoint(name: string): LocalModel {
  const m = JOINT_MODELS[name];
  return fromExpression(m.expression, m.name, m.title, m, m.formula);
}

/** Registry parameters shared by default in a joint fit: the electronic and lattice series. */
const REGISTRY_SHARED = ["gamma", "beta", "delta", "epsilon"];

function fromRegistry(model: HeatCapacityModel, r: number): LocalModel {
  const names = model.parameters.map((q) => q.name);
  const options = { r };
  const rec = (p: Float64Array) => Object.fromEntries(names.map((k, j) => [k, p[j]]));
  const grad = model.gradient;
  return {
    name: model.name,
    title: model.title,
    formula: model.formula,
    expression: null,
    kind: "registry",
    names,
    units: model.parameters.map((q) => q.unit),
    lower: model.parameters.map((q) => q.lower),
    upper: model.parameters.map((q) => q.upper),
    defaultShared: names.filter((k) => REGISTRY_SHARED.includes(k)),
    linearNames: model.linear ? names : (model.separable?.linear ?? []),
    linear: model.linear,
    derivativeTerms: 0,
    fixedByDefault: model.parameters.map((q) => q.fixedByDefault),
    evaluate: (T, p, out) => {
      const q = rec(p);
      for (let i = 0; i < T.length; i++) out[i] = model.evaluate(T[i], q, options);
    },
    jacobian: model.linear
      ? (T, _p, out) => model.basis!.forEach((phi, j) => T.forEach((t, i) => (out[j * T.length + i] = phi(t))))
      : grad
        ? (T, p, out) => {
            const q = rec(p);
            for (let i = 0; i < T.length; i++) {
              const g = grad(T[i], q, options);
              names.forEach((k, j) => (out[j * T.length + i] = g[k]));
            }
          }
        : null,
    ranges: model.separable ? (data) => model.separable!.ranges({ temperatureK: data.temperatureK, heatCapacity: [] }, options) : null,
    guess: (T, C) => model.guess({ temperatureK: T, heatCapacity: C }, options),
    needsField: false,
  };
}

/** Where each local parameter of each measurement sits in the stacked vector. */
export interface Layout {
  readonly keys: readonly string[];
  /** Local parameter name of each key. */
  readonly names: readonly string[];
  /** Measurement index (0-based) of each key, null when shared. */
  readonly measurement: readonly (number | null)[];
  /** colMap[k][j]: stacked index of local parameter j for measurement k. */
  readonly colMap: readonly Int32Array[];
  readonly shared: readonly string[];
}

/** Keys in model order: a shared name once, a per-measurement one as name#1 … name#K. */
export function buildLayout(model: LocalModel, shared: ReadonlySet<string>, count: number): Layout {
  const keys: string[] = [];
  const names: string[] = [];
  const measurement: (number | null)[] = [];
  const colMap = Array.from({ length: count }, () => new Int32Array(model.names.length));
  model.names.forEach((name, j) => {
    if (shared.has(name)) {
      colMap.forEach((c) => (c[j] = keys.length));
      keys.push(name);
      names.push(name);
      measurement.push(null);
      return;
    }
    for (let k = 0; k < count; k++) {
      colMap[k][j] = keys.length;
      keys.push(`${name}#${k + 1}`);
      names.push(name);
      measurement.push(k);
    }
  });
  return { keys, names, measurement, colMap, shared: model.names.filter((n) => shared.has(n)) };
}

/** The stacked in-window points: temperature, measurement index, and each measurement's field. */
export interface Stacked {
  readonly T: Float64Array;
  readonly y: Float64Array;
  readonly sigma: Float64Array | null;
  readonly k: Int32Array;
  readonly fieldsT: readonly number[];
}

/** A ModelCore over the stacked points: x holds point indices into `data`. */
export function jointCore(model: LocalModel, layout: Layout, data: Stacked): ModelCore {
  const nLocal = model.names.length;
  const local = (p: Float64Array, k: number) => {
    const q = new Float64Array(nLocal + 1);
    const map = layout.colMap[k];
    for (let j = 0; j < nLocal; j++) q[j] = p[map[j]];
    q[nLocal] = data.fieldsT[k];
    return q;
  };
  /** Runs of consecutive x with one measurement: [start, end, k, T of the run]. */
  const runs = (x: Float64Array) => {
    const out: [number, number, number, Float64Array][] = [];
    for (let i = 0; i < x.length; ) {
      const k = data.k[x[i]];
      let e = i + 1;
      while (e < x.length && data.k[x[e]] === k) e++;
      out.push([i, e, k, Float64Array.from(x.subarray(i, e), (v) => data.T[v])]);
      i = e;
    }
    return out;
  };
  const jac = model.jacobian;
  return {
    label: model.name,
    names: layout.keys,
    units: layout.names.map((n) => model.units[model.names.indexOf(n)]),
    linear: model.linear,
    evaluate: (x, p, out) => {
      for (const [s, e, k, T] of runs(x)) model.evaluate(T, local(p, k), out.subarray(s, e));
    },
    jacobian: jac
      ? (x, p, out) => {
          const m = x.length;
          out.fill(0, 0, m * layout.keys.length);
          for (const [s, e, k, T] of runs(x)) {
            const mr = e - s;
            const part = new Float64Array(mr * nLocal);
            jac(T, local(p, k), part);
            const map = layout.colMap[k];
            for (let j = 0; j < nLocal; j++) out.set(part.subarray(j * mr, (j + 1) * mr), map[j] * m + s);
          }
        }
      : null,
  };
}
