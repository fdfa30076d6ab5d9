/**
 * One step of Björck's iterative refinement of the augmented least-squares system with
 * double-double residuals (lstsq.ts).
 * Reference: Björck, BIT 7 (1967) 257.
 */
import { applyQ, applyQt } from "./applyQ";
import { solveR, solveRt, type QRFactor } from "./qr";
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
