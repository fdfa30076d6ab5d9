/**
 * The row-weighted system of a least-squares problem and its weighted residuals, each in one
 * sweep over the rows (lstsq.ts). w_i = 1/σ_i (or 1); A is the unweighted column-major m×n
 * design.
 */

/**
 * Write W·A into `a` (m×n column-major) and W·y after it as column n, and into `gram` the
 * sums Σ_{i≥1} (WA)_{i0}·(WA)_{ij} for j = 0..n (W·y as column n): the norm and products
 * qrFactor's first reflector needs, each summed in row order. Non-finite entries pass
 * through (the caller checks R). The copy is weighted in place, up to four columns per
 * sweep over the rows: an engine checks each typed array once per row, not once per entry.
 */
export function weightedSystem(design: Float64Array, m: number, n: number, w: Float64Array, y: ArrayLike<number>, a: Float64Array, gram: Float64Array): void {
  a.set(design);
  a.set(y, n * m);
  if (m === 0) {
    gram.fill(0);
    return;
  }
  let j = 0;
  for (; j + 3 <= n; j += 4) weigh4(a, m, j, w, gram);
  for (; j + 1 <= n; j += 2) weigh2(a, m, j, w, gram);
  if (j === n) weigh1(a, m, j, w, gram);
}

/** Columns j..j+3 of a scaled row by row by w; gram[j + c] = Σ_{i≥1} a_{i0}·a_{i,j+c}. */
function weigh4(a: Float64Array, m: number, j: number, w: Float64Array, g: Float64Array): void {
  const o0 = j * m, o1 = o0 + m, o2 = o1 + m, o3 = o2 + m;
  a[o0] *= w[0]; a[o1] *= w[0]; a[o2] *= w[0]; a[o3] *= w[0];
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0;
  for (let i = 1; i < m; i++) {
    const wi = w[i];
    const t0 = (a[o0 + i] *= wi), t1 = (a[o1 + i] *= wi), t2 = (a[o2 + i] *= wi), t3 = (a[o3 + i] *= wi);
    // column 0 is weighted first (in this block when j = 0)
    const p = a[i];
    g0 += p * t0; g1 += p * t1; g2 += p * t2; g3 += p * t3;
  }
  g[j] = g0; g[j + 1] = g1; g[j + 2] = g2; g[j + 3] = g3;
}

/** weigh4 for two columns. */
function weigh2(a: Float64Array, m: number, j: number, w: Float64Array, g: Float64Array): void {
  const o0 = j * m, o1 = o0 + m;
  a[o0] *= w[0]; a[o1] *= w[0];
  let g0 = 0, g1 = 0;
  for (let i = 1; i < m; i++) {
    const wi = w[i];
    const t0 = (a[o0 + i] *= wi), t1 = (a[o1 + i] *= wi);
    const p = a[i];
    g0 += p * t0; g1 += p * t1;
  }
  g[j] = g0; g[j + 1] = g1;
}

/** weigh4 for one column. */
function weigh1(a: Float64Array, m: number, j: number, w: Float64Array, g: Float64Array): void {
  const o0 = j * m;
  a[o0] *= w[0];
  let g0 = 0;
  for (let i = 1; i < m; i++) {
    const t0 = (a[o0 + i] *= w[i]);
    g0 += a[i] * t0;
  }
  g[j] = g0;
}

/**
 * r_i = w_i (y_i − Σ_j A_ij z_j) for every row, the residual of z for the weighted problem,
 * written to column `col` of `a`; returns Σ a_{i0} r_i (with a factored: v_0ᵀr, so that
 * applyQtToColumn needs no sweep of its own). Columns four at a time: one sweep over the
 * rows when n ≤ 4.
 */
export function correctionResidual(design: Float64Array, m: number, n: number, w: Float64Array, y: ArrayLike<number>, z: ArrayLike<number>, a: Float64Array, col: number): number {
  const ro = col * m;
  const r = a.subarray(ro, ro + m);
  const j = leadingBlocks(design, m, n, y, z, r);
  const b = block(m, n, j, z);
  return residualDotLast(design, j === 0 ? y : r, a, ro, m, b.o0, b.o1, b.o2, b.o3, b.z0, b.z1, b.z2, b.z3, w);
}

/**
 * u_i = y_i − Σ_j A_ij z_j for every row (the unweighted residuals), returning
 * χ² = Σ (w_i u_i)². Columns four at a time: one sweep over the rows when n ≤ 4.
 */
export function weightedResidual(design: Float64Array, m: number, n: number, w: Float64Array, y: ArrayLike<number>, z: ArrayLike<number>, u: Float64Array): number {
  const j = leadingBlocks(design, m, n, y, z, u);
  const b = block(m, n, j, z);
  return residualChiLast(design, j === 0 ? y : u, u, m, b.o0, b.o1, b.o2, b.o3, b.z0, b.z1, b.z2, b.z3, w);
}

/** u ← y − A z over all blocks of four columns but the last (n ≥ 1); returns the last block's first column. */
function leadingBlocks(design: Float64Array, m: number, n: number, y: ArrayLike<number>, z: ArrayLike<number>, u: Float64Array): number {
  let j = 0;
  for (; j + 4 < n; j += 4) {
    const b = block(m, n, j, z);
    subtractBlock(design, j === 0 ? y : u, u, m, b.o0, b.o1, b.o2, b.o3, b.z0, b.z1, b.z2, b.z3);
  }
  return j;
}

/** Column offsets and coefficients of the block at column j; a narrower block repeats its last column with coefficient 0 (exact: t − 0 = t). */
function block(m: number, n: number, j: number, z: ArrayLike<number>) {
  const k = Math.min(4, n - j);
  const o = (c: number) => (j + Math.min(c, k - 1)) * m;
  const zc = (c: number) => (c < k ? z[j + c] : 0);
  return { o0: o(0), o1: o(1), o2: o(2), o3: o(3), z0: zc(0), z1: zc(1), z2: zc(2), z3: zc(3) };
}

/** u_i = src_i − A_{i,o0} z0 − A_{i,o1} z1 − A_{i,o2} z2 − A_{i,o3} z3 (offsets of columns in A). */
function subtractBlock(a: Float64Array, src: ArrayLike<number>, u: Float64Array, m: number, o0: number, o1: number, o2: number, o3: number, z0: number, z1: number, z2: number, z3: number): void {
  for (let i = 0; i < m; i++) u[i] = src[i] - a[o0 + i] * z0 - a[o1 + i] * z1 - a[o2 + i] * z2 - a[o3 + i] * z3;
}

/** The last block as r_i = w_i(src_i − …) into a[ro + i], returning Σ a_i r_i. */
function residualDotLast(d: Float64Array, src: ArrayLike<number>, a: Float64Array, ro: number, m: number, o0: number, o1: number, o2: number, o3: number, z0: number, z1: number, z2: number, z3: number, w: Float64Array): number {
  let t = 0;
  for (let i = 0; i < m; i++) {
    const ri = (src[i] - d[o0 + i] * z0 - d[o1 + i] * z1 - d[o2 + i] * z2 - d[o3 + i] * z3) * w[i];
    a[ro + i] = ri;
    t += a[i] * ri;
  }
  return t;
}

/** The last block as u_i = src_i − …, returning Σ (w_i u_i)². */
function residualChiLast(a: Float64Array, src: ArrayLike<number>, u: Float64Array, m: number, o0: number, o1: number, o2: number, o3: number, z0: number, z1: number, z2: number, z3: number, w: Float64Array): number {
  let chi = 0;
  for (let i = 0; i < m; i++) {
    const ui = src[i] - a[o0 + i] * z0 - a[o1 + i] * z1 - a[o2 + i] * z2 - a[o3 + i] * z3;
    u[i] = ui;
    const ri = ui * w[i];
    chi += ri * ri;
  }
  return chi;
}
