/**
 * Householder QR of a column-major m×n matrix (m ≥ n), in place.
 *
 * A = Q R with Q = H_0 H_1 … H_{n−1}, H_k = I − β_k v_k v_kᵀ. The vectors v_k are kept
 * below and on the diagonal of the factored array, R above it with its diagonal in
 * `rdiag`. No normal equations are ever formed. Reference: Golub & Van Loan, Matrix
 * Computations (4th ed.), §5.1–5.2; Björck, Numerical Methods for Least Squares Problems, §2.4.
 */
import { gramSums, sweepBlock } from "./reflect";

// applying Q lives in applyQ.ts; re-exported here for the callers that import it from this file
export { applyQ, applyQt, applyQtToColumn } from "./applyQ";

export interface QRFactor {
  /**
   * The factored array, column-major with m rows: v_k in rows k..m−1 of column k, R strictly
   * above the diagonal; columns n.. hold the extra columns (now Qᵀ times them) and whatever
   * further columns the caller keeps there.
   */
  readonly qr: Float64Array;
  readonly m: number;
  readonly n: number;
  /** Diagonal of R. */
  readonly rdiag: Float64Array;
  /** Householder coefficients β_k (0 when column k was already zero). */
  readonly beta: Float64Array;
}

function scaledNorm(a: Float64Array, from: number, to: number): number {
  let scale = 0;
  for (let i = from; i < to; i++) scale = Math.max(scale, Math.abs(a[i]));
  if (scale === 0) return 0;
  let sum = 0;
  for (let i = from; i < to; i++) {
    const t = a[i] / scale;
    sum += t * t;
  }
  return scale * Math.sqrt(sum);
}

/** Options of qrFactor. */
export interface QRFactorOptions {
  /**
   * Σ_{i≥1} a_{i0} a_ij for j = 0..n+extra−1, when the caller summed them while writing a:
   * saves the first reflector its own sweep. Overwritten.
   */
  readonly gram?: Float64Array;
  /**
   * Only the first n rows of the extra columns are needed (the leading part of Qᵀb): the last
   * reflector is then applied to row n−1 of them alone, and their rows ≥ n are left without it.
   */
  readonly extraHeadOnly?: boolean;
}

/**
 * Factor the first n columns of `a` (overwritten) as Q R, applying each reflector also to
 * `extra` further columns (so a right-hand side stored there becomes Qᵀb). Cost
 * 2mn² − 2n³/3 flops plus 4mn per extra column. One sweep over the rows per reflector and
 * block of four trailing columns (reflect.ts) updates the block and sums the products the
 * next reflector needs (its pivot column's norm and vᵀa_j), so there is no separate dot
 * pass; the norm falls back to a rescaled two-pass sum when the one-pass sum of squares
 * under- or overflows.
 */
export function qrFactor(a: Float64Array, m: number, n: number, extra = 0, options: QRFactorOptions = {}): QRFactor {
  const rdiag = new Float64Array(n);
  const beta = new Float64Array(n);
  const cols = n + extra;
  // g[j] = Σ_{i>k} a_ik a_ij for the current pivot k and j ≥ k (g[k]: its norm² below row k)
  const g = options.gram ?? new Float64Array(cols);
  const s = new Float64Array(cols);
  let ready = options.gram !== undefined;
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    if (!ready) gramSums(a, m, k, ck, k, cols, g);
    ready = false;
    const head = a[ck + k];
    const sq = head * head + g[k];
    const nrm = sq > 1e-290 && sq < 1e290 ? Math.sqrt(sq) : scaledNorm(a, ck + k, ck + m);
    if (nrm === 0) continue;
    const alpha = head > 0 ? -nrm : nrm;
    const v0 = head - alpha;
    a[ck + k] = v0;
    const b = 1 / (-alpha * v0);
    beta[k] = b;
    rdiag[k] = alpha;
    if (k + 1 >= cols) continue;
    for (let j = k + 1; j < cols; j++) {
      s[j] = b * (v0 * a[j * m + k] + g[j]);
      a[j * m + k] -= s[j] * v0;
    }
    if (k + 1 === n && options.extraHeadOnly) break;
    for (let j = k + 1; j < cols; j += 4) sweepBlock(a, m, k, ck, ck + m, j, Math.min(4, cols - j), s, g);
    ready = true;
  }
  return { qr: a, m, n, rdiag, beta };
}

/** Solve R x = b in place on the first n entries of b (back substitution). */
export function solveR(f: QRFactor, b: Float64Array): void {
  const { qr, m, n, rdiag } = f;
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    for (let j = i + 1; j < n; j++) s -= qr[j * m + i] * b[j];
    b[i] = s / rdiag[i];
  }
}

/** Solve Rᵀ x = b in place on the first n entries of b (forward substitution). */
export function solveRt(f: QRFactor, b: Float64Array): void {
  const { qr, m, n, rdiag } = f;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let j = 0; j < i; j++) s -= qr[i * m + j] * b[j];
    b[i] = s / rdiag[i];
  }
}

/** R⁻¹ as an n×n column-major upper-triangular array. */
export function invertR(f: QRFactor): Float64Array {
  const { qr, m, n, rdiag } = f;
  const inv = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    inv[j * n + j] = 1 / rdiag[j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += qr[k * m + i] * inv[j * n + k];
      inv[j * n + i] = -s / rdiag[i];
    }
  }
  return inv;
}

/** (RᵀR)⁻¹ = R⁻¹R⁻ᵀ from R⁻¹ (n×n column-major), returned row-major symmetric n×n. */
export function covarianceFromRinv(rinv: Float64Array, n: number): Float64Array {
  const c = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let s = 0;
      for (let k = j; k < n; k++) s += rinv[k * n + i] * rinv[k * n + j];
      c[i * n + j] = s;
      c[j * n + i] = s;
    }
  }
  return c;
}
