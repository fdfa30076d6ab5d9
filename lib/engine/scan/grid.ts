/**
 * Window grids for scans: by default 20 candidate lower edges taken at data temperatures
 * from the lowest point up to the median, and 20 upper edges from the smallest window that
 * can hold minPoints points up to the highest point, evenly spaced in rank (edges are data
 * temperatures, so inclusive windows are well defined).
 */

/** Sorted unique values picked at evenly spaced ranks between quantiles q0 and q1. */
export function quantileEdges(sortedT: Float64Array, q0: number, q1: number, count: number): number[] {
  const n = sortedT.length;
  const out: number[] = [];
  for (let k = 0; k < count; k++) {
    const q = count === 1 ? q0 : q0 + ((q1 - q0) * k) / (count - 1);
    const v = sortedT[Math.min(n - 1, Math.max(0, Math.round(q * (n - 1))))];
    if (!out.includes(v)) out.push(v);
  }
  return out.sort((a, b) => a - b);
}

/** First index with T ≥ t and last index with T ≤ t in ascending `sortedT`. */
export function lowerIndex(sortedT: Float64Array, t: number): number {
  let lo = 0;
  let hi = sortedT.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sortedT[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
export function upperIndex(sortedT: Float64Array, t: number): number {
  let lo = 0;
  let hi = sortedT.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sortedT[mid] <= t) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}
