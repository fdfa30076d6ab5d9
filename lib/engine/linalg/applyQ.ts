/**
 * Q and Qᵀ of a Householder QR factorisation (qr.ts) applied to a vector, one reflector
 * H_k = I − β_k v_k v_kᵀ after another. Reference: Golub & Van Loan, Matrix Computations
 * (4th ed.), §5.1.6.
 */
import type { QRFactor } from "./qr";

/**
 * b ← Qᵀ b (b has length m): n + 1 sweeps over the rows, each applying H_k and summing
 * v_{k+1}ᵀb for the next reflector on the way. With `headOnly` only b[0..n) is wanted:
 * the last reflector then touches b[n−1] alone and the rest of b is left partly transformed.
 */
export function applyQt(f: QRFactor, b: Float64Array, headOnly = false): void {
  const { qr, m, n, beta } = f;
  if (n === 0) return;
  let t = dotFrom(qr, 0, b, m);
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    // β_k = 0 (a zero column, left as it was): H_k = I, but the sum for k + 1 is still needed
    const sk = beta[k] * t;
    b[k] -= sk * qr[ck + k];
    if (k + 1 === n) {
      if (!headOnly) reflectAndDot(qr, ck, ck, b, k + 1, m, sk);
      return;
    }
    t = reflectAndDot(qr, ck, ck + m, b, k + 1, m, sk);
  }
}

/**
 * applyQt(f, b, true) for b stored as column `col` of f.qr, a column the factorisation did
 * not touch (col ≥ n + extra), given t0 = v_0ᵀb: one array in every sweep, and no sweep for t0.
 */
export function applyQtToColumn(f: QRFactor, col: number, t0: number): void {
  const { qr, m, n, beta } = f;
  const bo = col * m;
  let t = t0;
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    const sk = beta[k] * t;
    qr[bo + k] -= sk * qr[ck + k];
    if (k + 1 === n) return;
    t = reflectAndDotInColumn(qr, ck, ck + m, bo, k + 1, m, sk);
  }
}

/** Σ q[o + i]·b_i for i < m. */
function dotFrom(q: Float64Array, o: number, b: Float64Array, m: number): number {
  let t = 0;
  for (let i = 0; i < m; i++) t += q[o + i] * b[i];
  return t;
}

/** b_i ← b_i − s·q[vOff + i] for i = from..m−1, returning Σ q[nOff + i]·b_i (updated). */
function reflectAndDot(q: Float64Array, vOff: number, nOff: number, b: Float64Array, from: number, m: number, s: number): number {
  let t0 = 0, t1 = 0;
  let i = from;
  for (; i + 1 < m; i += 2) {
    const u0 = b[i] - s * q[vOff + i], u1 = b[i + 1] - s * q[vOff + i + 1];
    b[i] = u0; b[i + 1] = u1;
    t0 += q[nOff + i] * u0; t1 += q[nOff + i + 1] * u1;
  }
  if (i < m) {
    const u0 = b[i] - s * q[vOff + i];
    b[i] = u0;
    t0 += q[nOff + i] * u0;
  }
  return t0 + t1;
}

/** reflectAndDot with b at offset bOff of q itself. */
function reflectAndDotInColumn(q: Float64Array, vOff: number, nOff: number, bOff: number, from: number, m: number, s: number): number {
  let t0 = 0, t1 = 0;
  let i = from;
  for (; i + 1 < m; i += 2) {
    const u0 = q[bOff + i] - s * q[vOff + i], u1 = q[bOff + i + 1] - s * q[vOff + i + 1];
    q[bOff + i] = u0; q[bOff + i + 1] = u1;
    t0 += q[nOff + i] * u0; t1 += q[nOff + i + 1] * u1;
  }
  if (i < m) {
    const u0 = q[bOff + i] - s * q[vOff + i];
    q[bOff + i] = u0;
    t0 += q[nOff + i] * u0;
  }
  return t0 + t1;
}

/** b ← Q b (b has length m). */
export function applyQ(f: QRFactor, b: Float64Array): void {
  const { qr, m, n, beta } = f;
  for (let k = n - 1; k >= 0; k--) {
    if (beta[k] === 0) continue;
    const ck = k * m;
    let s = 0;
    for (let i = k; i < m; i++) s += qr[ck + i] * b[i];
    s *= beta[k];
    for (let i = k; i < m; i++) b[i] -= s * qr[ck + i];
  }
}
