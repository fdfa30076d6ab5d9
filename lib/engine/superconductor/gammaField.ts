/**
 * γ(H) of a superconductor in the mixed state: the field dependence of the low-temperature
 * Sommerfeld coefficient, γ(H)/γ_n against h = H/H_c2, compared between
 *   linear:  γ(H)/γ_n = a + b·h        (fully gapped: the quasiparticle states live in the vortex
 *                                      cores, whose number grows ∝ H; Caroli, de Gennes & Matricon,
 *                                      Phys. Lett. 9 (1964) 307)
 *   √H:      γ(H)/γ_n = a + b·√h       (line nodes: the Doppler shift of the nodal quasiparticles;
 *                                      Volovik, JETP Lett. 58 (1993) 469)
 * by AICc on the same points (both have two parameters, so ΔAICc is Δχ² here). Weighted by σ of
 * each γ(H)/γ_n (from σ(γ(H)) and σ(γ_n), the γ_n part being common to all points).
 *
 * What the comparison can and cannot show (stated with every result): a √H-like curve also comes
 * from a multiband superconductor with a small second gap, from a fully gapped one with strong
 * Pauli limiting, or from vortex-lattice effects near H_c2; a linear-looking curve from a nodal
 * one measured only well above H_c1 with a coarse field grid. The better-fitting law is a hint,
 * not a proof of the gap structure; thermal conductivity or the angle dependence decides.
 *
 * Units: fields in tesla, γ in J mol⁻¹ K⁻².
 */
import { invalid } from "../errors";
import { solveLinearLeastSquares } from "../linalg";

export interface GammaFieldInput {
  fieldT: readonly number[];
  /** γ(H) at each field, J mol⁻¹ K⁻² (from fits at each field, or residual γ per field). */
  gamma: readonly number[];
  /** σ of each γ(H), or null (unweighted: σ from the residual scatter). */
  sigma: readonly number[] | null;
  /** Normal-state γ_n with its σ. */
  gammaN: { value: number; stdError: number | null };
  /** Upper critical field H_c2 in tesla (at the measuring temperature). */
  hc2T: number;
}

export interface GammaFieldLaw {
  law: "linear" | "sqrt";
  title: string;
  /** Intercept a (the residual γ_r/γ_n at H → 0) and slope b, with standard errors. */
  intercept: { value: number; stdError: number };
  slope: { value: number; stdError: number };
  chiSquare: number;
  reducedChiSquare: number;
  aicc: number | null;
}

export interface GammaFieldResult {
  points: { h: number; ratio: number; sigma: number | null }[];
  laws: [GammaFieldLaw, GammaFieldLaw];
  /** The law with the lower AICc, and by how much. */
  preferred: "linear" | "sqrt";
  deltaAicc: number | null;
  /** Akaike weight of the preferred law, exp(−Δ/2)-based (Burnham & Anderson, Model Selection, 2002). */
  weight: number | null;
  cautions: string[];
}

const CAUTIONS = [
  "A √H-like γ(H) also comes from a multiband superconductor with a small second gap, from strong Pauli limiting, or from vortex-lattice effects near H_c2; a linear-looking one from a nodal superconductor measured only far above H_c1 or on a coarse field grid.",
  "Both laws have two parameters: AICc compares only these two forms on these points; it does not test any other.",
  "The γ_n part of each σ is common to all points (fully correlated); it moves all ratios together and does not change which law fits better.",
];

function fitLaw(law: "linear" | "sqrt", h: number[], y: number[], sigma: number[] | null): GammaFieldLaw {
  const m = h.length;
  const design = new Float64Array(2 * m);
  for (let i = 0; i < m; i++) {
    design[i] = 1;
    design[m + i] = law === "linear" ? h[i]! : Math.sqrt(h[i]!);
  }
  const r = solveLinearLeastSquares(design, m, 2, y, sigma ? { sigma } : {});
  if (!r.fullRank) throw invalid("fieldT", "the fields", "need at least two different fields");
  const dof = m - 2;
  const scale = sigma ? 1 : (dof > 0 ? r.chiSquare / dof : NaN);
  const se = (k: number) => Math.sqrt(r.covariance[k * 2 + k]! * scale);
  const chi = sigma ? r.chiSquare : dof;
  const n = m, k = 2;
  // AICc: with σ known the −2 ln L term is χ²; without, n ln(RSS/n) (Burnham & Anderson 2002, §2.2 and §7.4).
  const fitTerm = sigma ? r.chiSquare : n * Math.log(r.chiSquare / n);
  const aicc = n - k - 1 > 0 ? fitTerm + 2 * k + (2 * k * (k + 1)) / (n - k - 1) : null;
  return {
    law, title: law === "linear" ? "linear in H (fully gapped)" : "√H (line nodes)",
    intercept: { value: r.coefficients[0]!, stdError: se(0) }, slope: { value: r.coefficients[1]!, stdError: se(1) },
    chiSquare: r.chiSquare, reducedChiSquare: dof > 0 ? chi / dof : NaN, aicc,
  };
}

/** Fit both laws to γ(H)/γ_n against H/H_c2 and compare them. Throws InputError on bad input. */
export function analyseGammaField(input: GammaFieldInput): GammaFieldResult {
  const m = input.fieldT.length;
  if (input.gamma.length !== m) throw invalid("gamma", `${input.gamma.length} values`, `fieldT has ${m}`);
  if (input.sigma && input.sigma.length !== m) throw invalid("sigma", `${input.sigma.length} values`, `fieldT has ${m}`);
  if (m < 3) throw invalid("fieldT", `${m} fields`, "need at least three fields to compare two two-parameter laws");
  if (!(input.hc2T > 0)) throw invalid("hc2T", input.hc2T, "H_c2 must be > 0");
  if (!(input.gammaN.value > 0)) throw invalid("gammaN", input.gammaN.value, "γ_n must be > 0");
  for (const f of input.fieldT) if (!(f >= 0) || f > input.hc2T) throw invalid("fieldT", f, `fields must lie in 0 … H_c2 = ${input.hc2T} T`);
  const gn = input.gammaN.value, sgn = input.gammaN.stdError ?? 0;
  const h = input.fieldT.map((f) => f / input.hc2T);
  const y = input.gamma.map((g) => g / gn);
  const sigma = input.sigma ? input.sigma.map((s, i) => Math.hypot(s / gn, (y[i]! * sgn) / gn)) : null;
  const laws: [GammaFieldLaw, GammaFieldLaw] = [fitLaw("linear", h, y, sigma), fitLaw("sqrt", h, y, sigma)];
  const [a, b] = laws;
  const preferred = a.aicc !== null && b.aicc !== null ? (a.aicc <= b.aicc ? "linear" : "sqrt") : (a.chiSquare <= b.chiSquare ? "linear" : "sqrt");
  const delta = a.aicc !== null && b.aicc !== null ? Math.abs(a.aicc - b.aicc) : null;
  return {
    points: h.map((x, i) => ({ h: x, ratio: y[i]!, sigma: sigma ? sigma[i]! : null })),
    laws, preferred, deltaAicc: delta, weight: delta === null ? null : 1 / (1 + Math.exp(-delta / 2)),
    cautions: CAUTIONS,
  };
}
