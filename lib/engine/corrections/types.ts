/**
 * Data shapes of the correction steps. Inputs are never mutated; results are plain JSON-safe data.
 */

/** A heat-capacity curve of a whole sample (or of the empty platform): T [K], C [J/K], σ [J/K]. */
export interface SampleCurve {
  temperatureK: readonly number[];
  heatCapacityJPerK: readonly number[];
  /** Standard uncertainty of each C, same length, > 0. */
  sigma?: readonly number[];
}

/** A molar curve: C [J/(mol K)] per mole formula unit or per mole of atoms, as `per` says. */
export interface MolarCurve {
  temperatureK: number[];
  heatCapacityJPerMolK: number[];
  sigma?: number[];
  per: MolarBasis;
}

export type MolarBasis = "formula-unit" | "atom";

/** What a correction did, for the notebook step and the audit of a reviewed result. */
export interface Provenance {
  step: "addenda-subtraction" | "normalisation";
  method: string;
  parameters: Record<string, number | string | boolean | null | number[]>;
}
