/**
 * Levenberg–Marquardt with Marquardt's scaling: each step solves
 * min ‖r − JΔ‖² + λ‖DΔ‖², D_j = max over iterations of ‖J_j‖ (so λD² is Marquardt's
 * λ·diag(JᵀJ), kept monotone as in Moré's MINPACK), by QR of J and then QR of [R; √λ D]
 * — no normal equations. λ starts at 1e-3 and follows the gain ratio ρ = actual/predicted
 * χ² reduction (Nielsen's rule): after a success λ ← λ·max(1/3, 1 − (2ρ − 1)³), after a
 * failure λ ← λ·ν, ν ← 2ν (ν = 2 at each new iterate). (The plain ÷10/×10 rule left MGH17
 * start 1 unconverged after 2000 evaluations; this one needs ~600.) Bounds: projection onto the box, with parameters on a bound whose gradient
 * points outward held for that iteration (an active set).
 * Converged only when, after an accepted step, the relative step or the relative χ²
 * change (actual and predicted) is below tolerance, or when the scaled gradient vanishes;
 * anything else (evaluation limit, λ overflow, non-finite model) is converged: false with
 * a message. References: Marquardt, J. SIAM 11 (1963) 431; Moré, in G. A. Watson (ed.),
 * Numerical Analysis, Springer LNM 630 (1978) 105; Nielsen, IMM-REP-1999-05 (DTU, 1999).
 */
import { applyQt, qrFactor } from "../linalg/qr";
import { activeColumns, clampInto, dampedStep, deadColumn, gaussNewtonRelativeStep, onBounds } from "./lmSteps";
import {
  weightedJacobian,
  weightedResiduals,
  type LeastSquaresProblem,
  type LevenbergMarquardtOptions,
  type LevenbergMarquardtResult,
} from "./problem";

const LAMBDA_MAX = 1e16;
/** Undamped step accepted as converged when χ² has stopped decreasing: ≈ 7 correct digits. */
const GN_ROUNDING_LEVEL = 1e-7;

interface State {
  p: Float64Array;
  f: Float64Array;
  r: Float64Array;
  chi: number;
  evaluations: number;
  /** p changed since the Jacobian was last computed. */
  moved: boolean;
}

/** Minimise the weighted χ² of `problem` from `p0`. Never throws for a poor fit. */
export function levenbergMarquardt(problem: LeastSquaresProblem, p0: ArrayLike<number>, options: LevenbergMarquardtOptions = {}): LevenbergMarquardtResult {
  const { m, n } = problem;
  const maxEval = options.maxEvaluations ?? 2000;
  const xtol = options.xtol ?? 1e-10;
  const ftol = options.ftol ?? 1e-14;
  const gtol = options.gtol ?? 1e-12;
  const s: State = { p: Float64Array.from(p0), f: new Float64Array(m), r: new Float64Array(m), chi: NaN, evaluations: 0, moved: true };
  clampInto(problem, s.p);
  problem.model(s.p, s.f);
  s.evaluations++;
  s.chi = weightedResiduals(problem, s.f, s.r);
  const J = new Float64Array(m * n);
  if (!Number.isFinite(s.chi)) return done(problem, s, J, false, "model is not finite at the starting values", 0);
  const D = new Float64Array(n);
  let lambda = 1e-3;
  for (let iter = 1; ; iter++) {
    weightedJacobian(problem, s.p, J);
    s.moved = false;
    if (!J.every(Number.isFinite)) return done(problem, s, J, false, "derivatives are not finite", iter);
    if (s.chi === 0) return done(problem, s, J, true, "exact fit (χ² = 0)", iter);
    const g = new Float64Array(n);
    let gmax = 0;
    const rnorm = Math.sqrt(s.chi);
    for (let j = 0; j < n; j++) {
      let sj = 0;
      let nj = 0;
      for (let i = 0; i < m; i++) {
        sj += J[j * m + i] * s.r[i];
        nj += J[j * m + i] ** 2;
      }
      g[j] = sj;
      D[j] = Math.max(D[j], Math.sqrt(nj));
      if (D[j] === 0) D[j] = 1;
      if (nj > 0) gmax = Math.max(gmax, Math.abs(sj) / (Math.sqrt(nj) * rnorm));
    }
    const cols = activeColumns(problem, s.p, g);
    const gFree = cols.length ? Math.max(...cols.map((j) => Math.abs(g[j]) / (D[j] * rnorm))) : 0;
    if (cols.length === 0 || gFree <= gtol || gmax <= gtol) return done(problem, s, J, true, "gradient test satisfied", iter, D);
    const outcome = iterate(problem, s, J, D, cols, lambda, { xtol, ftol, maxEval });
    lambda = outcome.lambda;
    if (outcome.stop) return done(problem, s, J, outcome.converged, outcome.message, iter, D);
  }
}

interface StepOutcome {
  lambda: number;
  stop: boolean;
  converged: boolean;
  message: string;
}

function iterate(
  problem: LeastSquaresProblem,
  s: State,
  J: Float64Array,
  D: Float64Array,
  cols: number[],
  lambda0: number,
  tol: { xtol: number; ftol: number; maxEval: number },
): StepOutcome {
  const { m } = problem;
  const k = cols.length;
  const jk = new Float64Array(m * k);
  cols.forEach((j, c) => jk.set(J.subarray(j * m, (j + 1) * m), c * m));
  const f = qrFactor(jk, m, k);
  const qtr = new Float64Array(s.r);
  applyQt(f, qtr);
  const rk = new Float64Array(m * k);
  for (let j = 0; j < k; j++) {
    for (let i = 0; i < j; i++) rk[j * m + i] = f.qr[j * m + i];
    rk[j * m + j] = f.rdiag[j];
  }
  const dk = Float64Array.from(cols, (j) => D[j]);
  let tail = 0;
  for (let i = k; i < m; i++) tail += qtr[i] * qtr[i];
  const gnStep = new Float64Array(k);
  const gn = gaussNewtonRelativeStep(f.rdiag, rk, m, k, qtr, cols, D, s.p, gnStep);
  let lambda = lambda0;
  let nu = 2;
  const pNew = new Float64Array(s.p.length);
  const fNew = new Float64Array(m);
  const rNew = new Float64Array(m);
  if (gn <= tol.xtol) {
    // take the (tiny) final Gauss–Newton step when it does not raise χ²: quadratic convergence
    pNew.set(s.p);
    cols.forEach((j, c) => (pNew[j] += gnStep[c]));
    clampInto(problem, pNew);
    problem.model(pNew, fNew);
    s.evaluations++;
    const chiNew = weightedResiduals(problem, fNew, rNew);
    if (Number.isFinite(chiNew) && chiNew <= s.chi) {
      s.p.set(pNew);
      s.f.set(fNew);
      s.r.set(rNew);
      s.chi = chiNew;
      // J is kept: the step is below xtol relative, so J at the new point differs by less than that
    }
    return { lambda: lambda0, stop: true, converged: true, message: "Gauss–Newton step below tolerance" };
  }
  for (;;) {
    if (s.evaluations >= tol.maxEval) return { lambda, stop: true, converged: false, message: `no convergence within ${tol.maxEval} evaluations` };
    const step = dampedStep(rk, m, k, qtr, dk, lambda);
    pNew.set(s.p);
    cols.forEach((j, c) => (pNew[j] += step[c]));
    clampInto(problem, pNew);
    // predicted χ² after the projected step: ‖c1 − RΔ‖² + ‖c2‖²
    let pred = tail;
    let dxNorm = 0;
    let xNorm = 0;
    for (let i = 0; i < k; i++) {
      let v = qtr[i];
      for (let c = i; c < k; c++) v -= rk[c * m + i] * (pNew[cols[c]] - s.p[cols[c]]);
      pred += v * v;
    }
    cols.forEach((j) => {
      dxNorm += (D[j] * (pNew[j] - s.p[j])) ** 2;
      xNorm += (D[j] * s.p[j]) ** 2;
    });
    problem.model(pNew, fNew);
    s.evaluations++;
    const chiNew = weightedResiduals(problem, fNew, rNew);
    const predicted = s.chi - pred;
    if (Number.isFinite(chiNew) && chiNew < s.chi && predicted > 0) {
      const actualRel = (s.chi - chiNew) / s.chi;
      const predRel = predicted / s.chi;
      s.p.set(pNew);
      s.f.set(fNew);
      s.r.set(rNew);
      s.chi = chiNew;
      s.moved = true;
      if (Math.sqrt(dxNorm) <= tol.xtol * (Math.sqrt(xNorm) + tol.xtol)) return { lambda, stop: true, converged: true, message: "relative step below tolerance" };
      if (actualRel <= tol.ftol && predRel <= tol.ftol) return { lambda, stop: true, converged: true, message: "relative χ² change below tolerance" };
      const rho = (s.chi === 0 ? 1 : actualRel / predRel);
      return { lambda: Math.max(lambda * Math.max(1 / 3, 1 - (2 * rho - 1) ** 3), 1e-15), stop: false, converged: false, message: "" };
    }
    lambda *= nu;
    nu *= 2;
    if (lambda > LAMBDA_MAX) {
      // χ² cannot go lower in floating point; that is a minimum only if the undamped step is tiny
      if (gn <= GN_ROUNDING_LEVEL) return { lambda: lambda0, stop: true, converged: true, message: `χ² cannot be reduced further at rounding level (Gauss–Newton step ${gn.toExponential(1)} relative)` };
      return { lambda, stop: true, converged: false, message: "no step reduces χ² (damping overflow): not at a verified minimum" };
    }
  }
}

function done(problem: LeastSquaresProblem, s: State, J: Float64Array, converged: boolean, message: string, iterations: number, D?: Float64Array): LevenbergMarquardtResult {
  // the Jacobian at the final point is refreshed for the covariance
  if (s.moved) weightedJacobian(problem, s.p, J);
  const dead = converged && D ? deadColumn(J, problem.m, D) : -1;
  if (dead >= 0) {
    converged = false;
    message = `parameter ${dead + 1} no longer affects the model (χ² is flat along it): stalled on a plateau, not a verified minimum`;
  }
  return { p: s.p, converged, message, evaluations: s.evaluations, iterations, chiSquare: s.chi, residuals: s.r, jacobian: J, atBound: onBounds(problem, s.p) };
}
