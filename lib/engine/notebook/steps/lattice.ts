/**
 * Lattice views step: over a wide temperature range, the lattice part C − γT (γ from a fit step
 * above) inverted through the Debye function to an effective Θ_D(T) with σ, and C/T³ against T,
 * where a flat low-T plateau is the Debye T³ law and a peak is an Einstein-like mode
 * (derived/latticeViews.ts). Needs molar data. Nothing is handed down.
 */
import { z } from "zod";
import { effectiveDebyeTemperature, latticeOverT3 } from "../../derived/latticeViews";
import { debyeTemperatureFromBeta } from "../../models/debye";
import { InputError } from "../../errors";
import { StepFailure, requireDataset, thinCurve, defineStep } from "./shared";
import { pickFit } from "./derive";

export const latticeConfig = z.object({
  /** γ (and the low-T Θ_D for comparison) from this fit step; null: the nearest fit above with γ and β. */
  fitStepId: z.string().nullable().default(null),
  /** Only points at or above this temperature (K); null: from the lowest. */
  tMinK: z.number().positive().nullable().default(null),
});
export type LatticeConfig = z.infer<typeof latticeConfig>;

export const latticeStep = defineStep({
  kind: "lattice",
  title: "Lattice views",
  schema: latticeConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: ["atomsPerFormulaUnit"] }),
  compute(config, state, ctx) {
    const data = requireDataset(state, "the lattice views");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("the lattice views need molar data: add a normalisation step above", "fitStepId");
    const fit = pickFit(state, config.fitStepId, "the lattice views");
    if (fit.basis !== data.basis) throw new StepFailure("the fit and the data are on different bases (per formula unit vs per atom)", "fitStepId");
    const r = data.basis === "atom" ? 1 : ctx.sample.atomsPerFormulaUnit;
    const keep = data.temperatureK.map((_, i) => i).filter((i) => config.tMinK === null || data.temperatureK[i]! >= config.tMinK);
    if (keep.length < 2) throw new StepFailure("fewer than two points at or above the lowest temperature chosen", "tMinK");
    const pick = <T>(a: readonly T[]) => keep.map((i) => a[i]!);
    const input = { temperatureK: pick(data.temperatureK), heatCapacity: pick(data.heatCapacity), sigma: data.sigma ? pick(data.sigma) : null, gamma: fit.gamma!, r };
    try {
      const theta = effectiveDebyeTemperature(input);
      const ratio = latticeOverT3(input);
      const missing = theta.points.filter((p) => p.thetaDK === null);
      const warnings: string[] = [];
      if (missing.length) warnings.push(`${missing.length} of ${theta.points.length} points have no effective Θ_D: ${[...new Set(missing.map((p) => p.note))].join("; ")}`);
      const tMax = input.temperatureK[input.temperatureK.length - 1]!;
      const lowThetaK = fit.beta && fit.beta.value > 0 ? debyeTemperatureFromBeta(fit.beta.value, r) : null;
      if (lowThetaK !== null && tMax < lowThetaK / 20) warnings.push(`the data end at ${tMax.toPrecision(3)} K, below Θ_D/20: Θ_D(T) is flat here by construction of the T³ law; the views need data to about Θ_D/5 or higher`);
      const nullable = (v: number | null) => (v === null ? Number.NaN : v);
      const curve = thinCurve({
        temperatureK: theta.points.map((p) => p.temperatureK),
        thetaDK: theta.points.map((p) => nullable(p.thetaDK)),
        thetaStdErrorK: theta.points.map((p) => nullable(p.stdErrorK)),
        totalOverT3: ratio.map((p) => p.totalOverT3),
        latticeOverT3: ratio.map((p) => p.latticeOverT3),
        ratioStdError: ratio.map((p) => nullable(p.stdError)),
      });
      // The largest (C − γT)/T³ when it lies inside the range (not at an end): for a lone Einstein mode (C/T³ ∝ x⁵eˣ/(eˣ − 1)², x = Θ_E/T, largest at x ≈ 4.928) Θ_E ≈ 4.928 T_peak.
      let top = 0;
      for (let i = 1; i < ratio.length; i++) if (ratio[i]!.latticeOverT3 > ratio[top]!.latticeOverT3) top = i;
      // A peak counts when it stands above both ends by more than 1 % and by more than 3σ (our choice: a plateau with noise has none).
      const ends = Math.max(ratio[0]!.latticeOverT3, ratio[ratio.length - 1]!.latticeOverT3);
      const rise = ratio[top]!.latticeOverT3 - ends;
      const interior = top > 0 && top < ratio.length - 1 && rise > 0.01 * Math.abs(ratio[top]!.latticeOverT3) && rise > 3 * (ratio[top]!.stdError ?? 0);
      const finite = (a: readonly number[]) => a.map((v) => (Number.isFinite(v) ? v : null));
      return {
        result: {
          basis: data.basis, fitStepId: fit.stepId, fitModel: fit.model, r,
          gamma: fit.gamma!, lowTemperatureThetaDK: lowThetaK,
          points: keep.length,
          /** Curves for display (at most 600 points, evenly by index); SI: K, J mol⁻¹ K⁻⁴. Nulls where no Θ_D exists. */
          curve: {
            temperatureK: curve.temperatureK, thetaDK: finite(curve.thetaDK), thetaStdErrorK: finite(curve.thetaStdErrorK),
            totalOverT3: curve.totalOverT3, latticeOverT3: curve.latticeOverT3, ratioStdError: finite(curve.ratioStdError),
          },
          peak: interior ? { temperatureK: ratio[top]!.temperatureK, latticeOverT3: ratio[top]!.latticeOverT3 } : null,
          note: theta.note,
        },
        warnings,
        state,
      };
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field === "gamma" ? "fitStepId" : undefined);
      throw err;
    }
  },
});
