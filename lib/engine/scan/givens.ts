/**
 * Small upper-triangular kernels for sequential QR row updating (updating.ts).
 * R is n×n, stored row-major in full (entries below the diagonal stay 0).
 *
 * Appending a row xᵀ (with right-hand side β) to [R | Qᵀb]: for j = 0 … n−1 a Givens
 * rotation of rows j and x zeroes x_j against R_jj; the last β left over is the component of
 * the new right-hand side that no column can reach, and the residual sum of squares of the
 * enlarged problem grows by exactly β² (in exact arithmetic).
 * References: Golub & Van Loan, Matrix Computations (4th ed.), §6.5.3 "Appending or
 * Deleting a Row" (read); §5.1.8 for Givens rotations and the ratio form that avoids
 * overflow (from memory). That the rotated-out β² is the growth of the residual sum of
 * squares follows from ‖b − Ax‖² = ‖Qᵀb − [R; 0]x‖² (orthogonal invariance): the new
 * component lies below R and no x can reach it (derived here, and checked in the tests).
 */

/** Bounds on R_jj² + x_j² inside which the plain formula keeps full precision. */
const TINY = 2 ** -960;
const HUGE = 2 ** 960;
/** c, s, h of the last rotation (module scratch: no allocation per row). */
const CSH = new Float64Array(3);

/**
 * The rotation taking (p, q), q ≠ 0, to (h, 0): c = p/h, s = q/h, h = √(p² + q²) ≥ 0, left
 * in CSH. When the squares would leave the exponent range (never for the power-of-two
 * scaled rows of weightedRows.ts in practice) h comes from a ratio instead.
 */
function rotation(p: number, q: number): void {
  const h2 = p * p + q * q;
  if (h2 > TINY && h2 < HUGE) {
    const h = Math.sqrt(h2);
    const inv = 1 / h;
    CSH[0] = p * inv;
    CSH[1] = q * inv;
    CSH[2] = h;
  } else if (Math.abs(q) > Math.abs(p)) {
    const t = p / q;
    const u = Math.sqrt(1 + t * t);
    const s = (q < 0 ? -1 : 1) / u;
    CSH[0] = t * s;
    CSH[1] = s;
    CSH[2] = Math.abs(q) * u;
  } else {
    const t = q / p;
    const u = Math.sqrt(1 + t * t);
    const c = (p < 0 ? -1 : 1) / u;
    CSH[0] = c;
    CSH[1] = t * c;
    CSH[2] = Math.abs(p) * u;
  }
}

/**
 * Rotate row x (n entries from `a[off]`) with right-hand side `beta` into R and qtb (`work`:
 * n scratch entries); returns the rotated-out component.
 */
export function appendRow(r: Float64Array, qtb: Float64Array, n: number, a: Float64Array, off: number, beta: number, work: Float64Array): number {
  if (n === 2) return appendRow2(r, qtb, a, off, beta);
  for (let j = 0; j < n; j++) work[j] = a[off + j];
  let b = beta;
  for (let j = 0; j < n; j++) {
    const xj = work[j];
    if (xj === 0) continue;
    const d = j * n + j;
    const p = r[d];
    const h2 = p * p + xj * xj;
    let c: number, s: number;
    if (h2 > TINY && h2 < HUGE) {
      const h = Math.sqrt(h2);
      const inv = 1 / h;
      c = p * inv;
      s = xj * inv;
      r[d] = h;
    } else {
      rotation(p, xj);
      c = CSH[0];
      s = CSH[1];
      r[d] = CSH[2];
    }
    for (let k = j + 1; k < n; k++) {
      const rk = r[d + k - j];
      const xk = work[k];
      r[d + k - j] = c * rk + s * xk;
      work[k] = c * xk - s * rk;
    }
    const q = qtb[j];
    qtb[j] = c * q + s * b;
    b = c * b - s * q;
  }
  return b;
}

/**
 * appendRow for n = 2 (the default model), unrolled, with the in-range branch of rotation()
 * written out: the same operations in the same order, about 3× faster.
 */
function appendRow2(r: Float64Array, qtb: Float64Array, a: Float64Array, off: number, beta: number): number {
  const x0 = a[off];
  let x1 = a[off + 1];
  let b = beta;
  if (x0 !== 0) {
    const p = r[0];
    const h2 = p * p + x0 * x0;
    let c: number, s: number;
    if (h2 > TINY && h2 < HUGE) {
      const h = Math.sqrt(h2);
      const inv = 1 / h;
      c = p * inv;
      s = x0 * inv;
      r[0] = h;
    } else {
      rotation(p, x0);
      c = CSH[0];
      s = CSH[1];
      r[0] = CSH[2];
    }
    const r01 = r[1];
    r[1] = c * r01 + s * x1;
    x1 = c * x1 - s * r01;
    const q0 = qtb[0];
    qtb[0] = c * q0 + s * b;
    b = c * b - s * q0;
  }
  if (x1 !== 0) {
    const p = r[3];
    const h2 = p * p + x1 * x1;
    let c: number, s: number;
    if (h2 > TINY && h2 < HUGE) {
      const h = Math.sqrt(h2);
      const inv = 1 / h;
      c = p * inv;
      s = x1 * inv;
      r[3] = h;
    } else {
      rotation(p, x1);
      c = CSH[0];
      s = CSH[1];
      r[3] = CSH[2];
    }
    const q1 = qtb[1];
    qtb[1] = c * q1 + s * b;
    b = c * b - s * q1;
  }
  return b;
}

/** z ← R⁻¹ z (back substitution); R must have a nonzero diagonal. */
export function solveUpper(r: Float64Array, n: number, z: Float64Array): void {
  for (let i = n - 1; i >= 0; i--) {
    let s = z[i];
    for (let k = i + 1; k < n; k++) s -= r[i * n + k] * z[k];
    z[i] = s / r[i * n + i];
  }
}

/** z ← R⁻ᵀ z (forward substitution with Rᵀ). */
export function solveUpperTransposed(r: Float64Array, n: number, z: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = z[i];
    for (let k = 0; k < i; k++) s -= r[k * n + i] * z[k];
    z[i] = s / r[i * n + i];
  }
}

/** R⁻¹ (upper triangular, row-major n×n), column by column. */
export function invertUpper(r: Float64Array, n: number): Float64Array {
  const inv = new Float64Array(n * n);
  const e = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    solveUpper(r, n, e);
    for (let i = 0; i <= j; i++) inv[i * n + j] = e[i];
  }
  return inv;
}

/** R⁻¹R⁻ᵀ = (RᵀR)⁻¹ from R⁻¹ (row-major n×n, symmetric result). */
export function covarianceFromInverse(inv: Float64Array, n: number): Float64Array {
  const cov = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let s = 0;
      for (let l = j; l < n; l++) s += inv[i * n + l] * inv[j * n + l];
      cov[i * n + j] = s;
      cov[j * n + i] = s;
    }
  }
  return cov;
}
