/**
 * How a fit weights its points, chosen by the user (files without σ need a choice):
 *   "sigma"     the σ of the data (from the file or propagated by the steps above); known σ
 *   "none"      unweighted (ordinary least squares); standard errors from the residual scatter
 *   "relative"  σ_i = p % of |C_i| (an assumed relative uncertainty); treated as known σ
 *   "absolute"  σ_i = the same σ for every point, in J mol⁻¹ K⁻¹ (or the data's SI unit); known σ
 * χ²_red means something only with known σ; otherwise the residual standard deviation in the
 * data's unit says how well the model fits (describeQuality).
 * Failure modes: InputError for p not in (0, 100], σ not finite and > 0, "sigma" asked of
 * data without σ (callers decide whether to fall back, and say so), or C = 0 under "relative".
 */
import { InputError } from "../errors";

export type WeightingChoice =
  | { readonly kind: "sigma" }
  | { readonly kind: "none" }
  | { readonly kind: "relative"; readonly percent: number }
  | { readonly kind: "absolute"; readonly sigma: number };

export interface AppliedWeighting {
  /** σ per point, or undefined for an unweighted fit. */
  readonly sigma: number[] | undefined;
  readonly kind: WeightingChoice["kind"];
  /** Whether χ²_red can be judged (σ known or asserted by the user). */
  readonly sigmaKnown: boolean;
  /** In words, e.g. "weighted by an assumed σ = 0.5 % of C". */
  readonly text: string;
}

const trim = (v: number) => String(Number(v.toPrecision(4)));

/**
 * σ per point for `choice` on C values `heatCapacity` with the data's own σ `dataSigma` (or
 * null); `unitLabel` names the SI unit of C for the words (e.g. "J mol⁻¹ K⁻¹").
 */
export function applyWeighting(heatCapacity: readonly number[], dataSigma: readonly number[] | null | undefined, choice: WeightingChoice, unitLabel = "J mol⁻¹ K⁻¹"): AppliedWeighting {
  switch (choice.kind) {
    case "sigma":
      if (!dataSigma) throw new InputError("the data carry no σ: choose unweighted, a relative σ (p % of C) or an absolute σ", { field: "weighting" });
      return { sigma: [...dataSigma], kind: "sigma", sigmaKnown: true, text: "weighted by 1/σ² with the σ of the data" };
    case "none":
      return { sigma: undefined, kind: "none", sigmaKnown: false, text: "unweighted (standard errors from the residual scatter)" };
    case "relative": {
      const p = choice.percent;
      if (!(Number.isFinite(p) && p > 0 && p <= 100)) throw new InputError(`invalid relative σ: ${p} % (must lie in (0, 100])`, { field: "relativeSigmaPercent" });
      const sigma = heatCapacity.map((c, i) => {
        const s = (Math.abs(c) * p) / 100;
        if (!(s > 0)) throw new InputError(`C = ${c} at point ${i + 1}: a relative σ of ${p} % would be 0 there`, { field: "relativeSigmaPercent", line: i + 1 });
        return s;
      });
      return { sigma, kind: "relative", sigmaKnown: true, text: `weighted by an assumed σ = ${trim(p)} % of C` };
    }
    case "absolute": {
      const s = choice.sigma;
      if (!(Number.isFinite(s) && s > 0)) throw new InputError(`invalid absolute σ: ${s} (must be finite and > 0)`, { field: "absoluteSigma" });
      return { sigma: heatCapacity.map(() => s), kind: "absolute", sigmaKnown: true, text: `weighted by an assumed σ = ${trim(s)} ${unitLabel} for every point` };
    }
  }
}

/** Fit quality in words: χ²_red with known σ, else the residual standard deviation √(RSS/dof) in `unitLabel` (value × factor). */
export function describeQuality(sigmaKnown: boolean, reducedChiSquare: number | null, residualStdDev: number | null, factor = 1e3, unitLabel = "mJ mol⁻¹ K⁻¹"): string {
  if (sigmaKnown) return reducedChiSquare === null ? "χ²_red not available" : `χ²_red = ${reducedChiSquare.toFixed(2)}`;
  return residualStdDev === null ? "residual standard deviation not available" : `residual standard deviation ${trim(residualStdDev * factor)} ${unitLabel} (σ unknown: no χ²_red)`;
}
