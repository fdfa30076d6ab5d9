/**
 * The core of the entropy-conserving (equal-area) construction, for fixed windows:
 * replace the broadened transition in C_el/T by a sharp step at T_c such that
 *   ∫_lower^upper (C_el/T)_measured dT = ∫_lower^{T_c} branch(T) dT + γ_n (upper − T_c),
 * with `branch` a polynomial fitted to the superconducting side below `lower` and
 * C_el = C − βT³ (normal-state β). The left side is the measured entropy change across the
 * window, the right side that of the idealised transition.
 */
import { invalid } from "../errors";
import { fitPolynomial, type PolyFit } from "./localFit";
import { areaBetween } from "./transition";

export interface Windows {
  readonly lowerK: number;
  readonly upperK: number;
  readonly branchFromK: number;
}

export interface Construction {
  readonly tcK: number;
  /** ΔC/T_c = branch(T_c) − γ_n [J mol⁻¹ K⁻²]. */
  readonly jumpOverTc: number;
  readonly branch: PolyFit;
  /** Trapezoid weights of each point in the measured area (for noise propagation). */
  readonly weights: readonly number[];
}

/** C_el/T = C/T − βT² [J mol⁻¹ K⁻²] at each temperature. */
export function electronicOverT(T: readonly number[], C: readonly number[], beta: number): number[] {
  return C.map((c, i) => c / T[i] - beta * T[i] * T[i]);
}

/**
 * Solve the equal-area equation for T_c by bisection on [lower, upper] (the balance is
 * monotonic where branch > γ_n). Throws InputError when the balance has no root in the
 * window (the branch does not rise above γ_n, or the window misses the transition).
 */
export function construct(T: readonly number[], y: readonly number[], sigmaY: readonly number[] | undefined, gammaN: number, w: Windows, degree: 1 | 2): Construction {
  const idx = T.map((t, i) => (t >= w.branchFromK && t <= w.lowerK ? i : -1)).filter((i) => i >= 0);
  const branch = fitPolynomial(idx.map((i) => T[i]), idx.map((i) => y[i]), degree, sigmaY && idx.map((i) => sigmaY[i]));
  const { area, weights } = areaBetween(T, y, w.lowerK, w.upperK);
  const balance = (tc: number) => branch.integral(w.lowerK, tc) + gammaN * (w.upperK - tc) - area;
  let lo = w.lowerK;
  let hi = w.upperK;
  if (!(balance(lo) < 0 && balance(hi) > 0)) {
    throw invalid("window", `${w.lowerK.toPrecision(4)}–${w.upperK.toPrecision(4)} K`, "equal-area balance has no root: the window does not bracket the transition");
  }
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2;
    if (balance(mid) < 0) lo = mid;
    else hi = mid;
  }
  const tcK = (lo + hi) / 2;
  return { tcK, jumpOverTc: branch.at(tcK) - gammaN, branch, weights };
}
