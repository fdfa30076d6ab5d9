/**
 * First-order (linear) propagation of uncertainty through a function of correlated inputs:
 * σ_f² = gᵀ Σ g with g = ∇f at the input values (GUM, JCGM 100:2008, eq. 13).
 */
import { invalid } from "../errors";
import { checkCovariance, type Matrix } from "./covariance";

export interface Propagated {
  readonly value: number;
  readonly stdError: number;
  /** The gradient used, ∂f/∂x_i at the input values. */
  readonly gradient: readonly number[];
}

export type ScalarFunction = (x: readonly number[]) => number;

/**
 * Gradient by central differences, step h_i = ε^{1/3}·max(|x_i|, scale_i) with ε the double
 * epsilon (truncation and rounding errors balanced for a smooth f). `scale` defaults to the
 * input standard errors where given, else 1, so that x_i = 0 still gets a sensible step.
 * Throws InputError if f is not finite at a probe point.
 */
export function numericalGradient(f: ScalarFunction, x: readonly number[], scale?: readonly number[]): number[] {
  const h0 = Math.cbrt(Number.EPSILON);
  return x.map((xi, i) => {
    const ref = Math.max(Math.abs(xi), scale?.[i] ?? 0);
    const h = h0 * (ref > 0 ? ref : 1);
    const up = x.slice();
    const down = x.slice();
    up[i] = xi + h;
    down[i] = xi - h;
    const fu = f(up);
    const fd = f(down);
    if (!Number.isFinite(fu) || !Number.isFinite(fd)) throw invalid(`x[${i}]`, xi, "function not finite near this value; cannot differentiate");
    return (fu - fd) / (up[i] - down[i]);
  });
}

/**
 * propagate(f, values, covariance, gradient?) → {value, stdError, gradient}.
 * value = f(values); stdError = √(gᵀ Σ g) with g the supplied gradient or a central-difference
 * one. Σ is checked (square, symmetric, |ρ| ≤ 1). Zero-variance inputs are not differentiated.
 * Throws InputError on length mismatch, a bad Σ, or f(values) not finite.
 * First order only: when σ is not small against the curvature of f, the result is approximate.
 */
export function propagate(f: ScalarFunction, values: readonly number[], covariance: Matrix, gradient?: readonly number[]): Propagated {
  const n = values.length;
  checkCovariance(covariance, n);
  const value = f(values);
  if (!Number.isFinite(value)) throw invalid("value", value, "function is not finite at the input values");
  if (gradient && gradient.length !== n) throw invalid("gradient", `${gradient.length} entries`, `expected ${n}`);
  const sigmas = values.map((_, i) => Math.sqrt(covariance[i][i]));
  const g = gradient ? gradient.slice() : numericalGradientWhereVaried(f, values, sigmas);
  let variance = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) variance += g[i] * covariance[i][j] * g[j];
  return Object.freeze({ value, stdError: Math.sqrt(Math.max(0, variance)), gradient: Object.freeze(g) });
}

function numericalGradientWhereVaried(f: ScalarFunction, x: readonly number[], sigmas: readonly number[]): number[] {
  const full = sigmas.every((s) => s > 0);
  if (full) return numericalGradient(f, x, sigmas);
  // Only differentiate in directions that carry variance: f may be undefined off-axis
  // for fixed inputs (e.g. a count), and zero-variance terms drop out anyway.
  const g = numericalGradient((sub) => f(merge(x, sigmas, sub)), x.filter((_, i) => sigmas[i] > 0), sigmas.filter((s) => s > 0));
  let k = 0;
  return sigmas.map((s) => (s > 0 ? g[k++] : 0));
}

function merge(x: readonly number[], sigmas: readonly number[], sub: readonly number[]): number[] {
  let k = 0;
  return x.map((xi, i) => (sigmas[i] > 0 ? sub[k++] : xi));
}

/**
 * Propagation for a product of powers f = c·Π x_i^{p_i} (exact to first order):
 * (σ_f/f)² = Σ_ij p_i p_j Σ_ij / (x_i x_j). Throws InputError when an x_i with variance is 0.
 */
export function propagatePowerLaw(coefficient: number, values: readonly number[], powers: readonly number[], covariance: Matrix): Propagated {
  if (powers.length !== values.length) throw invalid("powers", `${powers.length} entries`, `expected ${values.length}`);
  const f = (x: readonly number[]) => x.reduce((acc, xi, i) => acc * Math.pow(xi, powers[i]), coefficient);
  const value = f(values);
  const gradient = values.map((xi, i) => {
    if (xi === 0 && covariance[i]?.[i] > 0) throw invalid(`values[${i}]`, xi, "zero in a power law with variance");
    return xi === 0 ? 0 : (powers[i] * value) / xi;
  });
  return propagate(f, values, covariance, gradient);
}
