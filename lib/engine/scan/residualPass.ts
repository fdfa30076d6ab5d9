/**
 * The one pass over a window's rows that the correction step of updating.ts needs:
 * r_i = b_i − Σ_j a_ij z_j, g = Aᵀr and ‖r‖², for the row-major n-column rows of
 * weightedRows.ts. One loop per column count 2–4 (the registry's linear models have 2–4
 * columns), and a general one otherwise, keeps the sums in registers, which makes the pass several times faster than the
 * general loop; the arithmetic is the same in every variant (same operations, same order).
 */

/** ‖r‖² over rows lo…hi (inclusive); g receives Aᵀr. */
export function residualPass(a: Float64Array, b: Float64Array, n: number, lo: number, hi: number, z: Float64Array, g: Float64Array): number {
  if (n === 2) return pass2(a, b, lo, hi, z, g);
  if (n === 3) return pass3(a, b, lo, hi, z, g);
  if (n === 4) return pass4(a, b, lo, hi, z, g);
  return passN(a, b, n, lo, hi, z, g);
}

function pass2(a: Float64Array, b: Float64Array, lo: number, hi: number, z: Float64Array, g: Float64Array): number {
  const z0 = z[0], z1 = z[1];
  let g0 = 0, g1 = 0, rr = 0;
  for (let i = lo, o = 2 * lo; i <= hi; i++, o += 2) {
    const a0 = a[o], a1 = a[o + 1];
    const r = b[i] - a0 * z0 - a1 * z1;
    g0 += a0 * r;
    g1 += a1 * r;
    rr += r * r;
  }
  g[0] = g0; g[1] = g1;
  return rr;
}

function pass3(a: Float64Array, b: Float64Array, lo: number, hi: number, z: Float64Array, g: Float64Array): number {
  const z0 = z[0], z1 = z[1], z2 = z[2];
  let g0 = 0, g1 = 0, g2 = 0, rr = 0;
  for (let i = lo, o = 3 * lo; i <= hi; i++, o += 3) {
    const a0 = a[o], a1 = a[o + 1], a2 = a[o + 2];
    const r = b[i] - a0 * z0 - a1 * z1 - a2 * z2;
    g0 += a0 * r;
    g1 += a1 * r;
    g2 += a2 * r;
    rr += r * r;
  }
  g[0] = g0; g[1] = g1; g[2] = g2;
  return rr;
}

function pass4(a: Float64Array, b: Float64Array, lo: number, hi: number, z: Float64Array, g: Float64Array): number {
  const z0 = z[0], z1 = z[1], z2 = z[2], z3 = z[3];
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0, rr = 0;
  for (let i = lo, o = 4 * lo; i <= hi; i++, o += 4) {
    const a0 = a[o], a1 = a[o + 1], a2 = a[o + 2], a3 = a[o + 3];
    const r = b[i] - a0 * z0 - a1 * z1 - a2 * z2 - a3 * z3;
    g0 += a0 * r;
    g1 += a1 * r;
    g2 += a2 * r;
    g3 += a3 * r;
    rr += r * r;
  }
  g[0] = g0; g[1] = g1; g[2] = g2; g[3] = g3;
  return rr;
}

function passN(a: Float64Array, b: Float64Array, n: number, lo: number, hi: number, z: Float64Array, g: Float64Array): number {
  g.fill(0);
  let rr = 0;
  for (let i = lo; i <= hi; i++) {
    const o = i * n;
    let r = b[i];
    for (let j = 0; j < n; j++) r -= a[o + j] * z[j];
    for (let j = 0; j < n; j++) g[j] += a[o + j] * r;
    rr += r * r;
  }
  return rr;
}
