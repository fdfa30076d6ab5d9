/**
 * One candidate model fitted on one window of the recommendation grid (recommend.ts), in SI:
 * γ [J mol⁻¹ K⁻²], β [J mol⁻¹ K⁻⁴], residualStdDev [J mol⁻¹ K⁻¹]. Statistical standard
 * errors are √cov_jj, multiplied by √χ²_red only without σ (as fitHeatCapacity).
 * AICc with known σ: χ² + 2p + 2p(p+1)/(k−p−1) (the Gaussian log-likelihood with known
 * variances, constants dropped); without σ: k ln(RSS/k) + the same penalty. Either way only
 * differences between models on the same window mean anything. A fit is acceptable when
 * it passes the window tests (windowTests.ts), γ has a standard error, and the lattice and
 * electronic terms are physical: β > 0 and γ > −3σ(γ). Reference: Burnham &
 * Anderson, Model Selection and Multimodel Inference (2nd ed., 2002), §2.4 and §7.4.
 */
import { testWindow, type WindowTests } from "./windowTests";
import type { SortedSeries } from "./linearCells";

export interface CandidateCell {
  readonly tMinK: number;
  readonly tMaxK: number;
  readonly nPoints: number;
  /** Free parameters of the fit (counting a searched gap). */
  readonly nFree: number;
  readonly converged: boolean;
  readonly gamma: number | null;
  readonly gammaStdError: number | null;
  readonly beta: number | null;
  readonly betaStdError: number | null;
  /** Other fitted parameters (SI), e.g. {n, gap} of the Schottky term, {A}, {delta}. */
  readonly extra: Readonly<Record<string, number>>;
  readonly chiSquare: number | null;
  readonly reducedChiSquare: number | null;
  /** √(Σ (C − f)²/(k − p)), unweighted, in J mol⁻¹ K⁻¹. */
  readonly residualStdDev: number | null;
  readonly aicc: number | null;
  readonly tests: WindowTests | null;
  readonly acceptable: boolean;
  /** Why the cell is not usable or what to keep in mind (e.g. "gap at the search bound"). */
  readonly note: string | null;
}

const safe = (v: number | undefined | null) => (v !== undefined && v !== null && Number.isFinite(v) ? v : null);

export function failedCell(tMinK: number, tMaxK: number, nPoints: number, nFree: number, note: string): CandidateCell {
  return Object.freeze({
    tMinK, tMaxK, nPoints, nFree, converged: false, gamma: null, gammaStdError: null, beta: null, betaStdError: null, extra: Object.freeze({}),
    chiSquare: null, reducedChiSquare: null, residualStdDev: null, aicc: null, tests: null, acceptable: false, note,
  });
}

export interface CellFit {
  readonly values: Readonly<Record<string, number>>;
  /** Standard errors before any χ²_red scaling (√ of the diagonal of (JᵀWJ)⁻¹), by name; null when not estimable. */
  readonly rawStdErrors: Readonly<Record<string, number | null>>;
  /** f(T_i) at the window's points, in window order. */
  readonly fitted: Float64Array;
  readonly nFree: number;
  readonly note?: string | null;
}

function physical(gamma: number | undefined, gammaSe: number | null, beta: number | undefined): boolean {
  if (gamma === undefined || !Number.isFinite(gamma) || gammaSe === null) return false;
  return gamma > -3 * gammaSe && (beta === undefined || beta > 0);
}

/** Build the cell: residuals, χ², AICc and the window tests from a fit on rows lo…hi of `s`. */
export function cellFrom(s: SortedSeries, lo: number, hi: number, tMinK: number, tMaxK: number, fit: CellFit, level: number): CandidateCell {
  const k = hi - lo + 1;
  const p = fit.nFree;
  const z = new Float64Array(k);
  let chi = 0;
  let rss = 0;
  for (let i = 0; i < k; i++) {
    const r = s.C[lo + i] - fit.fitted[i];
    rss += r * r;
    z[i] = s.S ? r / s.S[lo + i] : r;
    chi += z[i] * z[i];
  }
  const dof = k - p;
  const red = dof > 0 ? chi / dof : NaN;
  const scale = s.S ? 1 : Math.sqrt(red);
  const se = (name: string) => {
    const v = fit.rawStdErrors[name];
    return v === null || v === undefined ? null : safe(v * scale);
  };
  const penalty = 2 * p + (k - p - 1 > 0 ? (2 * p * (p + 1)) / (k - p - 1) : NaN);
  const aicc = s.S ? chi + penalty : k * Math.log(rss / k) + penalty;
  const tests = testWindow(z, p, chi, s.S !== null, level);
  const { gamma, beta, ...rest } = fit.values;
  return Object.freeze({
    tMinK, tMaxK, nPoints: k, nFree: p, converged: true,
    gamma: safe(gamma), gammaStdError: se("gamma"), beta: safe(beta), betaStdError: se("beta"), extra: Object.freeze(rest),
    chiSquare: safe(chi), reducedChiSquare: safe(red), residualStdDev: dof > 0 ? safe(Math.sqrt(rss / dof)) : null, aicc: safe(aicc),
    tests, acceptable: tests.acceptable && physical(gamma, se("gamma"), beta), note: fit.note ?? null,
  });
}
