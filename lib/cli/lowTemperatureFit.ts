/**
 * The C = γT + βT³ fit the transition and entropy commands need (the normal state of a
 * superconductor, the 0 → T_min extrapolation of an integral): either given on the command line
 * (γ and β in mJ units, V or V±S, with an optional correlation) or fitted here to a window of a
 * file with the engine's `sommerfeld` model. Values come back in SI with their covariance.
 */
import { InputError } from "../engine/errors";
import { fitHeatCapacity } from "../engine/fit";
import type { Measured } from "../engine/derived";
import { parseMeasured } from "./args";
import { describeWeighting, type LoadedHeatCapacity } from "./data";

export interface SommerfeldFit {
  /** γ [J mol⁻¹ K⁻²] and β [J mol⁻¹ K⁻⁴] with standard errors (SI). */
  readonly gamma: Measured;
  readonly beta: Measured;
  readonly covGammaBeta: number | null;
  /** Where it came from, in words, and the fit's facts when fitted here. */
  readonly source: string;
  readonly fitted: null | { readonly file: string; readonly tMinK: number | null; readonly tMaxK: number | null; readonly nPoints: number; readonly reducedChiSquare: number | null; readonly weighting: string };
  /** The fit's own warnings (residual structure, an upturn, …), prefixed with what was fitted. */
  readonly warnings: readonly string[];
}

/** γ, β given as flags (mJ units, V[±S]); `corr` their correlation in [−1, 1]. */
export function givenFit(gammaText: string, betaText: string, gammaFlag: string, betaFlag: string, corr: number | undefined): SommerfeldFit {
  const gamma = parseMeasured(gammaText, gammaFlag, 1e-3);
  const beta = parseMeasured(betaText, betaFlag, 1e-3);
  if (corr !== undefined && !(Math.abs(corr) <= 1)) throw new InputError(`invalid --corr: ${corr} (must be in [-1, 1])`, { field: "corr" });
  const cov = corr === undefined || gamma.stdError === null || beta.stdError === null ? null : corr * gamma.stdError * beta.stdError;
  return { gamma, beta, covGammaBeta: cov, source: `given: --${gammaFlag} ${gammaText}, --${betaFlag} ${betaText}`, fitted: null, warnings: [] };
}

/**
 * Fit C = γT + βT³ to `data` on [tMinK, tMaxK] (inclusive; either open). Throws InputError naming
 * `flag` when the window holds fewer than 3 points, and an Error (exit 1) when the fit fails.
 */
export function fittedFit(data: LoadedHeatCapacity, tMinK: number | undefined, tMaxK: number | undefined, flag: string): SommerfeldFit {
  if (tMinK !== undefined && tMaxK !== undefined && !(tMaxK > tMinK)) throw new InputError(`the fit window [${tMinK}, ${tMaxK}] K is empty`, { field: flag });
  const n = data.temperatureK.filter((t) => (tMinK === undefined || t >= tMinK) && (tMaxK === undefined || t <= tMaxK)).length;
  if (n < 3) throw new InputError(`only ${n} points of ${data.file} lie in the fit window [${tMinK ?? "min"}, ${tMaxK ?? "max"}] K: C = γT + βT³ needs at least 3`, { file: data.file, field: flag });
  const fit = fitHeatCapacity(data, { model: "sommerfeld", tMinK, tMaxK });
  if (!fit.converged) throw new Error(`the C = γT + βT³ fit on ${data.file} failed: ${fit.message}`);
  const p = (name: string) => fit.parameters.find((q) => q.name === name)!;
  const names = fit.covariance?.names ?? [];
  const [i, j] = [names.indexOf("gamma"), names.indexOf("beta")];
  const cov = i >= 0 && j >= 0 ? fit.covariance!.matrix[i][j] : null;
  const window = `[${tMinK ?? "min"}, ${tMaxK ?? "max"}] K`;
  return {
    gamma: { value: p("gamma").value, stdError: p("gamma").stdError },
    beta: { value: p("beta").value, stdError: p("beta").stdError },
    covGammaBeta: cov ?? null,
    source: `C = γT + βT³ fitted to ${fit.window.nPoints} points of ${data.file} in ${window}, ${describeWeighting(data.weighting)}`,
    fitted: { file: data.file, tMinK: fit.window.tMinK, tMaxK: fit.window.tMaxK, nPoints: fit.window.nPoints, reducedChiSquare: fit.weighted ? fit.reducedChiSquare : null, weighting: describeWeighting(data.weighting) },
    warnings: fit.warnings.map((w) => `C = γT + βT³ on ${window}: ${w}`),
  };
}
