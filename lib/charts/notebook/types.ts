/**
 * The step results the notebook charts read, as the server stores them (JSON, SI units).
 * Type-only mirrors of the engine's result objects (lib/engine/notebook/steps/*): nothing here
 * computes physics.
 */
import type { HeatCapacityFitResult } from "../../engine/fit/heatCapacity";
import type { ScanResult } from "../../engine/scan";
import type { ModelComparisonRow, Recommendation } from "../../engine/scan";
import type { FitParameter } from "../../engine/fit/result";
import type { Quantity } from "../../engine/uncertainty/quantity";
import type { IntegratedCurve } from "../../engine/thermo/entropy";

export type MoleBasis = "formula-unit" | "atom";

import type { PackedSources, PointSource } from "../../engine/notebook/pointSource";
export type { PackedSources, PointSource };

/** Result of a fit step (lib/engine/notebook/steps/fit.ts). */
export interface FitStepResult {
  fit: HeatCapacityFitResult;
  basis: MoleBasis;
  window: { tMinK: number; tMaxK: number; requestedMinK: number | null; requestedMaxK: number | null; nPoints: number };
  points: { temperatureK: number[]; heatCapacity: number[]; sigma: number[] | null; inWindow: boolean[]; source: PackedSources | PointSource[] };
  curve: { temperatureK: number[]; heatCapacity: number[] };
  scan: ScanResult | null;
  comparison: (Omit<ModelComparisonRow, "fit"> & { gamma: FitParameter | null; beta: FitParameter | null })[] | null;
  /** Absent in outputs stored before these fields existed. */
  fitVariable?: string;
  weighting?: FitWeighting;
  quality?: { reducedChiSquare: number | null; residualStdDev: number | null; text: string };
  recommendation?: StoredRecommendation | null;
}

export interface FitWeighting {
  kind: "sigma" | "none" | "relative" | "absolute";
  sigmaKnown: boolean;
  text: string;
  relativeSigmaPercent: number | null;
  absoluteSigmaSI: number | null;
}

/** One candidate's window in the stored recommendation (SI). */
export interface StoredCandidateCell {
  tMinK: number;
  tMaxK: number;
  nPoints: number;
  gamma: number | null;
  gammaStdError: number | null;
  aicc: number | null;
  acceptable: boolean;
}

/** The model-and-window recommendation as the fit step stores it (SI). */
export interface StoredRecommendation extends Omit<Recommendation, "candidates"> {
  candidates: { model: string; title: string; acceptableCount: number; cells: StoredCandidateCell[] }[];
}

/** Result of an addenda step: curves in J/K on the sample temperatures. */
export interface AddendaStepResult {
  addendaLabel: string;
  method: "linear" | "smooth";
  maxAddendaFraction: number;
  excluded: unknown[];
  provenance: { parameters?: Record<string, unknown> };
  curve: { temperatureK: number[]; totalJPerK: number[]; addendaJPerK: number[]; netJPerK: number[] };
}

/** Result of a superconducting-transition step (SI: J mol⁻¹ K⁻² for C_el/T). */
export interface TransitionStepResult {
  tc: Quantity;
  deltaC: Quantity;
  jumpRatio: Quantity;
  jumpRatioSuperconductingPart: Quantity | null;
  gammaResidual: Quantity | null;
  nonSuperconductingFraction: Quantity | null;
  bcsJumpRatio: number;
  normalState: "above-tc" | "field-above-hc2";
  windows: { lowerK: number; upperK: number; branchFromK?: number };
  idealised: { temperatureK: number[]; cElOverT: number[] };
  points: { temperatureK: number[]; cElOverT: number[] };
  uncertaintyMethod: string;
  fitStepId: string;
}

/** Result of an entropy step: S in J mol⁻¹ K⁻¹, H − H(0) in J mol⁻¹. */
export interface EntropyStepResult {
  basis: MoleBasis;
  fitStepId: string;
  entropy: IntegratedCurve;
  enthalpy: IntegratedCurve;
}

export interface DeriveStepResult {
  basis: MoleBasis;
  fitStepId: string;
  fitModel: string;
  fitWindow: { tMinK: number; tMaxK: number };
  fieldT: number;
  quantities: Quantity[];
  valences: Record<string, number>;
  densityGPerCm3: number | null;
}

export type { Quantity, ScanResult, HeatCapacityFitResult, FitParameter };
