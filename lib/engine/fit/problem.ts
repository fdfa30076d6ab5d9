/**
 * The solver-facing description of a nonlinear least-squares problem: minimise
 * χ²(p) = Σ_i w_i² (y_i − f_i(p))², w_i = 1/σ_i (or 1), over the free parameters p,
 * with optional box bounds. Positional parameter vectors exist only at this level.
 */

export interface LeastSquaresProblem {
  readonly m: number;
  readonly n: number;
  readonly y: Float64Array;
  /** 1/σ per point, or null for an unweighted fit. */
  readonly w: Float64Array | null;
  /** out[i] = f_i(p). */
  readonly model: (p: Float64Array, out: Float64Array) => void;
  /** Column-major m×n ∂f_i/∂p_j, or absent for central-difference derivatives. */
  readonly jacobian?: (p: Float64Array, out: Float64Array) => void;
  readonly lower?: Float64Array;
  readonly upper?: Float64Array;
}

export interface LevenbergMarquardtOptions {
  /** Limit on model evaluations, not counting those for numerical derivatives. Default 2000. */
  readonly maxEvaluations?: number;
  /** Relative step test ‖DΔp‖ ≤ xtol (‖Dp‖ + xtol). Default 1e-10. */
  readonly xtol?: number;
  /** Relative χ² change test (actual and predicted). Default 1e-14. */
  readonly ftol?: number;
  /** Gradient test: max_j |J_jᵀr| / (‖J_j‖‖r‖) ≤ gtol. Default 1e-12. */
  readonly gtol?: number;
}

export interface LevenbergMarquardtResult {
  readonly p: Float64Array;
  readonly converged: boolean;
  readonly message: string;
  readonly evaluations: number;
  readonly iterations: number;
  readonly chiSquare: number;
  /** Weighted residuals w_i (y_i − f_i) at p. */
  readonly residuals: Float64Array;
  /** Weighted Jacobian w_i ∂f_i/∂p_j at p (column-major m×n), central differences if not analytic. */
  readonly jacobian: Float64Array;
  /** Parameters that end on a bound. */
  readonly atBound: readonly boolean[];
}

/** Weighted residuals r = w (y − f) into `r`; returns χ² (NaN if any is not finite). */
export function weightedResiduals(problem: LeastSquaresProblem, f: Float64Array, r: Float64Array): number {
  const { y, w, m } = problem;
  let chi = 0;
  for (let i = 0; i < m; i++) {
    const ri = w ? w[i] * (y[i] - f[i]) : y[i] - f[i];
    r[i] = ri;
    chi += ri * ri;
  }
  return Number.isFinite(chi) ? chi : NaN;
}

/** Weighted Jacobian J_ij = w_i ∂f_i/∂p_j, analytic when given, else central differences. */
export function weightedJacobian(problem: LeastSquaresProblem, p: Float64Array, out: Float64Array): void {
  const { m, n, w } = problem;
  if (problem.jacobian) problem.jacobian(p, out);
  else centralDifferences(problem, p, out);
  if (w) for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) out[j * m + i] *= w[i];
}

const H_REL = 6.055454452393343e-6; // ε^(1/3): optimal for central differences

function centralDifferences(problem: LeastSquaresProblem, p: Float64Array, out: Float64Array): void {
  const { m, n, lower, upper } = problem;
  const fp = new Float64Array(m);
  const fm = new Float64Array(m);
  const q = new Float64Array(p);
  for (let j = 0; j < n; j++) {
    const h = H_REL * Math.max(Math.abs(p[j]), 1e-8);
    let hp = h;
    let hm = h;
    if (upper && p[j] + h > upper[j]) hp = 0;
    if (lower && p[j] - h < lower[j]) hm = 0;
    if (hp === 0 && hm === 0) hp = h;
    q[j] = p[j] + hp;
    problem.model(q, fp);
    q[j] = p[j] - hm;
    problem.model(q, fm);
    q[j] = p[j];
    const inv = 1 / (hp + hm);
    for (let i = 0; i < m; i++) out[j * m + i] = (fp[i] - fm[i]) * inv;
  }
}
