/**
 * The row-weighted system of a least-squares problem and its weighted residuals, each in one
 * sweep over the rows (lstsq.ts). w_i = 1/σ_i (or 1); A is the unweighted column-major m×n
 * design.
 */

/**
 * Write W·A into `a` (m×n column-major) and W·y after it as column n, and into `gram` the
 * sums Σ_{i≥1} (WA)_{i0}·(WA)_{ij} for j = 0..n (W·y as column n): the norm and products
 * qrFactor's first reflector needs. Non-finite entries pass through (the caller checks R).
 */
export function weightedSystem(design: Float64Array, m: number, n: number, w: Float64Array, y: ArrayLike<number>, a: Float64Array, gram: Float64Array): void {
  for (let j = 0; j < n; j++) gram[j] = weightColumn(design, j * m, a, m, w);
  if (m === 0) return;
  // W·y: the same loop, reading y
  const o = n * m;
  a[o] = y[0] * w[0];
  let d = 0;
  for (let i = 1; i < m; i++) {
    const t = y[i] * w[i];
    a[o + i] = t;
    d += a[i] * t;
  }
  gram[n] = d;
}

/**
 * a[o + i] = design[o + i]·w_i, returning Σ_{i≥1} a_{i0}·a[o + i] with column 0 of a
 * already written (for o = 0 the column's own sum of squares below row 0).
 */
function weightColumn(design: Float64Array, o: number, a: Float64Array, m: number, w: Float64Array): number {
  if (m === 0) return 0;
  a[o] = design[o] * w[0];
  // one running sum in row order, as a plain dot product (the multiplies hide its latency)
  let d = 0;
  for (let i = 1; i < m; i++) {
    const t = design[o + i] * w[i];
    a[o + i] = t;
    d += a[i] * t;
  }
  return d;
}

/**
 * u_i = y_i − Σ_j A_ij z_j for every row and, when `r` is given, r_i = w_i·u_i; returns
 * Σ (w_i u_i)². Columns four at a time: one sweep over the rows when n ≤ 4. Needs n ≥ 1.
 */
export function weightedResidual(design: Float64Array, m: number, n: number, w: Float64Array, y: ArrayLike<number>, z: ArrayLike<number>, u: Float64Array, r: Float64Array | null): number {
  let src: ArrayLike<number> = y;
  let chi = 0;
  for (let j = 0; j < n; j += 4) {
    // a block narrower than four repeats its last column with coefficient 0 (exact: t − 0 = t)
    const k = Math.min(4, n - j);
    const o = (c: number) => (j + Math.min(c, k - 1)) * m;
    const zc = (c: number) => (c < k ? z[j + c] : 0);
    if (j + 4 < n) subtractBlock(design, src, u, m, o(0), o(1), o(2), o(3), zc(0), zc(1), zc(2), zc(3));
    else chi = subtractLastBlock(design, src, u, m, o(0), o(1), o(2), o(3), zc(0), zc(1), zc(2), zc(3), w, r);
    src = u;
  }
  return chi;
}

/** u_i = src_i − A_{i,o0} z0 − A_{i,o1} z1 − A_{i,o2} z2 − A_{i,o3} z3 (offsets of columns in A). */
function subtractBlock(a: Float64Array, src: ArrayLike<number>, u: Float64Array, m: number, o0: number, o1: number, o2: number, o3: number, z0: number, z1: number, z2: number, z3: number): void {
  for (let i = 0; i < m; i++) u[i] = src[i] - a[o0 + i] * z0 - a[o1 + i] * z1 - a[o2 + i] * z2 - a[o3 + i] * z3;
}

/** subtractBlock, then r_i = w_i u_i (when r is given) and the returned Σ r_i², in the same sweep. */
function subtractLastBlock(a: Float64Array, src: ArrayLike<number>, u: Float64Array, m: number, o0: number, o1: number, o2: number, o3: number, z0: number, z1: number, z2: number, z3: number, w: Float64Array, r: Float64Array | null): number {
  let chi = 0;
  if (r) {
    for (let i = 0; i < m; i++) {
      const t = (u[i] = src[i] - a[o0 + i] * z0 - a[o1 + i] * z1 - a[o2 + i] * z2 - a[o3 + i] * z3);
      const ri = (r[i] = t * w[i]);
      chi += ri * ri;
    }
  } else {
    for (let i = 0; i < m; i++) {
      const t = (u[i] = src[i] - a[o0 + i] * z0 - a[o1 + i] * z1 - a[o2 + i] * z2 - a[o3 + i] * z3);
      const ri = t * w[i];
      chi += ri * ri;
    }
  }
  return chi;
}
