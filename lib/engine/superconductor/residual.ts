/**
 * Residual Sommerfeld coefficient in the superconducting state: the part of C_el/T that does
 * not vanish as T → 0. A fully gapped superconductor's C_es/T is exponentially small at low T
 * but not zero at the temperatures measured, and it rises steeply with T; a straight line in T²
 * through it has a negative intercept even on clean BCS data. So C_el/T at T ≤ upToK is fitted
 * with the low-temperature form of a gapped superconductor,
 *   C_el/T = γ_r + A T^{−5/2} e^{−Δ/T},
 * (the T ≪ T_c asymptote of weak-coupling BCS, C_es ∝ (Δ/T)^{3/2} e^{−Δ/T}; Δ and A free, so an
 * anisotropic or strong-coupling gap is absorbed in an effective Δ), and γ_r is its intercept.
 * γ_r, A enter linearly; Δ is searched over 0.5–5 k_B T_c (gap ratios from a small gap to very
 * strong coupling) with γ_r and A solved exactly, then polished by LM (fit/global.ts).
 * γ_r/γ_n estimates the non-superconducting volume fraction. The intercept does not depend on
 * β (βT² is below the noise at T ≤ 0.4 T_c for the metals this is for; the caller subtracts β).
 */
import type { ModelCore } from "../fit/core";
import { fitGlobal } from "../fit/global";

export interface ResidualGamma {
  readonly gammaR: number;
  readonly stdError: number;
  readonly nPoints: number;
  readonly upToK: number;
  /** Effective gap Δ/k_B [K] of the fitted superconducting part. */
  readonly gapK: number;
  readonly method: string;
}

const CORE: ModelCore = {
  label: "γ_r + A T^(−5/2) exp(−Δ/T)",
  names: ["gammaR", "A", "gapK"],
  units: ["J/(mol*K^2)", "J*K^0.5/mol", "K"],
  linear: false,
  evaluate: (x, p, out) => {
    for (let i = 0; i < x.length; i++) out[i] = p[0] + (p[1] === 0 ? 0 : p[1] * x[i] ** -2.5 * Math.exp(-p[2] / x[i]));
  },
  jacobian: (x, p, out) => {
    const m = x.length;
    for (let i = 0; i < m; i++) {
      const g = x[i] ** -2.5 * Math.exp(-p[2] / x[i]);
      out[i] = 1;
      out[m + i] = g;
      out[2 * m + i] = (-p[1] * g) / x[i];
    }
  },
};

/**
 * γ_r [J mol⁻¹ K⁻²] ± σ from y = C_el/T at T ≤ upToK (T_c = tcK); null when fewer than 6
 * points lie there or the gapped fit does not converge (then no γ_r can be given).
 */
export function residualGamma(T: readonly number[], y: readonly number[], upToK: number, sigmaY: readonly number[] | undefined, tcK: number): ResidualGamma | null {
  const idx = T.map((t, i) => (t <= upToK ? i : -1)).filter((i) => i >= 0);
  if (idx.length < 6) return null;
  const x = Float64Array.from(idx, (i) => T[i]);
  const v = Float64Array.from(idx, (i) => y[i]);
  const s = sigmaY ? Float64Array.from(idx, (i) => sigmaY[i]) : null;
  const opt = { start: Float64Array.from([NaN, NaN, NaN]), fixed: [false, false, false], lower: Float64Array.from([-Infinity, 0, 1e-3 * tcK]), upper: Float64Array.from([Infinity, Infinity, 20 * tcK]), scaleErrors: false };
  const fit = fitGlobal(CORE, x, v, s, opt, { linear: [0, 1], nonlinear: [2], axes: [{ lo: 0.5 * tcK, hi: 5 * tcK }], extraStarts: [], budget: 2000 });
  const [g, , gap] = fit.parameters;
  if (!fit.converged || g.stdError === null) return null;
  const method = `C_el/T = γ_r + A T^(−5/2) e^(−Δ/T) fitted to ${idx.length} points ≤ ${upToK.toPrecision(3)} K (Δ = ${gap.value.toPrecision(3)} K), extrapolated to T = 0`;
  return Object.freeze({ gammaR: g.value, stdError: g.stdError, nPoints: idx.length, upToK, gapK: gap.value, method });
}
