/**
 * Piecewise-linear interpolation of an addenda curve in T, with σ propagation.
 */
import type { SampleCurve } from "./types";

/** A curve sorted by T with duplicate temperatures merged. */
export interface SortedCurve {
  t: number[];
  c: number[];
  /** null when the curve has no σ. */
  s: number[] | null;
}

/**
 * Sort by T and merge points at identical T: the inverse-variance weighted mean
 * (σ = 1/√Σσ⁻²) when σ is given, else the plain mean.
 */
export function sortCurve(curve: SampleCurve): SortedCurve {
  const order = curve.temperatureK.map((_, i) => i).sort((a, b) => curve.temperatureK[a] - curve.temperatureK[b]);
  const out: SortedCurve = { t: [], c: [], s: curve.sigma ? [] : null };
  let i = 0;
  while (i < order.length) {
    const t = curve.temperatureK[order[i]];
    let sw = 0, swc = 0;
    for (; i < order.length && curve.temperatureK[order[i]] === t; i++) {
      const w = curve.sigma ? 1 / curve.sigma[order[i]] ** 2 : 1;
      sw += w;
      swc += w * curve.heatCapacityJPerK[order[i]];
    }
    out.t.push(t);
    out.c.push(swc / sw);
    if (out.s) out.s.push(1 / Math.sqrt(sw));
  }
  return out;
}

/**
 * C_a(T) = (1 − u) C_i + u C_{i+1}, u = (T − T_i)/(T_{i+1} − T_i), for T_i ≤ T ≤ T_{i+1};
 * σ_a(T)² = (1 − u)² σ_i² + u² σ_{i+1}² (neighbouring addenda points independent).
 * The caller guarantees T_min ≤ T ≤ T_max; a single-point curve is evaluated only at its T.
 */
export function interpolateLinear(curve: SortedCurve, t: number): { value: number; sigma: number | null } {
  const { t: ts, c, s } = curve;
  let lo = 0, hi = ts.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ts[mid] <= t) lo = mid;
    else hi = mid;
  }
  if (hi === lo || ts[hi] === ts[lo]) return { value: c[lo], sigma: s ? s[lo] : null };
  const u = Math.min(1, Math.max(0, (t - ts[lo]) / (ts[hi] - ts[lo])));
  const value = (1 - u) * c[lo] + u * c[hi];
  const sigma = s ? Math.sqrt(((1 - u) * s[lo]) ** 2 + (u * s[hi]) ** 2) : null;
  return { value, sigma };
}
