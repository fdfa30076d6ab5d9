/**
 * Householder QR of a column-major m×n matrix (m ≥ n), in place.
 *
 * A = Q R with Q = H_0 H_1 … H_{n−1}, H_k = I − β_k v_k v_kᵀ. The vectors v_k are kept
 * below and on the diagonal of the factored array, R above it with its diagonal in
 * `rdiag`. No normal equations are ever formed. Reference: Golub & Van Loan, Matrix
 * Computations (4th ed.), §5.1–5.2; Björck, Numerical Methods for Least Squares Problems, §2.4.
 */

export interface QRFactor {
  /** m×n column-major: v_k in rows k..m−1 of column k, R strictly above the diagonal. */
  readonly qr: Float64Array;
  readonly m: number;
  readonly n: number;
  /** Diagonal of R. */
  readonly rdiag: Float64Array;
  /** Householder coefficients β_k (0 when column k was already zero). */
  readonly beta: Float64Array;
}

function columnNorm(a: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += a[i] * a[i];
  // one pass unless the sum of squares under- or overflowed; then rescale (two passes)
  if (sum > 1e-290 && sum < 1e290) return Math.sqrt(sum);
  return scaledNorm(a, from, to);
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

/**
 * Factor the first n columns of `a` (overwritten) as Q R, applying each reflector also to
 * `extra` further columns (so a right-hand side stored there becomes Qᵀb). Cost
 * 2mn² − 2n³/3 flops plus 4mn per extra column. Trailing columns are updated two at a time
 * (one sweep over the reflector per pair), and the norm of the next column is carried from
 * its update; the arithmetic is the same as column by column.
 */
export function qrFactor(a: Float64Array, m: number, n: number, extra = 0): QRFactor {
  const rdiag = new Float64Array(n);
  const beta = new Float64Array(n);
  const cols = n + extra;
  let nextSq = -1;
  for (let k = 0; k < n; k++) {
    const ck = k * m;
    const nrm = nextSq > 1e-290 && nextSq < 1e290 ? Math.sqrt(nextSq) : columnNorm(a, ck + k, ck + m);
    nextSq = -1;
    if (nrm === 0) continue;
    const alpha = a[ck + k] > 0 ? -nrm : nrm;
    const v0 = a[ck + k] - alpha;
    a[ck + k] = v0;
    const b = 1 / (-alpha * v0);
    beta[k] = b;
    rdiag[k] = alpha;
    let j = k + 1;
    for (; j + 1 < cols; j += 2) {
      const sq = reflectPair(a, ck, j * m, (j + 1) * m, k, m, b);
      if (j === k + 1) nextSq = sq;
    }
    if (j < cols) {
      const sq = reflectPair(a, ck, j * m, -1, k, m, b);
      if (j === k + 1) nextSq = sq;
    }
  }
  return { qr: a, m, n, rdiag, beta };
}

/** Apply H = I − β v vᵀ (v in column at ck from row k) to columns c1 and c2 (c2 < 0: none); returns ‖c1(k+1:m)‖². */
function reflectPair(a: Float64Array, ck: number, c1: number, c2: number, k: number, m: number, b: number): number {
  let s1 = 0;
  let s2 = 0;
  if (c2 >= 0) {
    for (let i = k; i < m; i++) {
      const v = a[ck + i];
      s1 += v * a[c1 + i];
      s2 += v * a[c2 + i];
    }
  } else for (let i = k; i < m; i++) s1 += a[ck + i] * a[c1 + i];
  s1 *= b;
  s2 *= b;
  a[c1 + k] -= s1 * a[ck + k];
  if (c2 >= 0) a[c2 + k] -= s2 * a[ck + k];
  let sq = 0;
  if (c2 >= 0) {
    for (let i = k + 1; i < m; i++) {
      const v = a[ck + i];
      const u = a[c1 + i] - s1 * v;
      a[c1 + i] = u;
      sq += u * u;
      a[c2 + i] -= s2 * v;
    }
  } else {
    for (let i = k + 1; i < m; i++) {
      const u = a[c1 + i] - s1 * a[ck + i];
      a[c1 + i] = u;
      sq += u * u;
    }
  }
  return sq;
}

/** b ← Qᵀ b (b has length m). */
export function applyQt(f: QRFactor, b: Float64Array): void {
  const { qr, m, n, beta } = f;
  for (let k = 0; k < n; k++) {
    if (beta[k] === 0) continue;
    const ck = k * m;
    let s = 0;
    for (let i = k; i < m; i++) s += qr[ck + i] * b[i];
    s *= beta[k];
    for (let i = k; i < m; i++) b[i] -= s * qr[ck + i];
  }
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
