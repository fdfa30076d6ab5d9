/**
 * deriveAll: every secondary quantity from one fit's γ and β (and whatever else is known),
 * composed from the one-concept modules, with σ propagated through the γ–β covariance.
 * The single entry point for the server and the CLI.
 */
import { correlationOf, covariance2, propagate, quantity, type Quantity } from "../uncertainty";
import { debyeTemperature } from "./debye";
import { densityOfStates } from "./dos";
import { checkMeasured, MILLI_PER_UNIT, varianceOf, type Measured } from "./measured";
import { freeElectronQuantities, type FreeElectronSource } from "./deriveFreeElectron";
import { couplingQuantities, magneticQuantities, type CouplingInput, type MagneticInput } from "./deriveCoupling";
import { coefficientWarnings, derivedWarnings } from "./plausibility";

export type MoleBasis = "formula-unit" | "atom";

export interface FormulaInfo {
  readonly atomsPerFormulaUnit: number;
  readonly molarMassGPerMol: number;
  /** z = Σ amount × valence; needed for the free-electron comparison only. */
  readonly electronsPerFormulaUnit?: number;
  readonly label?: string;
}

export interface DeriveInput extends CouplingInput, MagneticInput {
  /** γ [J mol⁻¹ K⁻²] and β [J mol⁻¹ K⁻⁴] per mole formula unit, from one fit. */
  readonly gamma: Measured;
  readonly beta: Measured;
  /** cov(γ, β) [J² mol⁻² K⁻⁶] from the fit; 0 (uncorrelated) when omitted. */
  readonly covGammaBeta?: number;
  readonly formula: FormulaInfo;
  /** Display basis; default "formula-unit". Θ_D, m* / m, λ do not depend on it. */
  readonly basis?: MoleBasis;
  readonly free?: FreeElectronSource;
  /** Temperature for the electronic-to-classical contrast [K]; default 300. */
  readonly roomTemperatureK?: number;
}

export interface DerivedResult {
  readonly basis: MoleBasis;
  readonly quantities: readonly Quantity[];
  readonly warnings: readonly string[];
}

/**
 * Quantities (display units: mJ mol⁻¹ K⁻², mJ mol⁻¹ K⁻⁴, K, states eV⁻¹, eV, Å⁻¹, m s⁻¹,
 * μΩ cm K² mol² mJ⁻²) and warnings. Throws InputError on non-finite inputs, r ≤ 0, or a
 * covariance inconsistent with the σ's (|ρ| > 1). Non-physical fit values (γ < 0, β ≤ 0)
 * are warnings; what cannot be computed from them is left out.
 */
export function deriveAll(input: DeriveInput): DerivedResult {
  checkMeasured(input.gamma, "gamma");
  checkMeasured(input.beta, "beta");
  const basis = input.basis ?? "formula-unit";
  const r = input.formula.atomsPerFormulaUnit;
  const perBasis = basis === "atom" ? 1 / r : 1;
  const cov = covariance2(Math.sqrt(varianceOf(input.gamma)), Math.sqrt(varianceOf(input.beta)), input.covGammaBeta ?? 0);
  const note = basis === "atom" ? "per mole of atoms" : `per mole formula unit${input.formula.label ? ` (${input.formula.label})` : ""}`;
  const qs: Quantity[] = [
    display("gamma", "γ", input.gamma, MILLI_PER_UNIT * perBasis, "mJ mol^-1 K^-2", note),
    display("beta", "β", input.beta, MILLI_PER_UNIT * perBasis, "mJ mol^-1 K^-4", note),
  ];
  const thetaD = input.beta.value > 0 ? debyeTemperature(input.beta, r) : undefined;
  if (thetaD) qs.push(thetaD);
  if (thetaD && input.gamma.value > 0) qs.push(crossover(input, cov));
  qs.push(densityOfStates({ value: input.gamma.value * perBasis, stdError: input.gamma.stdError === null ? null : input.gamma.stdError * perBasis }, basis === "atom" ? "atom" : "f.u."));
  const warnings: string[] = [];
  const free = freeElectronQuantities(input, perBasis, warnings);
  qs.push(...free.quantities);
  const coupling = couplingQuantities(input, cov, warnings);
  qs.push(...coupling.quantities, ...magneticQuantities(input));
  const pl = {
    gammaMJ: input.gamma.value * MILLI_PER_UNIT,
    gammaSigmaMJ: input.gamma.stdError === null ? null : input.gamma.stdError * MILLI_PER_UNIT,
    gammaPerAtomMJ: (input.gamma.value * MILLI_PER_UNIT) / r,
    betaMJ: input.beta.value * MILLI_PER_UNIT,
    betaSigmaMJ: input.beta.stdError === null ? null : input.beta.stdError * MILLI_PER_UNIT,
    correlationGammaBeta: input.covGammaBeta === undefined ? undefined : correlationOf(cov, 0, 1),
    thetaDK: thetaD?.value,
    massRatio: free.massRatio,
    lambda: coupling.lambda,
  };
  warnings.unshift(...coefficientWarnings(pl), ...derivedWarnings(pl));
  return Object.freeze({ basis, quantities: Object.freeze(qs), warnings: Object.freeze(warnings) });
}

function display(name: string, symbol: string, m: Measured, factor: number, unit: string, note: string): Quantity {
  return quantity(name, symbol, m.value * factor, m.stdError === null ? null : m.stdError * factor, unit, note);
}

/** T* = √(γ/β), where γT = βT³: the electronic term dominates below it. Uses cov(γ, β). */
function crossover(input: DeriveInput, cov: number[][]): Quantity {
  const r = propagate(([g, b]) => Math.sqrt(g / b), [input.gamma.value, input.beta.value], cov);
  const known = input.gamma.stdError !== null || input.beta.stdError !== null;
  return quantity("crossoverT", "T*", r.value, known ? r.stdError : null, "K", "γT = βT³ at T* = √(γ/β); σ includes cov(γ, β)");
}
