/**
 * Weighted linear least squares: minimise Σ_i w_i² (y_i − Σ_j A_ij x_j)², w_i = 1/σ_i.
 *
 * Method: rows scaled by w, columns scaled by exact powers of two S to unit norm,
 * Householder QR (never the normal equations), then — when the scaled problem is
 * ill-conditioned (κ > REFINE_KAPPA) or when asked — Björck's iterative refinement of the
 * augmented system [I A; Aᵀ 0][r; x] = [b; 0] with residuals accumulated in double-double;
 * otherwise one fixed-precision correction. Householder QR commutes exactly with a
 * power-of-two column scaling (every operation is scaled by an exact power of two), so S
 * is applied implicitly: R of the scaled design is R·S bit for bit, and the rank test and
 * the condition estimate κ = ‖RS‖_F‖(RS)⁻¹‖_F use it; x and (AᵀWA)⁻¹ = R⁻¹R⁻ᵀ need no
 * rescaling. The covariance comes from R⁻¹.
 * Reference: Björck, BIT 7 (1967) 257 ("Iterative refinement of linear least squares
 * solutions I"); Golub & Van Loan §5.3.
 *
 * Failure modes: throws InputError on shape mismatch, non-finite input or σ ≤ 0; returns
 * `rank < n` (and no solution) when a column is zero or numerically dependent.
 */
import { InputError } from "../errors";
import { applyQ, applyQt, covarianceFromRinv, invertR, qrFactor, solveR, type QRFactor } from "./qr";
import { refineStep, scaledDesign, subtractDesign } from "./refine";

/** Refine when the column-scaled condition estimate exceeds this (plain QR keeps ~16 − 2·log10 κ digits). */
const REFINE_KAPPA = 1e3;
const EPS = 2.220446049250313e-16;

export interface LinearLeastSquaresOptions {
  /** Standard uncertainty of each y (same length); weights are 1/σ². */
  readonly sigma?: ArrayLike<number>;
  /**
   * "auto" (default): ill-conditioned problems get up to 4 double-double Björck steps, the
   * others one fixed-precision correction; a number n > 0 forces n Björck steps; 0 none.
   */
  readonly refine?: "auto" | number;
}

export interface LinearLeastSquaresResult {
  /** false when the design is rank deficient; then coefficients/covariance are empty. */
  readonly fullRank: boolean;
  readonly rank: number;
  readonly coefficients: Float64Array;
  /** (AᵀWA)⁻¹, n×n row-major, not multiplied by any residual variance. */
  readonly covariance: Float64Array;
  /** y − A x (unweighted). */
  readonly residuals: Float64Array;
  /** Σ (w_i r_i)². */
  readonly chiSquare: number;
  /** Condition estimate ‖R‖_F‖R⁻¹‖_F of the column-scaled weighted design. */
  readonly conditionEstimate: number;
  readonly refinementSteps: number;
}

function checkInputs(design: Float64Array, m: number, n: number, y: ArrayLike<number>, sigma?: ArrayLike<number>): void {
  if (design.length !== m * n) throw new InputError(`design has ${design.length} entries, expected ${m}×${n}`, { field: "design" });
  if (y.length !== m) throw new InputError(`y has ${y.length} values, design has ${m} rows`, { field: "y" });
  if (sigma && sigma.length !== m) throw new InputError(`sigma has ${sigma.length} values, expected ${m}`, { field: "sigma" });
  for (let i = 0; i < m; i++) {
    if (!Number.isFinite(y[i])) throw new InputError(`invalid y: ${y[i]} (not finite)`, { field: "y", line: i + 1 });
    if (sigma && !(sigma[i] > 0 && Number.isFinite(sigma[i]))) {
      throw new InputError(`invalid sigma: ${sigma[i]} (must be finite and > 0)`, { field: "sigma", line: i + 1 });
    }
  }
  for (let k = 0; k < m * n; k++) {
    if (!Number.isFinite(design[k])) throw new InputError(`invalid design entry: ${design[k]} (not finite)`, { field: "design", line: (k % m) + 1 });
  }
}

/** Numerical rank from the diagonal of R·S (S the column scaling). */
function rankOf(f: QRFactor, scale: Float64Array): number {
  let max = 0;
  for (let k = 0; k < f.n; k++) max = Math.max(max, Math.abs(f.rdiag[k] * scale[k]));
  const tol = Math.max(f.m, f.n) * EPS * max;
  let rank = 0;
  for (let k = 0; k < f.n; k++) if (Math.abs(f.rdiag[k] * scale[k]) > tol) rank++;
  return rank;
}

/** ‖RS‖_F · ‖(RS)⁻¹‖_F from R and R⁻¹ (column-major n×n). */
function conditionEstimate(f: QRFactor, rinv: Float64Array, scale: Float64Array): number {
  let r2 = 0;
  let i2 = 0;
  for (let j = 0; j < f.n; j++) {
    r2 += (f.rdiag[j] * scale[j]) ** 2;
    for (let i = 0; i < j; i++) r2 += (f.qr[j * f.m + i] * scale[j]) ** 2;
    for (let i = 0; i <= j; i++) i2 += (rinv[j * f.n + i] / scale[i]) ** 2;
  }
  return Math.sqrt(r2) * Math.sqrt(i2);
}

function emptyResult(m: number, rank: number, kappa: number): LinearLeastSquaresResult {
  return { fullRank: false, rank, coefficients: new Float64Array(0), covariance: new Float64Array(0), residuals: new Float64Array(m), chiSquare: NaN, conditionEstimate: kappa, refinementSteps: 0 };
}

/**
 * Solve the weighted linear least-squares problem for a column-major m×n design.
 * The design and y are not modified.
 */
export function solveLinearLeastSquares(
  design: Float64Array,
  m: number,
  n: number,
  y: ArrayLike<number>,
  options: LinearLeastSquaresOptions = {},
): LinearLeastSquaresResult {
  const { sigma } = options;
  if (design.length !== m * n || y.length !== m || (sigma && sigma.length !== m)) checkInputs(design, m, n, y, sigma);
  // rows are weighted by w = 1/σ (computed once; the same rounded w everywhere below)
  const w = sigma ? new Float64Array(m) : null;
  const b = new Float64Array(m);
  let bs = 0;
  if (w) {
    for (let i = 0; i < m; i++) {
      if (!(sigma![i] > 0 && sigma![i] < Infinity)) checkInputs(design, m, n, y, sigma);
      w[i] = 1 / sigma![i];
      bs += b[i] = y[i] * w[i];
    }
  } else for (let i = 0; i < m; i++) bs += b[i] = y[i];
  const { a, scale, finite } = scaledDesign(design, m, n, w, false, 1);
  if (!finite || !Number.isFinite(bs)) checkInputs(design, m, n, y, sigma);
  if (m < n || n === 0) return emptyResult(m, Math.min(m, n), Infinity);
  // b rides along as column n, so the factorisation leaves Qᵀb there
  a.set(b, n * m);
  const f = qrFactor(a, m, n, 1);
  const rank = rankOf(f, scale);
  if (rank < n) return emptyResult(m, rank, Infinity);
  const rinv = invertR(f);
  const kappa = conditionEstimate(f, rinv, scale);
  const unit = new Float64Array(n).fill(1);
  const z = a.slice(n * m, n * m + n);
  solveR(f, z);
  const maxSteps = options.refine === "auto" || options.refine === undefined ? (kappa > REFINE_KAPPA ? 4 : 0) : options.refine;
  const r = new Float64Array(b);
  let steps = 0;
  if (maxSteps > 0) {
    // Björck: start from r = Q[0; c₂] and refine (r, z) together against the unfactored design
    r.fill(0, 0, n);
    r.set(a.subarray(n * m + n, (n + 1) * m), n);
    applyQ(f, r);
    const as = scaledDesign(design, m, n, w, false).a;
    const hi = new Float64Array(m);
    const lo = new Float64Array(m);
    while (steps < maxSteps) {
      steps++;
      // the next correction is about κ·ε times this one: stop once that is below rounding
      if (refineStep(f, as, b, z, r, hi, lo) * kappa <= 1) break;
    }
  } else {
    subtractDesign(design, m, n, w, z, unit, r);
    if (options.refine !== 0) {
      // one fixed-precision correction z += R⁻¹Qᵀ(b − Az): cheap, and recovers the digits
      // lost to rounding in the factorisation of a well-conditioned problem
      const d = new Float64Array(r);
      applyQt(f, d);
      solveR(f, d);
      for (let j = 0; j < n; j++) z[j] += d[j];
      subtractDesign(design, m, n, w, d.subarray(0, n), unit, r);
    }
  }
  return finish(m, n, z, r, rinv, sigma, kappa, steps);
}

function finish(m: number, n: number, z: Float64Array, r: Float64Array, rinv: Float64Array, sigma: ArrayLike<number> | undefined, kappa: number, steps: number): LinearLeastSquaresResult {
  const coefficients = z.slice(0, n);
  const cov = covarianceFromRinv(rinv, n);
  let chi = 0;
  const residuals = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    chi += r[i] * r[i];
    residuals[i] = sigma ? r[i] * sigma[i] : r[i];
  }
  return { fullRank: true, rank: n, coefficients, covariance: cov, residuals, chiSquare: chi, conditionEstimate: kappa, refinementSteps: steps };
}
