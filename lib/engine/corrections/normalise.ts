/**
 * Normalisation of heat capacities between the sample (J/K), specific (J/(kg K)) and molar
 * (J/(mol K), per mole formula unit or per mole of atoms) bases.
 *
 *   n_f.u. = m / M  (m in g = massMg/1000, M in g/mol),  n_atoms = r · n_f.u.
 *   C_mol = C / n  and  σ_mol = σ / n  point by point.
 *
 * The uncertainties of m and M scale every point by the same factor, so they are NOT added to
 * the per-point σ (that would corrupt a weighted fit): they are reported once as
 * `scaleRelativeUncertainty` = √((u_m/m)² + (u_M/M)²), which applies to γ and β alike.
 */
import { InputError } from "../errors";
import type { MolarBasis, MolarCurve, Provenance, SampleCurve } from "./types";
import { checkCurve, checkPositive } from "./validate";

export interface NormaliseOptions {
  massMg: number;
  molarMassGPerMol: number;
  /** r; needed for per "atom". */
  atomsPerFormulaUnit?: number;
  per: MolarBasis;
  massUncertaintyMg?: number;
  molarMassUncertainty?: number;
}

export interface NormalisedResult extends MolarCurve {
  /** Moles of formula units (or atoms, per "atom") the sample C was divided by. */
  moles: number;
  scaleRelativeUncertainty: number;
  warnings: string[];
  provenance: Provenance;
}

function molesOf(o: NormaliseOptions): number {
  const massG = checkPositive("massMg", o.massMg) / 1000;
  const m = massG / checkPositive("molarMassGPerMol", o.molarMassGPerMol);
  if (o.per === "formula-unit") return m;
  if (o.per === "atom") return m * checkPositive("atomsPerFormulaUnit", o.atomsPerFormulaUnit);
  throw new InputError(`invalid per: ${JSON.stringify(o.per)} (formula-unit or atom)`, { field: "per" });
}

function relative(u: number | undefined, value: number, name: string): number {
  if (u === undefined) return 0;
  if (!(Number.isFinite(u) && u >= 0)) throw new InputError(`invalid ${name}: ${u} (must be finite and ≥ 0)`, { field: name });
  return u / value;
}

/**
 * Sample heat capacity [J/K] → molar [J/(mol K)] per mole formula unit or per mole of atoms.
 * Example (named check): 1000 mg of Cu is 1/63.546 mol (IUPAC 2021 A_r), so 1 J/K → 63.546 J/(mol K).
 * Throws InputError for a non-positive mass, molar mass or r, or inconsistent data.
 */
export function normalise(data: SampleCurve, options: NormaliseOptions): NormalisedResult {
  checkCurve(data, "data");
  const moles = molesOf(options);
  const scale = Math.hypot(relative(options.massUncertaintyMg, options.massMg, "massUncertaintyMg"),
    relative(options.molarMassUncertainty, options.molarMassGPerMol, "molarMassUncertainty"));
  const warnings: string[] = [];
  if (options.per === "atom" && options.atomsPerFormulaUnit === 1) warnings.push("r = 1: per mole of atoms equals per mole formula unit");
  return {
    temperatureK: [...data.temperatureK],
    heatCapacityJPerMolK: data.heatCapacityJPerK.map((c) => c / moles),
    ...(data.sigma ? { sigma: data.sigma.map((s) => s / moles) } : {}),
    per: options.per,
    moles,
    scaleRelativeUncertainty: scale,
    warnings,
    provenance: {
      step: "normalisation", method: "sample-to-molar",
      parameters: { massMg: options.massMg, molarMassGPerMol: options.molarMassGPerMol, atomsPerFormulaUnit: options.atomsPerFormulaUnit ?? null,
        per: options.per, moles, massUncertaintyMg: options.massUncertaintyMg ?? null, molarMassUncertainty: options.molarMassUncertainty ?? null },
    },
  };
}

/** Molar data → the sample heat capacity [J/K] of `massMg` of it (the reverse of normalise). */
export function molarToSample(data: MolarCurve, options: Omit<NormaliseOptions, "per">): SampleCurve & { heatCapacityJPerK: number[] } {
  const moles = molesOf({ ...options, per: data.per });
  return {
    temperatureK: [...data.temperatureK],
    heatCapacityJPerK: data.heatCapacityJPerMolK.map((c) => c * moles),
    ...(data.sigma ? { sigma: data.sigma.map((s) => s * moles) } : {}),
  };
}

/** Molar data per formula unit ↔ per atom: C_atom = C_f.u. / r. */
export function changeMolarBasis(data: MolarCurve, to: MolarBasis, atomsPerFormulaUnit: number): MolarCurve {
  const r = checkPositive("atomsPerFormulaUnit", atomsPerFormulaUnit);
  if (to !== "formula-unit" && to !== "atom") throw new InputError(`invalid per: ${JSON.stringify(to)} (formula-unit or atom)`, { field: "per" });
  const f = (x: number) => (data.per === to ? x : to === "atom" ? x / r : x * r);
  return {
    temperatureK: [...data.temperatureK],
    heatCapacityJPerMolK: data.heatCapacityJPerMolK.map(f),
    ...(data.sigma ? { sigma: data.sigma.map(f) } : {}),
    per: to,
  };
}

/**
 * Specific heat [J/(kg K)] → molar [J/(mol K)]: C_mol = c · M / 1000 (M in g/mol), divided by r per atom.
 */
export function specificToMolar(
  data: { temperatureK: readonly number[]; heatCapacityJPerKgK: readonly number[]; sigma?: readonly number[] },
  options: { molarMassGPerMol: number; atomsPerFormulaUnit?: number; per: MolarBasis },
): MolarCurve {
  checkCurve({ temperatureK: data.temperatureK, heatCapacityJPerK: data.heatCapacityJPerKgK, sigma: data.sigma }, "data");
  const kgPerMol = checkPositive("molarMassGPerMol", options.molarMassGPerMol) / 1000;
  const f = options.per === "atom" ? kgPerMol / checkPositive("atomsPerFormulaUnit", options.atomsPerFormulaUnit) : kgPerMol;
  return {
    temperatureK: [...data.temperatureK],
    heatCapacityJPerMolK: data.heatCapacityJPerKgK.map((c) => c * f),
    ...(data.sigma ? { sigma: data.sigma.map((s) => s * f) } : {}),
    per: options.per,
  };
}
