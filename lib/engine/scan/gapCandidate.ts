/**
 * Cells of the candidate C = γT + βT³ + n·S(T; Δ), S the two-level Schottky term per unit
 * amount (g = 1, models/schottky.ts), with the gap Δ free, on every window of the grid, by
 * separable least squares (variable projection): for fixed Δ the model is linear in γ, β, n
 * and their best values follow exactly, so χ² is a function of Δ alone (the profile χ²(Δ)).
 *   1. Grid: for each of GRID_SIZE gaps spaced evenly in ln Δ over [T_lo/5, 2·T_hi] (the
 *      peak of S lies near Δ/2.4: from far below the data to the top of the range) all
 *      windows are solved at once by sequential Givens row updating (one sweep per lower
 *      edge), χ² from the running sum of rotated-out squares; only gaps with n > 0 count.
 *      In a window starting at T_min only gaps up to PEAK_LIMIT·T_min count: the peak of S
 *      (at ≈ Δ/2.4) then lies at most at twice the window's lowest temperature, so the term is
 *      the low-temperature upturn this candidate stands for. A bump inside the window (an
 *      Einstein mode, a Schottky peak at higher T) is not a candidate's business: it shows as
 *      a window the candidates cannot describe, and diagnose.ts names it.
 *   2. Refine: Brent's minimiser on ln Δ between the grid neighbours of the best grid gap
 *      (to 1e-3 in ln Δ), each evaluation a fresh Givens pass over the window's rows, then up to four
 *      Gauss–Newton steps on (γ, β, n, Δ), each kept only if χ² does not rise.
 *   3. At the minimum: γ, β, n by solveLinearLeastSquares, and the statistical covariance of
 *      (γ, β, n, Δ) from the 4-column Jacobian [T, T³, S, n ∂S/∂Δ] (Gauss–Newton), so σ(γ)
 *      includes the freedom of the gap. A best gap on the edge of the grid is "at the search
 *      bound": Δ is then not determined by the window, and σ comes from (γ, β, n) at that Δ.
 * Windows without any gap giving n > 0 show no Schottky term: their cell is not usable.
 * Reference: Golub & Pereyra, SIAM J. Numer. Anal. 10 (1973) 413 (variable projection).
 */
import { schottkyHeatCapacity } from "../models/schottky";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";
import { solveLinearLeastSquares } from "../linalg/lstsq";
import { minimizeBrent } from "./brent";
import { cellFrom, failedCell, type CandidateCell } from "./candidateCell";
import type { SortedSeries } from "./linearCells";
import type { RecommendWindow } from "./recommendGrid";

const GRID_SIZE = 36;
/** Largest gap of a window, in units of its lowest temperature (peak at ≤ 2 T_min). */
export const PEAK_LIMIT = 4.8;
const N_FREE = 4;

/** ∂S/∂Δ of the unit-amount two-level term (g = 1): R x e (2 − x(1 − e)/(1 + e)) / ((1 + e)² T), e = e^{−x}, x = Δ/T. */
export function schottkyGapDerivative(temperatureK: number, gapK: number): number {
  const x = gapK / temperatureK;
  if (x > 700) return 0;
  const e = Math.exp(-x);
  return (R * x * e * (2 - (x * (1 - e)) / (1 + e))) / ((1 + e) * (1 + e) * temperatureK);
}

/** The gap grid for data from tLo to tHi. */
export function gapGrid(tLo: number, tHi: number, size = GRID_SIZE): Float64Array {
  const a = tLo / 5;
  const b = 2 * tHi;
  return Float64Array.from({ length: size }, (_, k) => a * (b / a) ** (k / (size - 1)));
}

/**
 * Rotate the row (x0, x1, x2 | b) into the 3-column factor held in `st` =
 * [R00, R01, R02, R11, R12, R22, q0, q1, q2, rss] (Givens, as givens.ts appendRow with the
 * loops written out for three columns; rss sums the rotated-out squares).
 */
function rotate3(st: Float64Array, x0: number, x1: number, x2: number, b: number): void {
  if (x0 !== 0) {
    const p = st[0];
    const h = Math.sqrt(p * p + x0 * x0);
    const c = p / h, s = x0 / h;
    st[0] = h;
    let t = st[1]; st[1] = c * t + s * x1; x1 = c * x1 - s * t;
    t = st[2]; st[2] = c * t + s * x2; x2 = c * x2 - s * t;
    t = st[6]; st[6] = c * t + s * b; b = c * b - s * t;
  }
  if (x1 !== 0) {
    const p = st[3];
    const h = Math.sqrt(p * p + x1 * x1);
    const c = p / h, s = x1 / h;
    st[3] = h;
    let t = st[4]; st[4] = c * t + s * x2; x2 = c * x2 - s * t;
    t = st[7]; st[7] = c * t + s * b; b = c * b - s * t;
  }
  if (x2 !== 0) {
    const p = st[5];
    const h = Math.sqrt(p * p + x2 * x2);
    const c = p / h, s = x2 / h;
    st[5] = h;
    const t = st[8]; st[8] = c * t + s * b; b = c * b - s * t;
  }
  st[9] += b * b;
}

/** n of the factor in `st` (back substitution of the last row only), NaN when R22 or R11 vanishes against the diagonal. */
function amountOf(st: Float64Array): number {
  const diag = Math.abs(st[0]) + Math.abs(st[3]) + Math.abs(st[5]);
  if (!(Math.abs(st[5]) > 1e-12 * diag) || !(Math.abs(st[3]) > 1e-12 * diag)) return NaN;
  return st[8] / st[5];
}

interface Profile {
  /** χ² per (window, gap), row-major windows × gaps; NaN where n ≤ 0 or rank deficient. */
  readonly chi: Float64Array;
}

/** Step 1: χ² of every window at every grid gap (only where n > 0). */
function gridProfile(s: SortedSeries, windows: readonly RecommendWindow[], gaps: Float64Array): Profile {
  const m = s.T.length;
  const G = gaps.length;
  const chi = new Float64Array(windows.length * G).fill(NaN);
  const order = windows.map((_, k) => k).sort((p, q) => windows[p].lo - windows[q].lo || windows[p].hi - windows[q].hi);
  const rows = new Float64Array(m * 3);
  const b = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const w = s.S ? 1 / s.S[i] : 1;
    rows[3 * i] = s.T[i] * w;
    rows[3 * i + 1] = s.T[i] ** 3 * w;
    b[i] = s.C[i] * w;
  }
  const st = new Float64Array(10);
  for (let g = 0; g < G; g++) {
    for (let i = 0; i < m; i++) rows[3 * i + 2] = schottkyHeatCapacity(s.T[i], gaps[g]) * (s.S ? 1 / s.S[i] : 1);
    let lo = -1;
    let next = 0;
    for (const k of order) {
      const win = windows[k];
      if (win.lo !== lo) {
        lo = win.lo;
        next = lo;
        st.fill(0);
      }
      for (; next <= win.hi; next++) rotate3(st, rows[3 * next], rows[3 * next + 1], rows[3 * next + 2], b[next]);
      if (amountOf(st) > 0) chi[k * G + g] = st[9];
    }
  }
  return { chi };
}

/** χ² and n of one window at one gap by a fresh Givens pass. */
function windowAt(s: SortedSeries, lo: number, hi: number, gap: number, st: Float64Array): { chi: number; n: number } {
  st.fill(0);
  for (let i = lo; i <= hi; i++) {
    const w = s.S ? 1 / s.S[i] : 1;
    const t = s.T[i];
    rotate3(st, t * w, t * t * t * w, schottkyHeatCapacity(t, gap) * w, s.C[i] * w);
  }
  return { chi: st[9], n: amountOf(st) };
}

function columns(s: SortedSeries, lo: number, hi: number, gap: number, amount: number | null): Float64Array {
  const k = hi - lo + 1;
  const n = amount === null ? 3 : 4;
  const a = new Float64Array(k * n);
  for (let i = 0; i < k; i++) {
    const t = s.T[lo + i];
    a[i] = t;
    a[k + i] = t * t * t;
    a[2 * k + i] = schottkyHeatCapacity(t, gap);
    if (amount !== null) a[3 * k + i] = amount * schottkyGapDerivative(t, gap);
  }
  return a;
}

/** Steps 2 and 3 for one window whose best grid gap has index g. */
function refineWindow(s: SortedSeries, win: RecommendWindow, gaps: Float64Array, g: number, gMax: number, level: number): CandidateCell {
  const k = win.hi - win.lo + 1;
  const atBound = g === 0 || g === gMax;
  let gap = gaps[g];
  if (!atBound) {
    const st = new Float64Array(10);
    const f = (u: number) => {
      const v = windowAt(s, win.lo, win.hi, Math.exp(u), st);
      return v.n > 0 ? v.chi : Infinity;
    };
    const best = minimizeBrent(f, Math.log(gaps[g - 1]), Math.log(gaps[g + 1]), 1e-3, 20);
    if (Number.isFinite(best.f)) gap = Math.exp(best.x);
  }
  const sigma = s.S ? s.S.subarray(win.lo, win.hi + 1) : undefined;
  const y = s.C.subarray(win.lo, win.hi + 1);
  const solveAt = (d: number) => solveLinearLeastSquares(columns(s, win.lo, win.hi, d, null), k, 3, y, { sigma });
  let lin = solveAt(gap);
  // Gauss–Newton polish of (γ, β, n, Δ) from Brent's point: quadratic convergence to the exact minimum
  for (let it = 0; it < 4 && !atBound && lin.fullRank && lin.coefficients[2] > 0; it++) {
    const step = solveLinearLeastSquares(columns(s, win.lo, win.hi, gap, lin.coefficients[2]), k, 4, lin.residuals, { sigma });
    const next = gap + (step.fullRank ? step.coefficients[3] : NaN);
    if (!(next > 0)) break;
    const trial = solveAt(next);
    if (!trial.fullRank || !(trial.chiSquare <= lin.chiSquare) || !(trial.coefficients[2] > 0)) break;
    const converged = Math.abs(next - gap) <= 1e-12 * gap;
    [gap, lin] = [next, trial];
    if (converged) break;
  }
  if (!lin.fullRank || !(lin.coefficients[2] > 0)) return failedCell(win.tMinK, win.tMaxK, k, N_FREE, "no positive Schottky amplitude at the best gap");
  const [gamma, beta, n] = lin.coefficients;
  let cov = lin.covariance;
  let nc = 3;
  if (!atBound) {
    const full = solveLinearLeastSquares(columns(s, win.lo, win.hi, gap, n), k, 4, y, { sigma });
    if (full.fullRank) [cov, nc] = [full.covariance, 4];
  }
  const se = (j: number) => (j < nc ? Math.sqrt(cov[j * nc + j]) : null);
  const fitted = new Float64Array(k);
  for (let i = 0; i < k; i++) fitted[i] = y[i] - lin.residuals[i];
  const note = atBound ? `gap at the search bound (Δ = ${Number(gap.toPrecision(3))} K): not determined by this window` : nc === 3 ? "σ with the gap held fixed (the 4-parameter Jacobian is rank deficient)" : null;
  return cellFrom(s, win.lo, win.hi, win.tMinK, win.tMaxK, { values: { gamma, beta, n, gap }, rawStdErrors: { gamma: se(0), beta: se(1), n: se(2), gap: se(3) }, fitted, nFree: N_FREE, note }, level);
}

/** Cells of the two-level Schottky candidate with free gap on `windows`. */
export function gapCandidateCells(s: SortedSeries, windows: readonly RecommendWindow[], level: number): CandidateCell[] {
  if (windows.length === 0) return [];
  const gaps = gapGrid(s.T[0], s.T[s.T.length - 1]);
  const G = gaps.length;
  const { chi } = gridProfile(s, windows, gaps);
  return windows.map((win, k) => {
    const limit = PEAK_LIMIT * s.T[win.lo];
    let gMax = 0;
    while (gMax + 1 < G && gaps[gMax + 1] <= limit) gMax++;
    let g = -1;
    for (let j = 0; j <= gMax; j++) if (Number.isFinite(chi[k * G + j]) && (g < 0 || chi[k * G + j] < chi[k * G + g])) g = j;
    if (g < 0) return failedCell(win.tMinK, win.tMaxK, win.hi - win.lo + 1, N_FREE, "no gap gives a positive Schottky amplitude: no Schottky term in this window");
    return refineWindow(s, win, gaps, g, gMax, level);
  });
}
