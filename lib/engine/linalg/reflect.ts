/**
 * Multi-column Householder kernels for qrFactor (qr.ts). One sweep over the rows applies a
 * reflector H_k = I − β v vᵀ to a block of up to four trailing columns and, in the same
 * sweep, accumulates the tail sums g_j = Σ_{i>k+1} a_{i,k+1} a_ij of the updated columns
 * against the next pivot column k+1: from those the next reflector gets its norm and its
 * products vᵀa_j without another pass. Each update a_ij − s_j v_i is the same operation as
 * column by column; only the order in which a dot product is summed differs.
 * Reference: Golub & Van Loan, Matrix Computations (4th ed.), §5.1.4 and §5.2.2.
 */

/**
 * Columns j..j+w−1 (w = 1..4) of the column-major a (m rows) for rows i > k:
 * a_ij ← a_ij − s_j v_i with v in a[vOff + i]; then g_j = Σ_{i≥k+2} a[pOff + i]·a_ij
 * (pOff the next pivot column, already updated or in this block).
 */
export function sweepBlock(a: Float64Array, m: number, k: number, vOff: number, pOff: number, j: number, w: number, s: Float64Array, g: Float64Array): void {
  if (w === 4) sweep4(a, m, k, vOff, pOff, j, s, g);
  else if (w === 3) sweep3(a, m, k, vOff, pOff, j, s, g);
  else if (w === 2) sweep2(a, m, k, vOff, pOff, j, s, g);
  else sweep1(a, m, k, vOff, pOff, j, s, g);
}

function sweep4(a: Float64Array, m: number, k: number, vOff: number, pOff: number, j: number, s: Float64Array, g: Float64Array): void {
  const o0 = j * m, o1 = o0 + m, o2 = o1 + m, o3 = o2 + m;
  const s0 = s[j], s1 = s[j + 1], s2 = s[j + 2], s3 = s[j + 3];
  let i = k + 1;
  if (i < m) {
    const v = a[vOff + i];
    a[o0 + i] -= s0 * v; a[o1 + i] -= s1 * v; a[o2 + i] -= s2 * v; a[o3 + i] -= s3 * v;
    i++;
  }
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0;
  for (; i < m; i++) {
    const v = a[vOff + i];
    const u0 = a[o0 + i] - s0 * v, u1 = a[o1 + i] - s1 * v, u2 = a[o2 + i] - s2 * v, u3 = a[o3 + i] - s3 * v;
    a[o0 + i] = u0; a[o1 + i] = u1; a[o2 + i] = u2; a[o3 + i] = u3;
    const p = a[pOff + i];
    g0 += p * u0; g1 += p * u1; g2 += p * u2; g3 += p * u3;
  }
  g[j] = g0; g[j + 1] = g1; g[j + 2] = g2; g[j + 3] = g3;
}

function sweep3(a: Float64Array, m: number, k: number, vOff: number, pOff: number, j: number, s: Float64Array, g: Float64Array): void {
  const o0 = j * m, o1 = o0 + m, o2 = o1 + m;
  const s0 = s[j], s1 = s[j + 1], s2 = s[j + 2];
  let i = k + 1;
  if (i < m) {
    const v = a[vOff + i];
    a[o0 + i] -= s0 * v; a[o1 + i] -= s1 * v; a[o2 + i] -= s2 * v;
    i++;
  }
  let g0 = 0, g1 = 0, g2 = 0;
  for (; i < m; i++) {
    const v = a[vOff + i];
    const u0 = a[o0 + i] - s0 * v, u1 = a[o1 + i] - s1 * v, u2 = a[o2 + i] - s2 * v;
    a[o0 + i] = u0; a[o1 + i] = u1; a[o2 + i] = u2;
    const p = a[pOff + i];
    g0 += p * u0; g1 += p * u1; g2 += p * u2;
  }
  g[j] = g0; g[j + 1] = g1; g[j + 2] = g2;
}

function sweep2(a: Float64Array, m: number, k: number, vOff: number, pOff: number, j: number, s: Float64Array, g: Float64Array): void {
  const o0 = j * m, o1 = o0 + m;
  const s0 = s[j], s1 = s[j + 1];
  let i = k + 1;
  if (i < m) {
    const v = a[vOff + i];
    a[o0 + i] -= s0 * v; a[o1 + i] -= s1 * v;
    i++;
  }
  let g0 = 0, g1 = 0;
  for (; i < m; i++) {
    const v = a[vOff + i];
    const u0 = a[o0 + i] - s0 * v, u1 = a[o1 + i] - s1 * v;
    a[o0 + i] = u0; a[o1 + i] = u1;
    const p = a[pOff + i];
    g0 += p * u0; g1 += p * u1;
  }
  g[j] = g0; g[j + 1] = g1;
}

function sweep1(a: Float64Array, m: number, k: number, vOff: number, pOff: number, j: number, s: Float64Array, g: Float64Array): void {
  const o0 = j * m;
  const s0 = s[j];
  let i = k + 1;
  if (i < m) a[o0 + i] -= s0 * a[vOff + i++];
  // two partial sums: the single product chain would otherwise wait on the adder each row
  let g0 = 0, g1 = 0;
  for (; i + 1 < m; i += 2) {
    const u0 = a[o0 + i] - s0 * a[vOff + i], u1 = a[o0 + i + 1] - s0 * a[vOff + i + 1];
    a[o0 + i] = u0; a[o0 + i + 1] = u1;
    g0 += a[pOff + i] * u0; g1 += a[pOff + i + 1] * u1;
  }
  if (i < m) {
    const u0 = a[o0 + i] - s0 * a[vOff + i];
    a[o0 + i] = u0;
    g0 += a[pOff + i] * u0;
  }
  g[j] = g0 + g1;
}

/** g_j = Σ_{i>k} a[pOff + i]·a_ij for the columns j..cols−1 (four per sweep). */
export function gramSums(a: Float64Array, m: number, k: number, pOff: number, j: number, cols: number, g: Float64Array): void {
  for (; j + 3 < cols; j += 4) {
    const o0 = j * m, o1 = o0 + m, o2 = o1 + m, o3 = o2 + m;
    let g0 = 0, g1 = 0, g2 = 0, g3 = 0;
    for (let i = k + 1; i < m; i++) {
      const p = a[pOff + i];
      g0 += p * a[o0 + i]; g1 += p * a[o1 + i]; g2 += p * a[o2 + i]; g3 += p * a[o3 + i];
    }
    g[j] = g0; g[j + 1] = g1; g[j + 2] = g2; g[j + 3] = g3;
  }
  for (; j < cols; j++) {
    const o = j * m;
    let g0 = 0, g1 = 0;
    let i = k + 1;
    for (; i + 1 < m; i += 2) {
      g0 += a[pOff + i] * a[o + i];
      g1 += a[pOff + i + 1] * a[o + i + 1];
    }
    if (i < m) g0 += a[pOff + i] * a[o + i];
    g[j] = g0 + g1;
  }
}
