/**
 * Window-scan cells of a linear model C = Σ_k p_k φ_k(T) (scanWindows.ts). All windows are
 * solved together by sequential QR row updating (updating.ts); a window whose column-scaled
 * condition estimate κ exceeds REFINE_KAPPA is solved afresh by solveLinearLeastSquares,
 * which refines such problems in double-double where one fixed-precision correction keeps
 * only about 16 − log10 κ digits. Standard errors are √cov_jj, multiplied by √χ²_red only
 * when there is no σ; χ²_red = χ²/(k − n). Units as fitHeatCapacity (SI).
 * Failure modes: InputError naming the temperature where a basis function is not finite.
 */
import { invalid } from "../errors";
import { solveLinearLeastSquares } from "../linalg/lstsq";
import { solveWindowsByUpdating, type WindowSpan } from "./updating";
import { weightedRows } from "./weightedRows";
import type { ScanCell } from "./scanWindows";

/** Sorted data of a scan: T ascending, C and σ in the same order. */
export interface SortedSeries {
  readonly T: Float64Array;
  readonly C: Float64Array;
  readonly S: Float64Array | null;
}

export type CellCore = Omit<ScanCell, "tMinK" | "tMaxK" | "beyondT3Range">;

/** lstsq.ts refines in double-double above this κ (its REFINE_KAPPA, mirrored here). */
export const REFINE_KAPPA = 1e3;

const safe = (v: number) => (Number.isFinite(v) ? v : null);

/** Column-major design φ_j(T_i) of all points. */
function buildDesign(basis: readonly ((t: number) => number)[], T: Float64Array): Float64Array {
  const m = T.length;
  const a = new Float64Array(m * basis.length);
  basis.forEach((phi, j) =>
    T.forEach((t, i) => {
      const v = phi(t);
      if (!Number.isFinite(v)) throw invalid("temperatureK", t, `basis function ${j + 1} of the model is ${v} there`);
      a[j * m + i] = v;
    }),
  );
  return a;
}

/** One cell from a coefficient vector, covariance (AᵀWA)⁻¹ and χ² of a k-point window. */
function cellOf(k: number, names: readonly string[], x: Float64Array, cov: Float64Array, chi: number, hasSigma: boolean): CellCore {
  const n = names.length;
  const red = chi / (k - n);
  const f = hasSigma ? 1 : red;
  const gi = names.indexOf("gamma");
  const bi = names.indexOf("beta");
  const se = (j: number) => (j >= 0 ? safe(Math.sqrt(cov[j * n + j] * f)) : null);
  return { nPoints: k, gamma: gi >= 0 ? x[gi] : null, gammaStdError: se(gi), beta: bi >= 0 ? x[bi] : null, betaStdError: se(bi), reducedChiSquare: safe(red), converged: true };
}

const failed = (k: number): CellCore => ({ nPoints: k, gamma: null, gammaStdError: null, beta: null, betaStdError: null, reducedChiSquare: null, converged: false });

/** The window solved on its own by Householder QR (lstsq.ts). */
function freshCell(design: Float64Array, s: SortedSeries, w: WindowSpan, names: readonly string[]): CellCore {
  const m = s.T.length;
  const n = names.length;
  const k = w.hi - w.lo + 1;
  const a = new Float64Array(k * n);
  for (let j = 0; j < n; j++) a.set(design.subarray(j * m + w.lo, j * m + w.hi + 1), j * k);
  const sol = solveLinearLeastSquares(a, k, n, s.C.subarray(w.lo, w.hi + 1), { sigma: s.S ? s.S.subarray(w.lo, w.hi + 1) : undefined });
  return sol.fullRank ? cellOf(k, names, sol.coefficients, sol.covariance, sol.chiSquare, s.S !== null) : failed(k);
}

/** Cells of the windows `spans` (inclusive row ranges of the sorted series), in that order. */
export function linearCells(basis: readonly ((t: number) => number)[], names: readonly string[], s: SortedSeries, spans: readonly WindowSpan[]): CellCore[] {
  const m = s.T.length;
  const design = buildDesign(basis, s.T);
  const sols = solveWindowsByUpdating(weightedRows(design, m, names.length, s.C, s.S ?? undefined), spans);
  return sols.map((sol, k) => {
    const w = spans[k];
    const size = w.hi - w.lo + 1;
    if (!sol.fullRank) return failed(size);
    if (sol.conditionEstimate > REFINE_KAPPA) return freshCell(design, s, w, names);
    return cellOf(size, names, sol.coefficients, sol.covariance, sol.chiSquare, s.S !== null);
  });
}
