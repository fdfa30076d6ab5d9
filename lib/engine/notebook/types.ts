/**
 * The analysis notebook as pure data: an ordered chain of steps, each computed from the steps
 * above it and the records it names. Nothing here reads a database; the server loads the
 * records into a ChainContext and stores what `computeStep` returns.
 */

/** A measurement as the chain sees it (SI values, per its basis). */
export interface ChainMeasurement {
  id: string;
  label: string;
  kind: "sample" | "addenda";
  basis: "sample" | "molar" | "specific";
  fieldT: number;
  sha256: string;
  /** Number of points (set when the arrays are not loaded, e.g. for hashing only). */
  pointCount?: number;
  temperatureK: readonly number[];
  heatCapacity: readonly number[];
  sigma: readonly number[] | null;
}

/** The sample fields steps may use; each step's hash covers only those it reads. */
export interface ChainSample {
  id: string;
  label: string;
  formula: string;
  molarMassGPerMol: number;
  atomsPerFormulaUnit: number;
  massMg: number | null;
  densityGPerCm3: number | null;
  valences: Record<string, number>;
}

export interface ChainContext {
  sample: ChainSample;
  measurements: Record<string, ChainMeasurement>;
}

/**
 * The working curve handed down the chain. `unit` says what C is: J/K for the whole sample,
 * J/(mol K) per mole formula unit or per mole of atoms once normalised, J/(kg K) if specific.
 */
export interface Dataset {
  temperatureK: number[];
  heatCapacity: number[];
  sigma: number[] | null;
  basis: "sample" | "formula-unit" | "atom" | "specific";
  fieldT: number;
  /** Index of each point in its source measurement, for annotations and exclusions. */
  source: { measurementId: string; index: number }[];
  /** Label and field of each measurement in the curve, in the data step's order (absent in states stored before it existed). */
  measurements?: { id: string; label: string; fieldT: number }[];
}

/** The fit summary handed down to derived-quantity steps (SI values). */
export interface FitSummary {
  stepId: string;
  model: string;
  basis: Dataset["basis"];
  /** systematicError: from the model-and-window recommendation (scan/recommend.ts) when the fit is the recommended one. */
  gamma: { value: number; stdError: number | null; systematicError?: number | null } | null;
  beta: { value: number; stdError: number | null; systematicError?: number | null } | null;
  covGammaBeta: number | null;
  tMinK: number;
  tMaxK: number;
  fieldT: number;
}

/** What a joint fit across measurements hands down (SI values; the chain fills in stepId). */
export interface JointFitSummary {
  stepId: string;
  model: string;
  basis: Dataset["basis"];
  /** Parameters shared by every measurement, by name. */
  shared: Record<string, { value: number; stdError: number | null }>;
  /** Each measurement with its field, window and own (per-measurement) parameters. */
  measurements: { measurementId: string; label: string; fieldT: number; tMinK: number; tMaxK: number; parameters: Record<string, { value: number; stdError: number | null }> }[];
}

/** What flows from one step to the next. */
export interface ChainState {
  dataset: Dataset | null;
  fit: FitSummary | null;
  /** Fits above, by step id, so a transition step can name the normal-state fit. */
  fits: Record<string, FitSummary>;
  /** The nearest joint fit above, and all of them by step id (absent in states stored before they existed). */
  jointFit?: JointFitSummary | null;
  jointFits?: Record<string, JointFitSummary>;
}

export interface StepSpec {
  id: string;
  kind: StepKind;
  config: unknown;
}

/** Kinds, configurations, results and outputs come from the registry (one list of kinds). */
export type { StepKind, StepConfig, StepConfigInput, StepResult, StepOutput, StepOutputOf } from "./registry";
import type { StepKind } from "./registry";

/** The records a step reads outside the chain: hashed into its input hash. */
export interface StepDependencies {
  measurementIds: string[];
  sampleFields: (keyof ChainSample)[];
}
