/**
 * Cells of a candidate that has no fast path (a nonlinear registry model, or the user's own
 * expression): each window fitted on its own by fitHeatCapacity (QR for linear models,
 * Levenberg–Marquardt from the model's guess or the given start otherwise). γ is the
 * parameter named gamma (or gammaN, or g for an expression), β the one named beta (or b).
 * A window whose fit fails or throws an InputError is not usable, with the reason as note.
 */
import { InputError } from "../errors";
import { fitHeatCapacity, type HeatCapacityFitOptions } from "../fit/heatCapacity";
import { cellFrom, failedCell, type CandidateCell } from "./candidateCell";
import type { SortedSeries } from "./linearCells";
import type { RecommendWindow } from "./recommendGrid";

const GAMMA_NAMES = ["gamma", "gammaN", "g"];
const BETA_NAMES = ["beta", "b"];

/** Cells of `model` (registry name or {expression}) on `windows`. */
export function generalCandidateCells(
  s: SortedSeries, windows: readonly RecommendWindow[], model: HeatCapacityFitOptions["model"], options: Omit<HeatCapacityFitOptions, "model" | "tMinK" | "tMaxK">, level: number,
): CandidateCell[] {
  return windows.map((w) => {
    const k = w.hi - w.lo + 1;
    const sl = (a: Float64Array) => a.subarray(w.lo, w.hi + 1);
    let fit;
    try {
      fit = fitHeatCapacity({ temperatureK: sl(s.T), heatCapacity: sl(s.C), sigma: s.S ? sl(s.S) : undefined }, { ...options, model });
    } catch (e) {
      if (e instanceof InputError) return failedCell(w.tMinK, w.tMaxK, k, 0, e.message);
      throw e;
    }
    if (!fit.converged) return failedCell(w.tMinK, w.tMaxK, k, fit.nFree, `fit did not converge: ${fit.message}`);
    const free = fit.parameters.filter((p) => !p.fixed);
    const rename = (name: string) => (GAMMA_NAMES.includes(name) ? "gamma" : BETA_NAMES.includes(name) ? "beta" : name);
    const values = Object.fromEntries(free.map((p) => [rename(p.name), p.value]));
    // rawStdErrors must be unscaled: fitHeatCapacity already scaled unweighted fits by √χ²_red
    const unscale = !fit.weighted && fit.reducedChiSquare ? 1 / Math.sqrt(fit.reducedChiSquare) : 1;
    const rawStdErrors = Object.fromEntries(free.map((p) => [rename(p.name), p.stdError === null ? null : p.stdError * unscale]));
    const y = sl(s.C);
    const fitted = Float64Array.from(fit.residuals, (r, i) => y[i] - (r ?? NaN));
    return cellFrom(s, w.lo, w.hi, w.tMinK, w.tMaxK, { values, rawStdErrors, fitted, nFree: fit.nFree }, level);
  });
}
