/**
 * Weighted linear least squares: minimise Σ_i w_i² (y_i − Σ_j A_ij x_j)², w_i = 1/σ_i.
 *
 * Method: rows scaled by w, Householder QR of [WA | Wy] (never the normal equations), then
 * — when the column-scaled problem is ill-conditioned (κ > REFINE_KAPPA) or when asked —
 * Björck's iterative refinement of the augmented system [I A; Aᵀ 0][r; x] = [b; 0] with
 * residuals accumulated in double-double; otherwise one fixed-precision correction
 * z += R⁻¹·(Qᵀ W(y − Az))[0..n). Columns are scaled by exact powers of two S to about unit
 * norm for the rank test and the condition estimate κ = ‖RS‖_F‖(RS)⁻¹‖_F. Householder QR
 * commutes exactly with such a scaling (every operation is scaled by an exact power of two),
 * so S is applied implicitly: R of the scaled design is R·S bit for bit, S is read off R
 * (‖R e_j‖ = ‖(WA)_j‖), and x and (AᵀWA)⁻¹ = R⁻¹R⁻ᵀ need no rescaling. The covariance comes
 * from R⁻¹. Residuals and χ² are those of the returned coefficients, recomputed from the
 * data in one sweep (after Björck refinement: its refined residual). The work arrays are
 * reused from call to call (workspace.ts); nothing returned points into them.
 * Reference: Björck, BIT 7 (1967) 257 ("Iterative refinement of linear least squares
 * solutions I"); Golub & Van Loan §5.3.
 *
 * Failure modes: throws InputError on shape mismatch, non-finite input or σ ≤ 0; returns
 * `rank < n` (and no solution) when a column is zero or numerically dependent.
 */
import { applyQtToColumn } from "./applyQ";
import { covarianceFromRinv, invertR, qrFactor, solveR, type QRFactor } from "./qr";
import { checkInputs, columnScale, conditionEstimate, factorIsFinite, rankOf } from "./checks";
import { refineStep } from "./refine";
import { correctionResidual, weightedResidual, weightedSystem } from "./weighted";
import { workspace } from "./workspace";

/** Refine when the column-scaled condition estimate exceeds this (plain QR keeps ~16 − 2·log10 κ digits). */
const REFINE_KAPPA = 1e3;

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
  if (design.length !== m * n || y.length !== m || (sigma && sigma.length !== m) || m < n || n === 0) checkInputs(design, m, n, y, sigma);
  if (m < n || n === 0) return emptyResult(m, Math.min(m, n), Infinity);
  // one work array: [WA | Wy] (factored in place) and a scratch column, then w = 1/σ (the
  // same rounded w everywhere below)
  const work = workspace(m * (n + 3));
  const a = work.subarray(0, m * (n + 2));
  const w = work.subarray(m * (n + 2), m * (n + 3));
  weights(w, sigma, () => checkInputs(design, m, n, y, sigma));
  const gram = new Float64Array(n + 1);
  weightedSystem(design, m, n, w, y, a, gram);
  // only the first n entries of Qᵀ(Wy) are used
  const f = qrFactor(a, m, n, 1, { gram, extraHeadOnly: true });
  if (!factorIsFinite(f)) checkInputs(design, m, n, y, sigma);
  const scale = columnScale(f);
  const rank = rankOf(f, scale);
  if (rank < n) return emptyResult(m, rank, Infinity);
  const rinv = invertR(f);
  const kappa = conditionEstimate(f, rinv, scale);
  const z = a.slice(n * m, n * m + n);
  solveR(f, z);
  const maxSteps = options.refine === "auto" || options.refine === undefined ? (kappa > REFINE_KAPPA ? 4 : 0) : options.refine;
  const base = { fullRank: true, rank: n, covariance: covarianceFromRinv(rinv, n), conditionEstimate: kappa };
  const residuals = new Float64Array(m);
  if (maxSteps > 0) {
    const { r, steps } = refineBjorck(f, design, w, y, z, kappa, maxSteps);
    let chi = 0;
    for (let i = 0; i < m; i++) {
      chi += r[i] * r[i];
      residuals[i] = sigma ? r[i] * sigma[i] : r[i];
    }
    return { ...base, coefficients: z, residuals, chiSquare: chi, refinementSteps: steps };
  }
  if (options.refine !== 0) {
    // one fixed-precision correction z += R⁻¹(Qᵀr)[0..n), r = W(y − Az) (in the scratch
    // column n + 1): cheap, and recovers the digits lost to rounding in the factorisation
    // of a well-conditioned problem
    applyQtToColumn(f, n + 1, correctionResidual(design, m, n, w, y, z, a, n + 1));
    const d = a.slice((n + 1) * m, (n + 1) * m + n);
    solveR(f, d);
    for (let j = 0; j < n; j++) z[j] += d[j];
  }
  const chi = weightedResidual(design, m, n, w, y, z, residuals);
  return { ...base, coefficients: z, residuals, chiSquare: chi, refinementSteps: 0 };
}

/** w_i = 1/σ_i (all 1 without σ); calls `bad` at the first σ that is not finite and > 0. */
function weights(w: Float64Array, sigma: ArrayLike<number> | undefined, bad: () => void): void {
  if (!sigma) {
    w.fill(1);
    return;
  }
  for (let i = 0; i < w.length; i++) {
    const s = sigma[i];
    if (!(s > 0 && s < Infinity)) bad();
    w[i] = 1 / s;
  }
}

/**
 * Björck: from z and its residual r = W(y − Az) (in working precision) refine (r, z)
 * together against the unfactored weighted design; z is updated in place.
 */
function refineBjorck(f: QRFactor, design: Float64Array, w: Float64Array, y: ArrayLike<number>, z: Float64Array, kappa: number, maxSteps: number): { r: Float64Array; steps: number } {
  const { m, n } = f;
  correctionResidual(design, m, n, w, y, z, f.qr, n + 1);
  const r = f.qr.slice((n + 1) * m, (n + 2) * m);
  const as = new Float64Array(m * (n + 1));
  weightedSystem(design, m, n, w, y, as, new Float64Array(n + 1));
  const b = as.subarray(n * m);
  const hi = new Float64Array(m);
  const lo = new Float64Array(m);
  let steps = 0;
  while (steps < maxSteps) {
    steps++;
    // the next correction is about κ·ε times this one: stop once that is below rounding
    if (refineStep(f, as, b, z, r, hi, lo) * kappa <= 1) break;
  }
  return { r, steps };
}
