/**
 * Scratch memory for solveLinearLeastSquares, reused from one call to the next: a fresh
 * typed array is zero pages that fault on first write (on this kind of machine about as
 * costly as one more pass over the data), and a solve needs several m-length work arrays.
 * Nothing returned to a caller ever points into it, and no call keeps it across a callback,
 * so reuse cannot change a result. Requests above MAX_KEPT doubles get a fresh array that is
 * not kept, so at most 16 MiB stays held.
 */

const MAX_KEPT = 1 << 21;
let pool = new Float64Array(0);

/** A Float64Array of `length` entries with arbitrary contents (the caller writes every entry it reads). */
export function workspace(length: number): Float64Array {
  if (length > MAX_KEPT) return new Float64Array(length);
  if (pool.length < length) pool = new Float64Array(Math.min(MAX_KEPT, Math.max(length, 2 * pool.length)));
  return pool.subarray(0, length);
}
