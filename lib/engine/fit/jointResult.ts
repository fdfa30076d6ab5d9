/**
 * The JointFitResult of fitJoint: the stacked FitResult (parameters by key, joint covariance and
 * correlation, χ², dof, AICc over all points) split back per measurement — each curve's local
 * parameters, fitted values at every point, residuals in its window, its own χ² and a smooth
 * model curve over its window (CURVE_POINTS points). Plain, frozen, JSON-safe data (SI).
 */
import type { CheckedMeasurement, JointFitResult, JointMeasurementResult, JointParameter } from "./joint";
import type { Layout, LocalModel, Stacked } from "./jointCore";
import type { FitResult, NamedMatrix } from "./result";

const CURVE_POINTS = 200;

function matrix(m: NamedMatrix | null): { names: string[]; matrix: number[][] } | null {
  if (!m || m.matrix.some((row) => row.some((v) => v === null))) return null;
  return { names: [...m.names], matrix: m.matrix.map((row) => row.map((v) => v as number)) };
}

const finite = (v: number): number | null => (Number.isFinite(v) ? v : null);

/** Assemble the result; `fit` is over `layout.keys`. */
export function jointResult(model: LocalModel, layout: Layout, fit: FitResult, series: readonly CheckedMeasurement[], data: Stacked): JointFitResult {
  const byKey = new Map(fit.parameters.map((p) => [p.name, p]));
  const parameters: JointParameter[] = layout.keys.map((key, j) => {
    const p = byKey.get(key)!;
    const k = layout.measurement[j];
    return { key, name: layout.names[j], measurement: k === null ? null : k + 1, value: p.value, stdError: p.stdError, unit: p.unit, fixed: p.fixed, atBound: p.atBound };
  });
  const values = Float64Array.from(parameters, (p) => p.value);
  const measurements = series.map((s, k) => measurementResult(model, layout, values, parameters, s, k));
  const perMeasurement = model.names.filter((n) => !layout.shared.includes(n));
  const warnings = [...fit.warnings];
  if (!fit.weighted && fit.dof > 0) warnings.push("no σ given: unweighted fit, standard errors scaled by the residual variance of all curves together");
  return deepFreeze({
    model: model.name,
    title: model.title,
    formula: model.formula,
    expression: model.expression,
    parameters,
    shared: [...layout.shared],
    perMeasurement,
    covariance: matrix(fit.covariance),
    correlation: matrix(fit.correlation),
    chiSquare: fit.chiSquare ?? NaN,
    dof: fit.dof,
    reducedChiSquare: fit.reducedChiSquare,
    aicc: fit.aicc,
    nPoints: data.T.length,
    weighted: fit.weighted,
    converged: fit.converged,
    errorsScaledByReducedChiSquare: fit.errorsScaledByReducedChiSquare,
    message: fit.message,
    evaluations: fit.evaluations,
    measurements,
    warnings,
  });
}

function localParameters(model: LocalModel, layout: Layout, values: Float64Array, k: number, field: number): Float64Array {
  const map = layout.colMap[k];
  const q = new Float64Array(model.names.length + 1);
  for (let j = 0; j < model.names.length; j++) q[j] = values[map[j]];
  q[model.names.length] = field;
  return q;
}

function measurementResult(model: LocalModel, layout: Layout, values: Float64Array, parameters: readonly JointParameter[], s: CheckedMeasurement, k: number): JointMeasurementResult {
  const q = localParameters(model, layout, values, k, s.fieldT);
  const f = new Float64Array(s.T.length);
  model.evaluate(s.T, q, f);
  const inWindow = Array.from(s.T, () => false);
  s.indices.forEach((i) => (inWindow[i] = true));
  const residuals = Array.from(s.T, (_, i) => (inWindow[i] ? finite(s.C[i] - f[i]) : null));
  let chi = 0;
  for (const i of s.indices) chi += ((s.C[i] - f[i]) / (s.sigma ? s.sigma[i] : 1)) ** 2;
  const used = s.indices.map((i) => s.T[i]);
  const [lo, hi] = [Math.min(...used), Math.max(...used)];
  const curveT = Array.from({ length: CURVE_POINTS }, (_, i) => lo + ((hi - lo) * i) / (CURVE_POINTS - 1));
  const curveC = new Float64Array(CURVE_POINTS);
  model.evaluate(Float64Array.from(curveT), q, curveC);
  const own = Object.fromEntries(model.names.map((n, j) => {
    const p = parameters[layout.colMap[k][j]];
    return [n, { value: p.value, stdError: p.stdError }];
  }));
  return {
    index: k + 1,
    label: s.label,
    fieldT: s.fieldT,
    window: { tMinK: s.tMinK ?? lo, tMaxK: s.tMaxK ?? hi, nPoints: s.indices.length },
    temperatureK: Array.from(s.T),
    heatCapacity: Array.from(s.C),
    sigma: s.sigma ? Array.from(s.sigma) : null,
    inWindow,
    fitted: Array.from(f, finite),
    residuals,
    chiSquare: chi,
    curve: { temperatureK: curveT, heatCapacity: Array.from(curveC, (v) => (Number.isFinite(v) ? v : NaN)) },
    parameters: own,
  };
}

function deepFreeze<T>(o: T): T {
  if (o && typeof o === "object") {
    Object.values(o as object).forEach(deepFreeze);
    Object.freeze(o);
  }
  return o;
}
