/**
 * Entropy and enthalpy step: S(T) = ∫ C/T dT and H(T) − H(0) = ∫ C dT on the chain's data, with the
 * 0 → T_min part from the γ and β of a fit step above.
 */
import { z } from "zod";
import { entropyFromData, enthalpyFromData } from "../../thermo";
import { InputError } from "../../errors";
import { StepFailure, requireDataset, thinCurve, defineStep } from "./shared";
import { pickFit } from "./derive";

export const entropyConfig = z.object({ fitStepId: z.string().nullable().default(null) });
export type EntropyConfig = z.infer<typeof entropyConfig>;

export const entropyStep = defineStep({
  kind: "entropy",
  title: "Entropy and enthalpy",
  schema: entropyConfig,
  dependencies: () => ({ measurementIds: [], sampleFields: [] }),
  compute(config, state) {
    const data = requireDataset(state, "the entropy step");
    if (data.basis !== "formula-unit" && data.basis !== "atom") throw new StepFailure("the entropy step needs molar data: add a normalisation step above it", "fitStepId");
    const fit = pickFit(state, config.fitStepId, "the entropy step");
    const low = {
      gamma: fit.gamma!.value, beta: fit.beta!.value,
      ...(fit.gamma!.stdError !== null ? { gammaStdError: fit.gamma!.stdError } : {}),
      ...(fit.beta!.stdError !== null ? { betaStdError: fit.beta!.stdError } : {}),
      ...(fit.covGammaBeta !== null ? { covGammaBeta: fit.covGammaBeta } : {}),
    };
    try {
      const sigma = data.sigma ?? undefined;
      const entropy = entropyFromData(data.temperatureK, data.heatCapacity, low, sigma);
      const enthalpy = enthalpyFromData(data.temperatureK, data.heatCapacity, low, sigma);
      // Curves thinned to at most 600 points for display; the integrals used every point.
      const show = (c: typeof entropy) => ({ ...c, ...thinCurve({ temperatureK: c.temperatureK, values: c.values, ...(c.stdErrors ? { stdErrors: c.stdErrors } : {}) }) });
      return { result: { fitStepId: fit.stepId, basis: data.basis, points: data.temperatureK.length, entropy: show(entropy), enthalpy: show(enthalpy) }, warnings: [], state };
    } catch (err) {
      if (err instanceof InputError) throw new StepFailure(err.message, err.field);
      throw err;
    }
  },
});
