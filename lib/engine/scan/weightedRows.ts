/**
 * The weighted least-squares system of a whole data set, stored row by row for sequential
 * row updating (updating.ts): row i is w_i·A_i (w_i = 1/σ_i, or 1 without σ) with
 * right-hand side w_i·y_i. Each column j, and the right-hand side, is then multiplied by an
 * exact power of two S_j (S_b) that brings its largest |entry| into (½, 1], so that columns
 * such as T/σ and T⁷/σ sit in the same range and no square of an entry or of R's diagonal
 * can overflow. A power of two changes no digit (short of underflow to subnormals), which is
 * the idea of lstsq.ts, and the weighted entries w_i·A_ij are the same rounded numbers as
 * there. Solutions of the scaled problem map back exactly: x = S·z / S_b,
 * (AᵀWA)⁻¹ = S (RᵀR)⁻¹ S, χ² = rss / S_b².
 */
import { InputError } from "../errors";

export interface WeightedRows {
  readonly m: number;
  readonly n: number;
  /** m×n row-major: a[i·n + j] = w_i A_ij S_j. */
  readonly a: Float64Array;
  /** b[i] = w_i y_i S_b. */
  readonly b: Float64Array;
  readonly columnScale: Float64Array;
  readonly rhsScale: number;
}

/** 2^−e with 2^(e−1) < max ≤ 2^e (1 for 0), exponent kept in range so the power is exact. */
function powerOfTwoScale(max: number): number {
  if (!(max > 0)) return 1;
  return 2 ** -Math.max(-1022, Math.min(1022, Math.ceil(Math.log2(max))));
}

function checkShapes(design: Float64Array, m: number, n: number, y: ArrayLike<number>, sigma?: ArrayLike<number>): void {
  if (!Number.isInteger(m) || m < 0 || !Number.isInteger(n) || n < 0) throw new InputError(`invalid design shape: ${m}×${n}`, { field: "design" });
  if (design.length !== m * n) throw new InputError(`design has ${design.length} entries, expected ${m}×${n}`, { field: "design" });
  if (y.length !== m) throw new InputError(`y has ${y.length} values, design has ${m} rows`, { field: "y" });
  if (sigma && sigma.length !== m) throw new InputError(`sigma has ${sigma.length} values, expected ${m}`, { field: "sigma" });
}

/**
 * Weighted, power-of-two scaled rows of the column-major m×n `design` with data y and
 * optional standard uncertainties σ (weights 1/σ²). Inputs are not modified.
 * Failure modes: InputError on a shape mismatch, a non-finite y or design entry, σ ≤ 0 or
 * not finite, or a weighted entry that overflows.
 */
export function weightedRows(design: Float64Array, m: number, n: number, y: ArrayLike<number>, sigma?: ArrayLike<number>): WeightedRows {
  checkShapes(design, m, n, y, sigma);
  const a = new Float64Array(m * n);
  const b = new Float64Array(m);
  const colMax = new Float64Array(n);
  let bMax = 0;
  for (let i = 0; i < m; i++) {
    if (!Number.isFinite(y[i])) throw new InputError(`invalid y: ${y[i]} (not finite)`, { field: "y", line: i + 1 });
    if (sigma && !(sigma[i] > 0 && sigma[i] < Infinity)) throw new InputError(`invalid sigma: ${sigma[i]} (must be finite and > 0)`, { field: "sigma", line: i + 1 });
    const w = sigma ? 1 / sigma[i] : 1;
    for (let j = 0; j < n; j++) {
      const d = design[j * m + i];
      const v = sigma ? d * w : d;
      if (!Number.isFinite(v)) throw new InputError(`invalid design entry: ${d}${Number.isFinite(d) ? " (overflows when divided by sigma)" : " (not finite)"}`, { field: "design", line: i + 1, column: j + 1 });
      a[i * n + j] = v;
      colMax[j] = Math.max(colMax[j], Math.abs(v));
    }
    const v = sigma ? y[i] * w : y[i];
    if (!Number.isFinite(v)) throw new InputError(`invalid y: ${y[i]} (overflows when divided by sigma)`, { field: "y", line: i + 1 });
    b[i] = v;
    bMax = Math.max(bMax, Math.abs(v));
  }
  const columnScale = Float64Array.from(colMax, powerOfTwoScale);
  const rhsScale = powerOfTwoScale(bMax);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < n; j++) a[i * n + j] *= columnScale[j];
    b[i] *= rhsScale;
  }
  return { m, n, a, b, columnScale, rhsScale };
}
