/**
 * Shared fit machinery for registry models and user expressions: maps named parameters
 * (with fixed values and bounds) onto the solvers — Householder QR for models linear in
 * their parameters, Levenberg–Marquardt otherwise — and assembles the FitResult.
 * Parameter standard errors come from the covariance of the free parameters at the
 * solution: (JᵀWJ)⁻¹ by QR of the weighted Jacobian, scaled as documented in result.ts.
 */
import { solveLinearLeastSquares } from "../linalg/lstsq";
import { levenbergMarquardt } from "./lm";
import type { LevenbergMarquardtOptions } from "./problem";
import { buildFitResult, type FitResult } from "./result";

/** A model over all its parameters, in `names` order (positional only inside the engine). */
export interface ModelCore {
  readonly label: string;
  readonly names: readonly string[];
  readonly units: readonly string[];
  readonly linear: boolean;
  /** out[i] = f(x_i; p). */
  evaluate(x: Float64Array, p: Float64Array, out: Float64Array): void;
  /** Column-major m×names.length ∂f/∂p, or null for numerical derivatives. */
  readonly jacobian: ((x: Float64Array, p: Float64Array, out: Float64Array) => void) | null;
}

export interface CoreOptions {
  readonly start: Float64Array;
  readonly fixed: readonly boolean[];
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  readonly scaleErrors: boolean;
  readonly lm?: LevenbergMarquardtOptions;
  readonly warnings?: string[];
  /**
   * Lowest χ² met by a search before this fit (global start): a fit that ends above it is
   * not a verified minimum and is reported converged: false with a warning.
   */
  readonly bestSeen?: { readonly chiSquare: number; readonly where: string; /** Σ δ_i² of the rounding δ_i in evaluating each weighted residual. */ readonly floor?: number };
}

/** Fit `core` to (x, y, σ). Never throws for a poor fit; the result says what happened. */
export function fitCore(core: ModelCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions): FitResult {
  return core.linear ? fitLinear(core, x, y, sigma, opt) : fitNonlinear(core, x, y, sigma, opt);
}

function basisColumns(core: ModelCore, x: Float64Array): { design: Float64Array; offset: Float64Array } {
  const m = x.length;
  const n = core.names.length;
  const zero = new Float64Array(n);
  const offset = new Float64Array(m);
  core.evaluate(x, zero, offset);
  const design = new Float64Array(m * n);
  if (core.jacobian) core.jacobian(x, zero, design);
  return { design, offset };
}

function fitLinear(core: ModelCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions): FitResult {
  const m = x.length;
  const n = core.names.length;
  const { design, offset } = basisColumns(core, x);
  const values = new Float64Array(opt.start);
  const pinned = [...opt.fixed];
  const atBound = new Array<boolean>(n).fill(false);
  for (let pass = 0; pass <= n; pass++) {
    const free = core.names.map((_, j) => j).filter((j) => !pinned[j]);
    const target = new Float64Array(m);
    for (let i = 0; i < m; i++) target[i] = y[i] - offset[i];
    for (let j = 0; j < n; j++) if (pinned[j]) for (let i = 0; i < m; i++) target[i] -= values[j] * design[j * m + i];
    const a = new Float64Array(m * free.length);
    free.forEach((j, c) => a.set(design.subarray(j * m, (j + 1) * m), c * m));
    const sol = free.length ? solveLinearLeastSquares(a, m, free.length, target, { sigma: sigma ?? undefined }) : null;
    if (sol && !sol.fullRank) return failed(core, x, y, sigma, opt, values, "the design is rank deficient: parameters cannot be separated with these points (too few points, or equal temperatures)");
    free.forEach((j, c) => (values[j] = sol!.coefficients[c]));
    // active set for bounds: pin the worst violator on its bound and solve again
    let worst = -1;
    let excess = 0;
    for (const j of free) {
      const over = Math.max(opt.lower[j] - values[j], values[j] - opt.upper[j]);
      if (over > excess) [worst, excess] = [j, over];
    }
    if (worst < 0) {
      const residuals = new Float64Array(m);
      const f = new Float64Array(m);
      core.evaluate(x, values, f);
      for (let i = 0; i < m; i++) residuals[i] = y[i] - f[i];
      const overflow = endPointProblem(residuals.reduce((s, r, i) => s + (r / (sigma ? sigma[i] : 1)) ** 2, 0), {});
      if (overflow) return failed(core, x, y, sigma, opt, values, overflow);
      return buildFitResult({
        ...common(core, y, sigma, opt, values, atBound),
        method: "linear-qr",
        covariance: sol ? sol.covariance : null,
        covNames: free.map((j) => core.names[j]),
        nFree: free.length,
        residuals,
        converged: true,
        message: "solved directly by Householder QR",
        evaluations: 1,
      });
    }
    values[worst] = values[worst] < opt.lower[worst] ? opt.lower[worst] : opt.upper[worst];
    pinned[worst] = true;
    atBound[worst] = true;
  }
  return failed(core, x, y, sigma, opt, values, "bounds could not be satisfied");
}

function common(core: ModelCore, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions, values: Float64Array, atBound: boolean[]) {
  const warnings = [...(opt.warnings ?? [])];
  atBound.forEach((b, j) => b && warnings.push(`${core.names[j]} ends on its bound ${values[j]}: it was held there and has no standard error`));
  return {
    model: core.label,
    names: core.names,
    units: core.units,
    values,
    initial: Array.from(opt.start, (v, j) => (opt.fixed[j] || Number.isFinite(v) ? v : null)),
    fixed: opt.fixed,
    atBound,
    lower: opt.lower,
    upper: opt.upper,
    y,
    w: sigma ? Float64Array.from(sigma, (s) => 1 / s) : null,
    scaleErrors: opt.scaleErrors,
    warnings,
  };
}

function failed(core: ModelCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions, values: Float64Array, message: string): FitResult {
  const f = new Float64Array(x.length);
  core.evaluate(x, values, f);
  return buildFitResult({
    ...common(core, y, sigma, opt, values, new Array<boolean>(core.names.length).fill(false)),
    method: core.linear ? "linear-qr" : "levenberg-marquardt",
    covariance: null,
    covNames: [],
    nFree: opt.fixed.filter((v) => !v).length,
    residuals: Float64Array.from(y, (v, i) => v - f[i]),
    converged: false,
    message,
    evaluations: 0,
  });
}

/** Reasons the end point cannot be called a minimum, beyond what LM itself checks. */
function endPointProblem(chi: number, opt: Pick<CoreOptions, "bestSeen">): string | null {
  if (!Number.isFinite(chi)) return "χ² is not finite at the end point (overflow: values too large for double precision, or the model is not finite there)";
  const seen = opt.bestSeen;
  // rounding δ changes χ² by up to 2‖r‖‖δ‖ + ‖δ‖² (Cauchy–Schwarz): not a lower minimum
  const rounding = seen?.floor ? 2 * Math.sqrt(seen.chiSquare * seen.floor) + seen.floor : 0;
  if (seen && chi > seen.chiSquare * (1 + 1e-9) + rounding + 1e-300) return `ended at χ² = ${chi.toPrecision(6)} although the search met χ² = ${seen.chiSquare.toPrecision(6)} at ${seen.where}: not the global minimum`;
  return null;
}

/** Fit a nonlinear core by LM from opt.start (exported for the global-start driver). */
export function fitNonlinear(core: ModelCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions): FitResult {
  const m = x.length;
  const nAll = core.names.length;
  const free = core.names.map((_, j) => j).filter((j) => !opt.fixed[j]);
  const k = free.length;
  const full = new Float64Array(opt.start);
  const expand = (p: Float64Array) => free.forEach((j, c) => (full[j] = p[c]));
  const jAll = new Float64Array(m * nAll);
  const problem = {
    m,
    n: k,
    y,
    w: sigma ? Float64Array.from(sigma, (s) => 1 / s) : null,
    model: (p: Float64Array, out: Float64Array) => {
      expand(p);
      core.evaluate(x, full, out);
    },
    jacobian: core.jacobian
      ? (p: Float64Array, out: Float64Array) => {
          expand(p);
          core.jacobian!(x, full, jAll);
          free.forEach((j, c) => out.set(jAll.subarray(j * m, (j + 1) * m), c * m));
        }
      : undefined,
    lower: Float64Array.from(free, (j) => opt.lower[j]),
    upper: Float64Array.from(free, (j) => opt.upper[j]),
  };
  if (m < k) return failed(core, x, y, sigma, opt, full, `${m} points cannot determine ${k} free parameters`);
  const lm0 = levenbergMarquardt(problem, Float64Array.from(free, (j) => opt.start[j]), opt.lm);
  const problemAtEnd = endPointProblem(lm0.chiSquare, opt);
  const lm = problemAtEnd ? { ...lm0, converged: false, message: `${lm0.message}; ${problemAtEnd}` } : lm0;
  const endWarnings = problemAtEnd ? [`not converged: ${problemAtEnd}`] : [];
  expand(lm.p);
  const values = new Float64Array(full);
  const atBound = new Array<boolean>(nAll).fill(false);
  free.forEach((j, c) => (atBound[j] = lm.atBound[c]));
  const covCols = free.map((j, c) => [j, c]).filter(([j]) => !atBound[j]);
  const jc = new Float64Array(m * covCols.length);
  covCols.forEach(([, c], t) => jc.set(lm.jacobian.subarray(c * m, (c + 1) * m), t * m));
  const cov = covCols.length && lm.converged ? solveLinearLeastSquares(jc, m, covCols.length, lm.residuals, { refine: 0 }) : null;
  const f = new Float64Array(m);
  core.evaluate(x, values, f);
  const base = common(core, y, sigma, opt, values, atBound);
  return buildFitResult({
    ...base,
    warnings: [...base.warnings, ...endWarnings],
    method: "levenberg-marquardt",
    covariance: cov && cov.fullRank ? cov.covariance : null,
    covNames: covCols.map(([j]) => core.names[j]),
    nFree: covCols.length,
    residuals: Float64Array.from(y, (v, i) => v - f[i]),
    converged: lm.converged,
    message: cov && !cov.fullRank ? `${lm.message}; the Jacobian is singular at the solution, no standard errors` : lm.message,
    evaluations: lm.evaluations,
  });
}
