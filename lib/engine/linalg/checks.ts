/**
 * Input validation for solveLinearLeastSquares, and what it reads off the factored weighted
 * design: that R and Qᵀb are finite, the power-of-two column scale S, the numerical rank and
 * the condition estimate of the column-scaled design.
 */
import { InputError } from "../errors";
import type { QRFactor } from "./qr";

const EPS = 2.220446049250313e-16;

/** Throws InputError naming the first bad shape or value (field, and line = row for values). */
export function checkInputs(design: Float64Array, m: number, n: number, y: ArrayLike<number>, sigma?: ArrayLike<number>): void {
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

/**
 * Whether R and the first n entries of Qᵀb (column n of the factored array) are all finite.
 * A NaN or infinity anywhere in [WA | Wb] reaches them: it makes the first reflector's norm
 * (its own column) or its product with that column non-finite, so R's first row or
 * diagonal is, and the non-finite column spreads from there.
 */
export function factorIsFinite(f: QRFactor): boolean {
  const { qr, m, n, rdiag } = f;
  for (let j = 0; j <= n; j++) {
    if (j < n && !Number.isFinite(rdiag[j])) return false;
    for (let i = 0; i < Math.min(j, n); i++) if (!Number.isFinite(qr[j * m + i])) return false;
  }
  return true;
}

/**
 * S_j = 2^−round(log2 ‖(WA)_j‖), the exact power of two that brings column j of the weighted
 * design to about unit norm; ‖(WA)_j‖ = ‖R e_j‖ (Q is orthogonal), read off R. 1 for a zero column.
 */
export function columnScale(f: QRFactor): Float64Array {
  const { qr, m, n, rdiag } = f;
  const scale = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let sq = rdiag[j] * rdiag[j];
    for (let i = 0; i < j; i++) sq += qr[j * m + i] * qr[j * m + i];
    scale[j] = sq > 0 && sq < Infinity ? 2 ** -Math.round(Math.log2(Math.sqrt(sq))) : 1;
  }
  return scale;
}

/** Numerical rank from the diagonal of R·S (S the column scaling). */
export function rankOf(f: QRFactor, scale: Float64Array): number {
  let max = 0;
  for (let k = 0; k < f.n; k++) max = Math.max(max, Math.abs(f.rdiag[k] * scale[k]));
  const tol = Math.max(f.m, f.n) * EPS * max;
  let rank = 0;
  for (let k = 0; k < f.n; k++) if (Math.abs(f.rdiag[k] * scale[k]) > tol) rank++;
  return rank;
}

/** ‖RS‖_F · ‖(RS)⁻¹‖_F from R and R⁻¹ (column-major n×n). */
export function conditionEstimate(f: QRFactor, rinv: Float64Array, scale: Float64Array): number {
  let r2 = 0;
  let i2 = 0;
  for (let j = 0; j < f.n; j++) {
    const d = f.rdiag[j] * scale[j];
    r2 += d * d;
    for (let i = 0; i < j; i++) {
      const t = f.qr[j * f.m + i] * scale[j];
      r2 += t * t;
    }
    for (let i = 0; i <= j; i++) {
      const t = rinv[j * f.n + i] / scale[i];
      i2 += t * t;
    }
  }
  return Math.sqrt(r2) * Math.sqrt(i2);
}
