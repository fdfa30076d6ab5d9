/**
 * Weighted polynomial trend of a result against a composition axis: y = a0 + a1·x (+ a2·x²).
 *
 * Solved by Householder QR (lib/engine/linalg), never the normal equations. Weights 1/σ² from
 * each point's standard error. Parameter covariance:
 *   "absolute" — (AᵀWA)⁻¹, the σ's are taken as true standard errors (the default when every
 *                point has one);
 *   "scaled"   — (AᵀWA)⁻¹·χ²/(n−p), the σ's only set relative weights (Birge-ratio scaling);
 *   unweighted — when any point lacks σ: all weights 1 and the covariance scaled by s² =
 *                RSS/(n−p), the ordinary least-squares standard errors (as in NIST StRD).
 * Confidence band: the standard error of the fitted mean, σ_f(x)² = gᵀ C g with g = (1, x, x²),
 * drawn as ±1σ_f (68 % for Gaussian errors). Outliers: standardised residual z_i = r_i/σ_i
 * (σ_i scaled like the covariance; s for unweighted fits); |z_i| > 3 is flagged (common practice).
 * Reference: Press et al., Numerical Recipes, 3rd ed., §15.2 and §15.4.
 *
 * Invalid input (length mismatch, non-finite value, σ ≤ 0) throws InputError; too few points or
 * coincident x values give `ok: false` with a message, not an exception.
 */
import { invalid } from "../errors";
import { solveLinearLeastSquares } from "../linalg";

export interface TrendPoint {
  readonly x: number;
  readonly y: number;
  /** Standard error of y; null when unknown. */
  readonly sigma: number | null;
}

export type TrendDegree = 1 | 2;

export interface TrendOptions {
  readonly degree: TrendDegree;
  /** "auto" (default): absolute when every point has σ, else unweighted. */
  readonly errors?: "auto" | "absolute" | "scaled";
  /** Flag points with |z| above this; default 3. */
  readonly outlierSigma?: number;
  /** Number of band points across [min x, max x]; default 41. */
  readonly bandPoints?: number;
}

export interface TrendParameter {
  readonly name: "a0" | "a1" | "a2";
  readonly value: number;
  readonly stdError: number | null;
}

export interface BandPoint {
  readonly x: number;
  readonly y: number;
  readonly sigma: number | null;
}

export interface TrendFit {
  readonly ok: boolean;
  readonly message: string | null;
  readonly degree: TrendDegree;
  readonly n: number;
  readonly dof: number;
  readonly weighting: "absolute" | "scaled" | "unweighted";
  readonly parameters: readonly TrendParameter[];
  /** Parameter covariance (as reported, i.e. scaled where the weighting says so), rows/columns a0, a1, a2. */
  readonly covariance: readonly (readonly number[])[] | null;
  /** Σ w_i r_i² (RSS for unweighted fits). */
  readonly chiSquare: number | null;
  readonly reducedChiSquare: number | null;
  readonly residuals: readonly number[];
  readonly standardized: readonly (number | null)[];
  /** Indices (into the input) of points with |z| above the threshold. */
  readonly outliers: readonly number[];
  readonly outlierSigma: number;
  readonly band: readonly BandPoint[];
  readonly warnings: readonly string[];
}

const NAMES = ["a0", "a1", "a2"] as const;

function check(points: readonly TrendPoint[], degree: number): void {
  if (degree !== 1 && degree !== 2) throw invalid("degree", degree, "a trend is linear (1) or quadratic (2)");
  points.forEach((p, i) => {
    if (!Number.isFinite(p.x)) throw invalid("x", p.x, "not a finite number", { field: "x", line: i + 1 });
    if (!Number.isFinite(p.y)) throw invalid("y", p.y, "not a finite number", { field: "y", line: i + 1 });
    if (p.sigma !== null && !(Number.isFinite(p.sigma) && p.sigma > 0)) throw invalid("sigma", p.sigma, "must be finite and > 0 (or null)", { field: "sigma", line: i + 1 });
  });
}

function failed(degree: TrendDegree, n: number, message: string, weighting: TrendFit["weighting"], outlierSigma: number): TrendFit {
  return { ok: false, message, degree, n, dof: n - degree - 1, weighting, parameters: [], covariance: null, chiSquare: null, reducedChiSquare: null, residuals: [], standardized: [], outliers: [], outlierSigma, band: [], warnings: [] };
}

/** Value and standard error of the trend at x (σ from the reported covariance; null if none). */
export function evaluateTrend(fit: Pick<TrendFit, "parameters" | "covariance">, x: number): { value: number; stdError: number | null } {
  const g = fit.parameters.map((_, k) => x ** k);
  const value = fit.parameters.reduce((s, p, k) => s + p.value * g[k]!, 0);
  if (!fit.covariance) return { value, stdError: null };
  let v = 0;
  for (let i = 0; i < g.length; i++) for (let j = 0; j < g.length; j++) v += g[i]! * fit.covariance[i]![j]! * g[j]!;
  return { value, stdError: Math.sqrt(Math.max(v, 0)) };
}

function bandOf(fit: Pick<TrendFit, "parameters" | "covariance">, xs: readonly number[], count: number): BandPoint[] {
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  return Array.from({ length: count }, (_, i) => {
    const x = count === 1 ? lo : lo + ((hi - lo) * i) / (count - 1);
    const e = evaluateTrend(fit, x);
    return { x, y: e.value, sigma: e.stdError };
  });
}

/** Fit the trend; see the file header for weighting, band and outlier rules. */
export function fitTrend(points: readonly TrendPoint[], options: TrendOptions): TrendFit {
  const { degree } = options;
  check(points, degree);
  const outlierSigma = options.outlierSigma ?? 3;
  const allSigma = points.every((p) => p.sigma !== null);
  const mode = options.errors ?? "auto";
  if (mode !== "auto" && !allSigma) throw invalid("errors", mode, "weighted trends need σ on every point", { field: "sigma" });
  const weighting: TrendFit["weighting"] = mode === "auto" ? (allSigma ? "absolute" : "unweighted") : mode;
  const m = points.length;
  const p = degree + 1;
  if (m < p) return failed(degree, m, `a ${degree === 1 ? "linear" : "quadratic"} trend needs at least ${p} points, got ${m}`, weighting, outlierSigma);
  const design = new Float64Array(m * p);
  for (let k = 0; k < p; k++) for (let i = 0; i < m; i++) design[k * m + i] = points[i]!.x ** k;
  const sigma = weighting === "unweighted" ? undefined : points.map((q) => q.sigma!);
  const ls = solveLinearLeastSquares(design, m, p, points.map((q) => q.y), sigma ? { sigma } : {});
  if (!ls.fullRank) return failed(degree, m, `the x values span fewer than ${p} distinct values: the ${degree === 1 ? "slope" : "curvature"} is not determined`, weighting, outlierSigma);
  return finish(points, options, weighting, outlierSigma, ls);
}

function finish(points: readonly TrendPoint[], options: TrendOptions, weighting: TrendFit["weighting"], outlierSigma: number, ls: ReturnType<typeof solveLinearLeastSquares>): TrendFit {
  const m = points.length;
  const p = options.degree + 1;
  const dof = m - p;
  const red = dof > 0 ? ls.chiSquare / dof : null;
  const factor = weighting === "absolute" ? 1 : red;
  const covariance = factor === null ? null : Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => ls.covariance[i * p + j]! * factor));
  const parameters = Array.from({ length: p }, (_, k): TrendParameter => ({ name: NAMES[k]!, value: ls.coefficients[k]!, stdError: covariance ? Math.sqrt(covariance[k]![k]!) : null }));
  const residuals = Array.from(ls.residuals);
  const pointScale = factor === null ? null : Math.sqrt(factor);
  const standardized = residuals.map((r, i) => (pointScale === null || pointScale === 0 ? null : r / ((weighting === "unweighted" ? 1 : points[i]!.sigma!) * pointScale)));
  const outliers = standardized.flatMap((z, i) => (z !== null && Math.abs(z) > outlierSigma ? [i] : []));
  const warnings: string[] = [];
  if (weighting === "unweighted" && points.some((q) => q.sigma !== null)) warnings.push("some points have no σ: the trend is unweighted and its errors come from the scatter");
  if (dof === 0) warnings.push("as many parameters as points: the trend passes through every point and has no scatter estimate");
  if (weighting === "absolute" && red !== null && dof >= 3 && (red > 3 || red < 0.2)) warnings.push(`χ²_red = ${red >= 1000 ? String(Math.round(red)) : String(Number(red.toPrecision(3)))}: the points scatter ${red > 1 ? "more" : "less"} than their σ say`);
  if (outliers.length) warnings.push(`${outliers.length} ${outliers.length === 1 ? "point lies" : "points lie"} more than ${outlierSigma}σ from the trend`);
  const fit = { parameters, covariance };
  return {
    ok: true, message: null, degree: options.degree, n: m, dof, weighting, parameters, covariance, chiSquare: ls.chiSquare, reducedChiSquare: red,
    residuals, standardized, outliers, outlierSigma, band: bandOf(fit, points.map((q) => q.x), options.bandPoints ?? 41), warnings,
  };
}
