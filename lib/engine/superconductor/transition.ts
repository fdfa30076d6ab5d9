/**
 * Locating the superconducting transition in C_el/T data and choosing the windows of the
 * equal-area construction. Heuristics (common practice, documented here): the peak of a
 * 3-point moving average of C_el/T; above it, the first points where the average falls below
 * 90 %, 50 % (T_½) and 10 % of the jump height over γ_n; a width w = 3σ_T of a Gaussian-
 * broadened step, σ_T = (T_10 − T_90)/2.56, but at least 2 × the median spacing; the
 * integration window [T_½ − 2w, T_½ + 2w] (capped at the last point); the superconducting
 * branch fitted on [lower − 2w, lower], widened to the last 6 points below `lower` if fewer.
 */
import { invalid } from "../errors";

export interface TransitionWindows {
  readonly peakK: number;
  readonly halfHeightK: number;
  readonly widthK: number;
  readonly lowerK: number;
  readonly upperK: number;
  readonly branchFromK: number;
}

/**
 * Windows for the construction from y = C_el/T [J mol⁻¹ K⁻²] on increasing T [K] and the
 * normal-state γ_n. `override` replaces lower/upper (and the branch start) when given.
 * Throws InputError when no peak rises above γ_n, when there is no normal-state data above
 * the transition, or when too few points lie below it for the branch fit.
 */
export function findTransition(T: readonly number[], y: readonly number[], gammaN: number, override?: { lowerK?: number; upperK?: number; branchFromK?: number }): TransitionWindows {
  const smooth = y.map((_, i) => (y[Math.max(0, i - 1)] + y[i] + y[Math.min(y.length - 1, i + 1)]) / 3);
  let p = 0;
  for (let i = 1; i < smooth.length; i++) if (smooth[i] > smooth[p]) p = i;
  const height = smooth[p] - gammaN;
  if (!(height > 0)) throw invalid("heat capacity", "no jump", "C_el/T never rises above γ_n: no superconducting transition in the data");
  const crossing = (level: number) => {
    for (let i = p + 1; i < smooth.length; i++) if (smooth[i] < gammaN + level * height) return i;
    return -1;
  };
  const [i90, half, i10] = [crossing(0.9), crossing(0.5), crossing(0.1)];
  if (i10 < 0) throw invalid("temperatureK", T[T.length - 1], "no normal-state data above the transition (C_el/T does not return to γ_n)");
  const spacings = T.slice(1).map((t, i) => t - T[i]).sort((a, b) => a - b);
  // a Gaussian-broadened step falls from 90 % to 10 % over 2.56 σ_T; w = 3 σ_T
  const width = Math.max((3 * (T[i10] - T[i90])) / 2.56, 2 * spacings[Math.floor(spacings.length / 2)]);
  const lowerK = override?.lowerK ?? T[half] - 2 * width;
  const upperK = Math.min(override?.upperK ?? T[half] + 2 * width, T[T.length - 1]);
  if (!(upperK > T[half])) throw invalid("upperK", upperK, "must lie above the transition");
  const belowLower = T.filter((t) => t <= lowerK).length;
  if (belowLower < 6) throw invalid("lowerK", lowerK, `only ${belowLower} points below it; the superconducting branch needs ≥ 6`);
  let branchFromK = override?.branchFromK ?? lowerK - 2 * width;
  const inBranch = T.filter((t) => t >= branchFromK && t <= lowerK).length;
  if (inBranch < 6) branchFromK = T.filter((t) => t <= lowerK).slice(-6)[0];
  return Object.freeze({ peakK: T[p], halfHeightK: T[half], widthK: width, lowerK, upperK, branchFromK });
}

/** Linear interpolation of tabulated (T, y) at t within [T_0, T_n−1]. */
export function interpolate(T: readonly number[], y: readonly number[], t: number): number {
  let i = 1;
  while (i < T.length - 1 && T[i] < t) i++;
  const f = (t - T[i - 1]) / (T[i] - T[i - 1]);
  return y[i - 1] + f * (y[i] - y[i - 1]);
}

/**
 * ∫_a^b y dT by the trapezoid on the data, with the end segments cut at a and b by linear
 * interpolation; returns the integral and the weight of each point (for error propagation).
 */
export function areaBetween(T: readonly number[], y: readonly number[], a: number, b: number): { area: number; weights: number[] } {
  const weights = T.map(() => 0);
  let area = 0;
  for (let i = 1; i < T.length; i++) {
    const lo = Math.max(a, T[i - 1]);
    const hi = Math.min(b, T[i]);
    if (hi <= lo) continue;
    const h = T[i] - T[i - 1];
    // segment [lo, hi] of the linear interpolant between points i−1 and i
    const fLo = (lo - T[i - 1]) / h;
    const fHi = (hi - T[i - 1]) / h;
    const wNext = ((fLo + fHi) / 2) * (hi - lo);
    const wPrev = (hi - lo) - wNext;
    weights[i - 1] += wPrev;
    weights[i] += wNext;
    area += wPrev * y[i - 1] + wNext * y[i];
  }
  return { area, weights };
}
