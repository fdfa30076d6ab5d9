/**
 * The step results the notebook charts read, as the server stores them (JSON, SI units): the
 * engine's own result types (lib/engine/notebook/registry.ts), imported as types only, so
 * nothing here computes physics and nothing is copied by hand.
 */
import type { StepResult } from "../../engine/notebook/registry";
import type { HeatCapacityFitResult } from "../../engine/fit/heatCapacity";
import type { ScanResult } from "../../engine/scan";
import type { FitParameter } from "../../engine/fit/result";
import type { Quantity } from "../../engine/uncertainty/quantity";
import type { PackedSources, PointSource } from "../../engine/notebook/pointSource";

export type { PackedSources, PointSource };

export type MoleBasis = "formula-unit" | "atom";

export type FitStepResult = StepResult<"fit">;
/** What the fit charts draw (a stored fit step result, or the report's copy of its plot data). */
export type FitPlotData = Pick<FitStepResult, "basis" | "window" | "points" | "curve" | "scan"> & {
  fit: Pick<HeatCapacityFitResult, "residuals"> & { window: Pick<HeatCapacityFitResult["window"], "indices"> };
};
export type FitWeighting = FitStepResult["weighting"];
/** The model-and-window recommendation as the fit step stores it (SI). */
export type StoredRecommendation = NonNullable<FitStepResult["recommendation"]>;
/** One candidate's window in the stored recommendation (SI). */
export type StoredCandidateCell = StoredRecommendation["candidates"][number]["cells"][number];
export type AddendaStepResult = StepResult<"addenda">;
export type TransitionStepResult = StepResult<"transition">;
export type EntropyStepResult = StepResult<"entropy">;
export type DeriveStepResult = StepResult<"derive">;
export type NormaliseStepResult = StepResult<"normalise">;
export type DataStepResult = StepResult<"data">;
export type LatticeStepResult = StepResult<"lattice">;
export type JointFitStepResult = StepResult<"joint-fit">;
export type GammaFieldStepResult = StepResult<"gamma-field">;

export type { Quantity, ScanResult, HeatCapacityFitResult, FitParameter };
