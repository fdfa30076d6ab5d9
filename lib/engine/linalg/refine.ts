/**
 * Row weighting and exact column scaling of a design, and one step of Björck's iterative
 * refinement of the augmented least-squares system with double-double residuals (lstsq.ts).
 * Reference: Björck, BIT 7 (1967) 257.
 */
import { applyQ, applyQt, solveR, solveRt, type QRFactor } from "./qr";
import { ddDot, ddSubtractScaledColumn } from "./dd";

/** One Björck refinement step; returns ‖Δz‖∞/‖z‖∞. */
export function refineStep(f: QRFactor, as: Float64Array, b: Float64Array, z: Float64Array, r: Float64Array, hi: Float64Array, lo: Float64Array): number {
  const { m, n } = f;
  for (let i = 0; i < m; i++) {
    const s = b[i] - r[i];
    const bb = s - b[i];
    hi[i] = s;
    lo[i] = b[i] - (s - bb) - (r[i] + bb);
  }
  for (let j = 0; j < n; j++) ddSubtractScaledColumn(hi, lo, as, j * m, m, z[j]);
  const d = new Float64Array(m);
  for (let i = 0; i < m; i++) d[i] = hi[i] + lo[i];
  const h = new Float64Array(m);
  for (let j = 0; j < n; j++) h[j] = -ddDot(as, j * m, r, m);
  solveRt(f, h);
  applyQt(f, d);
  let dzMax = 0;
  let zMax = 0;
  const dz = new Float64Array(n);
  for (let j = 0; j < n; j++) dz[j] = d[j] - h[j];
  solveR(f, dz);
  for (let j = 0; j < n; j++) {
    z[j] += dz[j];
    dzMax = Math.max(dzMax, Math.abs(dz[j]));
    zMax = Math.max(zMax, Math.abs(z[j]));
  }
  for (let i = n; i < m; i++) h[i] = d[i];
  applyQ(f, h);
  for (let i = 0; i < m; i++) r[i] += h[i];
  return zMax === 0 ? 0 : dzMax / zMax;
}

/** r ← r − W A S z for the weighted, column-scaled design (S a power of two: exact). */
export function subtractDesign(design: Float64Array, m: number, n: number, w: Float64Array | null, z: ArrayLike<number>, scale: Float64Array, r: Float64Array): void {
  for (let j = 0; j < n; j++) {
    const o = j * m;
    const xj = z[j] * scale[j];
    if (w) for (let i = 0; i < m; i++) r[i] -= design[o + i] * w[i] * xj;
    else for (let i = 0; i < m; i++) r[i] -= design[o + i] * xj;
  }
}

/**
 * The weighted design W·A (w = 1/σ; one pass per column) and the exact power-of-two column
 * scaling S that brings each column to unit norm, applied to the copy only when `apply`;
 * `extraColumns` zero columns are left after the design for right-hand sides.
 */
export function scaledDesign(design: Float64Array, m: number, n: number, w: Float64Array | null, apply: boolean, extraColumns = 0): { a: Float64Array; scale: Float64Array; finite: boolean } {
  const a = new Float64Array(m * (n + extraColumns));
  const sc = new Float64Array(n);
  let finite = true;
  for (let j = 0; j < n; j++) {
    const o = j * m;
    let s = 0;
    if (w) for (let i = 0; i < m; i++) s += (a[o + i] = design[o + i] * w[i]) ** 2;
    else for (let i = 0; i < m; i++) s += (a[o + i] = design[o + i]) ** 2;
    if (!Number.isFinite(s)) finite = false;
    sc[j] = s > 0 && Number.isFinite(s) ? 2 ** -Math.round(Math.log2(Math.sqrt(s))) : 1;
    if (apply && sc[j] !== 1) for (let i = 0; i < m; i++) a[o + i] *= sc[j];
  }
  return { a, scale: sc, finite };
}
