/**
 * compareModels: fit several models to the same window and rank them by AICc.
 * ΔAICc_i = AICc_i − min AICc; Akaike weight w_i = exp(−ΔAICc_i/2) / Σ_j exp(−ΔAICc_j/2);
 * BIC and ΔBIC beside them. Models whose fit did not converge are listed last with null
 * statistics. Reference: Burnham & Anderson, Model Selection and Multimodel Inference
 * (2nd ed., 2002), §2.
 */
import { fitHeatCapacity, type HeatCapacityFitOptions, type HeatCapacityFitResult, type HeatCapacityInput } from "../fit/heatCapacity";

export interface ModelComparisonRow {
  readonly model: string;
  readonly converged: boolean;
  readonly nFree: number;
  readonly reducedChiSquare: number | null;
  readonly aicc: number | null;
  readonly deltaAicc: number | null;
  readonly akaikeWeight: number | null;
  readonly bic: number | null;
  readonly deltaBic: number | null;
  readonly fit: HeatCapacityFitResult;
}

/** Rank `modelNames` on the window {tMinK, tMaxK}. */
export function compareModels(
  data: HeatCapacityInput,
  modelNames: readonly string[],
  window: { readonly tMinK?: number; readonly tMaxK?: number } = {},
  options: Omit<HeatCapacityFitOptions, "model" | "tMinK" | "tMaxK"> = {},
): readonly ModelComparisonRow[] {
  const fits = modelNames.map((model) => fitHeatCapacity(data, { ...options, model, ...window }));
  const ok = fits.filter((f) => f.converged && f.aicc !== null);
  const minA = Math.min(...ok.map((f) => f.aicc!));
  const minB = Math.min(...ok.map((f) => f.bic!));
  const total = ok.reduce((s, f) => s + Math.exp(-(f.aicc! - minA) / 2), 0);
  const rows = fits.map((f, k): ModelComparisonRow => {
    const good = f.converged && f.aicc !== null;
    return Object.freeze({
      model: modelNames[k],
      converged: f.converged,
      nFree: f.nFree,
      reducedChiSquare: f.reducedChiSquare,
      aicc: good ? f.aicc : null,
      deltaAicc: good ? f.aicc! - minA : null,
      akaikeWeight: good ? Math.exp(-(f.aicc! - minA) / 2) / total : null,
      bic: good ? f.bic : null,
      deltaBic: good && f.bic !== null ? f.bic - minB : null,
      fit: f,
    });
  });
  return Object.freeze(rows.sort((a, b) => (a.deltaAicc ?? Infinity) - (b.deltaAicc ?? Infinity)));
}
