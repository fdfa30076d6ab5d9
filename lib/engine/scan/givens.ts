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

/**
 * Rotate row `x` (n entries from `a[off]`, copied into `work`) and right-hand side `beta`
 * into R and qtb; returns the rotated-out component. c = R_jj/h, s = x_j/h with the new
 * R_jj = h = √(R_jj² + x_j²) ≥ 0; when the squares would leave the exponent range (never for
 * the power-of-two scaled rows of weightedRows.ts in practice) h comes from a ratio instead.
 */
export function appendRow(r: Float64Array, qtb: Float64Array, n: number, a: Float64Array, off: number, beta: number, work: Float64Array): number {
  for (let j = 0; j < n; j++) work[j] = a[off + j];
  let b = beta;
  for (let j = 0; j < n; j++) {
    const xj = work[j];
    if (xj === 0) continue;
    const d = j * n + j;
    const rjj = r[d];
    let c: number;
    let s: number;
    const h2 = rjj * rjj + xj * xj;
    if (h2 > TINY && h2 < HUGE) {
      const h = Math.sqrt(h2);
      const inv = 1 / h;
      c = rjj * inv;
      s = xj * inv;
      r[d] = h;
    } else if (Math.abs(xj) > Math.abs(rjj)) {
      // the squares left the exponent range: take the rotation from a ratio instead
      const t = rjj / xj;
      const u = Math.sqrt(1 + t * t);
      s = (xj < 0 ? -1 : 1) / u;
      c = t * s;
      r[d] = Math.abs(xj) * u;
    } else {
      const t = xj / rjj;
      const u = Math.sqrt(1 + t * t);
      c = (rjj < 0 ? -1 : 1) / u;
      s = t * c;
      r[d] = Math.abs(rjj) * u;
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
