/**
 * Smoothing of an addenda curve by a weighted least-squares polynomial in T or in ln T,
 * solved by the engine's Householder QR (linalg.solveLinearLeastSquares), never the normal
 * equations. The abscissa is mapped to u ∈ [−1, 1] before forming powers, for conditioning.
 *
 * Degree: given, or chosen by AICc over 1…min(8, m − 3) (AICc: Hurvich & Tsai, Biometrika 76,
 * 297 (1989)). σ of the smoothed curve at T is √(gᵀ Cov g), g = (1, u, u², …); Cov is
 * (AᵀWA)⁻¹ with absolute addenda σ, or scaled by s² = RSS/(m − n) when the addenda have no σ.
 */
import { InputError } from "../errors";
import { solveLinearLeastSquares } from "../linalg";
import type { SortedCurve } from "./interpolate";

export type SmoothingAbscissa = "T" | "logT";

export interface PolynomialSmoothing {
  degree: number;
  abscissa: SmoothingAbscissa;
  /** u = (x − centre)/halfWidth, x = T or ln T. */
  centre: number;
  halfWidth: number;
  coefficients: number[];
  /** n×n row-major covariance of the coefficients (already scaled when σ was estimated). */
  covariance: number[];
  chiSquare: number;
  /** χ²/(m − n). */
  chiSquareReduced: number;
  sigmaEstimated: boolean;
  aicc: number;
}

function abscissa(t: number, kind: SmoothingAbscissa): number {
  return kind === "logT" ? Math.log(t) : t;
}

function fitDegree(curve: SortedCurve, degree: number, kind: SmoothingAbscissa): PolynomialSmoothing | null {
  const m = curve.t.length;
  const n = degree + 1;
  const xs = curve.t.map((t) => abscissa(t, kind));
  const lo = Math.min(...xs), hi = Math.max(...xs);
  const centre = (lo + hi) / 2, halfWidth = (hi - lo) / 2 || 1;
  const design = new Float64Array(m * n);
  for (let i = 0; i < m; i++) {
    const u = (xs[i] - centre) / halfWidth;
    for (let j = 0, p = 1; j < n; j++, p *= u) design[j * m + i] = p;
  }
  const r = solveLinearLeastSquares(design, m, n, curve.c, curve.s ? { sigma: curve.s } : {});
  if (!r.fullRank) return null;
  const dof = m - n;
  const scale = curve.s ? 1 : r.chiSquare / dof;
  const k = n + (curve.s ? 0 : 1);
  const fitTerm = curve.s ? r.chiSquare : m * Math.log(Math.max(r.chiSquare, Number.MIN_VALUE) / m);
  const aicc = fitTerm + 2 * k + (2 * k * (k + 1)) / Math.max(1, m - k - 1);
  return {
    degree, abscissa: kind, centre, halfWidth,
    coefficients: Array.from(r.coefficients),
    covariance: Array.from(r.covariance, (v) => v * scale),
    chiSquare: r.chiSquare, chiSquareReduced: r.chiSquare / dof, sigmaEstimated: !curve.s, aicc,
  };
}

/**
 * Fit the smoothing polynomial. Throws InputError when the addenda have too few distinct
 * temperatures for the degree (m ≥ degree + 2 is needed for a residual estimate) or the degree
 * is not an integer in 0…12.
 */
export function fitSmoothing(curve: SortedCurve, kind: SmoothingAbscissa, degree?: number): PolynomialSmoothing {
  const m = curve.t.length;
  if (degree !== undefined) {
    if (!Number.isInteger(degree) || degree < 0 || degree > 12) throw new InputError(`invalid smoothingDegree: ${degree} (an integer 0–12)`, { field: "smoothingDegree" });
    if (m < degree + 2) throw new InputError(`invalid smoothingDegree: ${degree} (needs at least ${degree + 2} addenda temperatures, have ${m})`, { field: "smoothingDegree" });
    const fit = fitDegree(curve, degree, kind);
    if (!fit) throw new InputError(`invalid smoothingDegree: ${degree} (polynomial is rank deficient on these temperatures)`, { field: "smoothingDegree" });
    return fit;
  }
  if (m < 4) throw new InputError(`addenda has ${m} distinct temperatures: at least 4 are needed to choose a smoothing degree`, { field: "addenda" });
  let best: PolynomialSmoothing | null = null;
  for (let d = 1; d <= Math.min(8, m - 3); d++) {
    const fit = fitDegree(curve, d, kind);
    if (fit && (!best || fit.aicc < best.aicc)) best = fit;
  }
  if (!best) throw new InputError("addenda smoothing failed: every degree was rank deficient", { field: "addenda" });
  return best;
}

/** Value and σ of the smoothing polynomial at T. */
export function evaluateSmoothing(p: PolynomialSmoothing, t: number): { value: number; sigma: number } {
  const u = (abscissa(t, p.abscissa) - p.centre) / p.halfWidth;
  const n = p.coefficients.length;
  const g = new Array<number>(n);
  for (let j = 0, q = 1; j < n; j++, q *= u) g[j] = q;
  let value = 0, variance = 0;
  for (let i = 0; i < n; i++) {
    value += p.coefficients[i] * g[i];
    for (let j = 0; j < n; j++) variance += g[i] * p.covariance[i * n + j] * g[j];
  }
  return { value, sigma: Math.sqrt(Math.max(0, variance)) };
}
