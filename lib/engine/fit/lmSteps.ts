/**
 * Pieces of the Levenberg–Marquardt iteration (lm.ts): bound handling by projection and
 * an active set, the damped step by QR of [R; √λ D], the undamped Gauss–Newton step size,
 * and the plateau check on Jacobian columns.
 */
import { applyQt, qrFactor, solveR } from "../linalg/qr";
import type { LeastSquaresProblem } from "./problem";

/** Project p onto the box [lower, upper] in place. */
export function clampInto(problem: LeastSquaresProblem, p: Float64Array): void {
  const { lower, upper } = problem;
  for (let j = 0; j < p.length; j++) {
    if (lower && p[j] < lower[j]) p[j] = lower[j];
    if (upper && p[j] > upper[j]) p[j] = upper[j];
  }
}

/** Which parameters sit exactly on a bound. */
export function onBounds(problem: LeastSquaresProblem, p: Float64Array): boolean[] {
  return Array.from(p, (v, j) => (problem.lower !== undefined && v === problem.lower[j]) || (problem.upper !== undefined && v === problem.upper[j]));
}

/** Indices of parameters free to move this iteration (not pushed against a bound). */
export function activeColumns(problem: LeastSquaresProblem, p: Float64Array, g: Float64Array): number[] {
  const cols: number[] = [];
  for (let j = 0; j < p.length; j++) {
    const atLower = problem.lower !== undefined && p[j] <= problem.lower[j] && g[j] <= 0;
    const atUpper = problem.upper !== undefined && p[j] >= problem.upper[j] && g[j] >= 0;
    if (!atLower && !atUpper) cols.push(j);
  }
  return cols;
}

/** Solve the damped subproblem from R (k×k of J restricted), c = (Qᵀr)[0..k). */
export function dampedStep(rk: Float64Array, mk: number, k: number, c: Float64Array, d: Float64Array, lambda: number): Float64Array {
  const a = new Float64Array(2 * k * k);
  for (let j = 0; j < k; j++) {
    for (let i = 0; i <= j; i++) a[j * 2 * k + i] = rk[j * mk + i];
    a[j * 2 * k + k + j] = Math.sqrt(lambda) * d[j];
  }
  const f = qrFactor(a, 2 * k, k);
  const rhs = new Float64Array(2 * k);
  rhs.set(c.subarray(0, k));
  applyQt(f, rhs);
  solveR(f, rhs);
  return rhs.subarray(0, k);
}

/** ‖DΔ_GN‖ / (‖Dp‖ + tiny) for the undamped step, or Infinity when R is singular. */
export function gaussNewtonRelativeStep(rdiag: Float64Array, rk: Float64Array, m: number, k: number, qtr: Float64Array, cols: number[], D: Float64Array, p: Float64Array, step: Float64Array): number {
  for (let i = k - 1; i >= 0; i--) {
    if (rdiag[i] === 0) return Infinity;
    let v = qtr[i];
    for (let c = i + 1; c < k; c++) v -= rk[c * m + i] * step[c];
    step[i] = v / rdiag[i];
  }
  let dx = 0;
  let x = 0;
  cols.forEach((j, c) => {
    dx += (D[j] * step[c]) ** 2;
    x += (D[j] * p[j]) ** 2;
  });
  return Math.sqrt(dx) / (Math.sqrt(x) + 1e-300);
}

/** A column whose norm fell below 1e-10 of its largest value means a parameter stopped mattering (plateau). */
export function deadColumn(J: Float64Array, m: number, D: Float64Array): number {
  for (let j = 0; j < D.length; j++) {
    let nj = 0;
    for (let i = 0; i < m; i++) nj += J[j * m + i] ** 2;
    if (Math.sqrt(nj) <= 1e-10 * D[j]) return j;
  }
  return -1;
}
