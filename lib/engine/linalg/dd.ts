/**
 * Error-free transformations for compensated (double-double) accumulation, used by the
 * iterative refinement of least-squares solutions. Dekker's product split (no FMA in JS)
 * and Knuth's two-sum. Reference: Ogita, Rump & Oishi, SIAM J. Sci. Comput. 26 (2005) 1955.
 */

const SPLITTER = 134217729; // 2^27 + 1

/**
 * acc ← acc − a·x for the whole vector, with acc held as hi + lo pairs (column axpy in
 * double-double). `x` is a scalar; `a` is read from `a[offset + i]`, i < m.
 */
export function ddSubtractScaledColumn(
  hi: Float64Array,
  lo: Float64Array,
  a: Float64Array,
  offset: number,
  m: number,
  x: number,
): void {
  const cx = SPLITTER * x;
  const xh = cx - (cx - x);
  const xl = x - xh;
  for (let i = 0; i < m; i++) {
    const ai = a[offset + i];
    const p = ai * x;
    const ca = SPLITTER * ai;
    const ah = ca - (ca - ai);
    const al = ai - ah;
    const e = ah * xh - p + ah * xl + al * xh + al * xl;
    // hi − p with its rounding error
    const h = hi[i];
    const s = h - p;
    const bb = s - h;
    const err = h - (s - bb) - (p + bb);
    hi[i] = s;
    lo[i] += err - e;
  }
}

/** Σ a[offset+i]·r_i accumulated in double-double, returned rounded to double. */
export function ddDot(a: Float64Array, offset: number, r: Float64Array, m: number): number {
  let sh = 0;
  let sl = 0;
  for (let i = 0; i < m; i++) {
    const ai = a[offset + i];
    const x = r[i];
    const p = ai * x;
    const ca = SPLITTER * ai;
    const ah = ca - (ca - ai);
    const al = ai - ah;
    const cx = SPLITTER * x;
    const xh = cx - (cx - x);
    const xl = x - xh;
    const e = ah * xh - p + ah * xl + al * xh + al * xl;
    const s = sh + p;
    const bb = s - sh;
    const err = sh - (s - bb) + (p - bb);
    sh = s;
    sl += err + e;
  }
  return sh + sl;
}
