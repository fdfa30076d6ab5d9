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
 * A superconductor with nodes in its gap has a power law instead (C_es/T ∝ T for point nodes:
 * a straight line in T²), which the gapped form cannot follow. Both are fitted to the same points
 * and the one with the lower AICc (Akaike's criterion with the small-sample correction; the
 * gapped form has one parameter more) gives γ_r; the note says which.
 * γ_r/γ_n estimates the non-superconducting volume fraction. The caller subtracts βT².
 */
import { fitPolynomial } from "./localFit";
import type { ModelCore } from "../fit/core";
import { fitGlobal } from "../fit/global";

export interface ResidualGamma {
  readonly gammaR: number;
  readonly stdError: number;
  readonly nPoints: number;
  readonly upToK: number;
  /** Effective gap Δ/k_B [K] of the gapped form, NaN when the power law was chosen. */
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
 * points lie there.
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
  const line = fitPolynomial(idx.map((i) => T[i] ** 2), idx.map((i) => y[i]), 1, sigmaY && idx.map((i) => sigmaY[i]));
  const lineChi = idx.reduce((acc, i, k) => acc + ((y[i] - line.at(T[i] ** 2)) / (s ? s[k] : 1)) ** 2, 0);
  const gapped = fit.converged && g.stdError !== null && fit.chiSquare !== null;
  const where = `${idx.length} points ≤ ${upToK.toPrecision(3)} K`;
  if (gapped && aicc(fit.chiSquare!, idx.length, 3) <= aicc(lineChi, idx.length, 2)) {
    const method = `C_el/T = γ_r + A T^(−5/2) e^(−Δ/T) (gapped; lower AICc than a line in T²) fitted to ${where} (Δ = ${gap.value.toPrecision(3)} K), extrapolated to T = 0`;
    return Object.freeze({ gammaR: g.value, stdError: g.stdError!, nPoints: idx.length, upToK, gapK: gap.value, method });
  }
  const method = `C_el/T = γ_r + B T² (power law; lower AICc than the gapped form${gapped ? "" : ", which did not converge"}) fitted to ${where}, extrapolated to T = 0`;
  return Object.freeze({ gammaR: line.at(0), stdError: line.stdErrorAt(0), nPoints: idx.length, upToK, gapK: NaN, method });
}

/** AICc = n ln(χ²/n) + 2k + 2k(k+1)/(n−k−1) (constant terms dropped). */
function aicc(chi: number, n: number, k: number): number {
  return n * Math.log(Math.max(chi, 1e-300) / n) + 2 * k + (2 * k * (k + 1)) / Math.max(n - k - 1, 1);
}
