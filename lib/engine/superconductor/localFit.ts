/**
 * Small weighted polynomial least squares (degree ≤ 2) for local extrapolations in the
 * superconducting analysis: the branch just below T_c and C/T vs T² near T → 0. Centred and
 * scaled abscissa, normal equations solved by Gaussian elimination (3×3 at most, well
 * conditioned after centring). Standard errors from (XᵀWX)⁻¹, scaled by χ²_red when no σ given.
 */
import { invalid } from "../errors";

export interface PolyFit {
  /** Value at x. */
  at(x: number): number;
  /** Standard error of the fitted value at x (from the coefficient covariance). */
  stdErrorAt(x: number): number;
  /** Antiderivative difference ∫_a^b p(x) dx. */
  integral(a: number, b: number): number;
  readonly residualRms: number;
  readonly nPoints: number;
}

/**
 * Fit y ≈ Σ c_k u^k, u = (x − x̄)/s, k ≤ degree. Throws InputError if there are not more
 * points than coefficients or lengths differ.
 */
export function fitPolynomial(x: readonly number[], y: readonly number[], degree: 1 | 2, sigma?: readonly number[]): PolyFit {
  const m = degree + 1;
  if (x.length !== y.length || (sigma && sigma.length !== x.length)) throw invalid("local fit", `${x.length}/${y.length} points`, "lengths differ");
  if (x.length <= m) throw invalid("local fit", `${x.length} points`, `need more than ${m} for degree ${degree}`);
  const mean = x.reduce((a, b) => a + b, 0) / x.length;
  const scale = Math.max(...x.map((v) => Math.abs(v - mean))) || 1;
  const u = x.map((v) => (v - mean) / scale);
  const w = sigma ? sigma.map((s) => 1 / (s * s)) : x.map(() => 1);
  const A = Array.from({ length: m }, (_, i) => Array.from({ length: m }, (_, j) => u.reduce((acc, ui, k) => acc + w[k] * ui ** (i + j), 0)));
  const b = Array.from({ length: m }, (_, i) => u.reduce((acc, ui, k) => acc + w[k] * ui ** i * y[k], 0));
  const inv = invert(A);
  const c = inv.map((row) => row.reduce((acc, v, j) => acc + v * b[j], 0));
  const p = (uu: number) => c.reduce((acc, ck, k) => acc + ck * uu ** k, 0);
  const resid = u.map((ui, k) => y[k] - p(ui));
  const chi2 = resid.reduce((acc, r, k) => acc + w[k] * r * r, 0);
  const s2 = sigma ? 1 : chi2 / (x.length - m);
  const toU = (v: number) => (v - mean) / scale;
  const anti = (uu: number) => scale * c.reduce((acc, ck, k) => acc + (ck * uu ** (k + 1)) / (k + 1), 0);
  return {
    at: (v) => p(toU(v)),
    stdErrorAt: (v) => {
      const basis = c.map((_, k) => toU(v) ** k);
      return Math.sqrt(s2 * basis.reduce((acc, bi, i) => acc + bi * basis.reduce((a2, bj, j) => a2 + inv[i][j] * bj, 0), 0));
    },
    integral: (a, bb) => anti(toU(bb)) - anti(toU(a)),
    residualRms: Math.sqrt(resid.reduce((acc, r) => acc + r * r, 0) / x.length),
    nPoints: x.length,
  };
}

function invert(a: number[][]): number[][] {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...row.map((_, j) => (i === j ? 1 : 0))]);
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
    if (Math.abs(m[piv][col]) < 1e-300) throw invalid("local fit", "singular", "points do not determine the polynomial");
    [m[col], m[piv]] = [m[piv], m[col]];
    const d = m[col][col];
    for (let j = 0; j < 2 * n; j++) m[col][j] /= d;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = m[r][col];
      for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[col][j];
    }
  }
  return m.map((row) => row.slice(n));
}
