/**
 * Cells of a linear candidate C = Σ_j p_j φ_j(T) on every window of the recommendation grid:
 * all windows solved together by sequential QR row updating (updating.ts); a window whose
 * column-scaled condition estimate exceeds 10³ is solved afresh by solveLinearLeastSquares
 * (double-double refinement), as linearCells.ts does for the plain scan. Then each window's
 * residuals, χ², AICc and window tests (candidateCell.ts). Units SI.
 */
import { invalid } from "../errors";
import { solveLinearLeastSquares } from "../linalg/lstsq";
import { solveWindowsByUpdating } from "./updating";
import { weightedRows } from "./weightedRows";
import { REFINE_KAPPA, type SortedSeries } from "./linearCells";
import { cellFrom, failedCell, type CandidateCell } from "./candidateCell";
import type { RecommendWindow } from "./recommendGrid";

/** Column-major design φ_j(T_i) of all points. */
export function designOf(basis: readonly ((t: number) => number)[], T: Float64Array): Float64Array {
  const m = T.length;
  const a = new Float64Array(m * basis.length);
  basis.forEach((phi, j) => {
    for (let i = 0; i < m; i++) {
      const v = phi(T[i]);
      if (!Number.isFinite(v)) throw invalid("temperatureK", T[i], `basis function ${j + 1} of the model is ${v} there`);
      a[j * m + i] = v;
    }
  });
  return a;
}

/** The k×n column-major block of rows lo…hi of a column-major m×n design. */
export function designBlock(design: Float64Array, m: number, n: number, lo: number, hi: number): Float64Array {
  const k = hi - lo + 1;
  const a = new Float64Array(k * n);
  for (let j = 0; j < n; j++) a.set(design.subarray(j * m + lo, j * m + hi + 1), j * k);
  return a;
}

function fittedOf(design: Float64Array, m: number, n: number, lo: number, hi: number, x: ArrayLike<number>): Float64Array {
  const f = new Float64Array(hi - lo + 1);
  for (let j = 0; j < n; j++) {
    const xj = x[j];
    const off = j * m;
    for (let i = lo; i <= hi; i++) f[i - lo] += xj * design[off + i];
  }
  return f;
}

/** Cells of the linear model with basis `basis` (parameter `names`) on `windows`. */
export function linearCandidateCells(
  basis: readonly ((t: number) => number)[], names: readonly string[], s: SortedSeries, windows: readonly RecommendWindow[], level: number,
): CandidateCell[] {
  const m = s.T.length;
  const n = names.length;
  const design = designOf(basis, s.T);
  const sols = solveWindowsByUpdating(weightedRows(design, m, n, s.C, s.S ?? undefined), windows);
  return sols.map((sol0, k) => {
    const w = windows[k];
    let sol: { fullRank: boolean; coefficients: Float64Array; covariance: Float64Array } = sol0;
    if (sol0.fullRank && sol0.conditionEstimate > REFINE_KAPPA) {
      sol = solveLinearLeastSquares(designBlock(design, m, n, w.lo, w.hi), w.hi - w.lo + 1, n, s.C.subarray(w.lo, w.hi + 1), { sigma: s.S ? s.S.subarray(w.lo, w.hi + 1) : undefined });
    }
    if (!sol.fullRank) return failedCell(w.tMinK, w.tMaxK, w.hi - w.lo + 1, n, "the design is rank deficient in this window");
    const values = Object.fromEntries(names.map((name, j) => [name, sol.coefficients[j]]));
    const rawStdErrors = Object.fromEntries(names.map((name, j) => [name, Math.sqrt(sol.covariance[j * n + j])]));
    return cellFrom(s, w.lo, w.hi, w.tMinK, w.tMaxK, { values, rawStdErrors, fitted: fittedOf(design, m, n, w.lo, w.hi, sol.coefficients), nFree: n }, level);
  });
}
