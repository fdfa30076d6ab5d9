/**
 * Conduction-electron density n [m⁻³] of a metal, from its mass density or from its
 * lattice parameters. Two input types, one per route, so the units are never ambiguous.
 */
import { AVOGADRO_PER_MOL } from "../constants";
import { invalid } from "../errors";
import { requirePositive } from "./measured";

/** Route 1: mass density and formula. */
export interface MassDensityInput {
  readonly densityGPerCm3: number;
  readonly molarMassGPerMol: number;
  /** Conduction electrons per formula unit, z = Σ amount × valence. */
  readonly electronsPerFormulaUnit: number;
}

export type CubicOrHexagonal = "sc" | "bcc" | "fcc" | "hcp";

/** Route 2: lattice parameter(s) and structure. */
export interface LatticeInput {
  readonly structure: CubicOrHexagonal;
  /** Conventional-cell edge a [Å]. */
  readonly aAngstrom: number;
  /** c/a for hcp (required there; ideal packing is √(8/3) ≈ 1.633). */
  readonly cOverA?: number;
  readonly atomsPerFormulaUnit: number;
  readonly electronsPerFormulaUnit: number;
  /** Formula units per conventional cell; default atomsPerCell / atomsPerFormulaUnit. */
  readonly formulaUnitsPerCell?: number;
}

/** Atoms (lattice sites) per conventional cell: sc 1, bcc 2, fcc 4, hcp 2. */
export const ATOMS_PER_CONVENTIONAL_CELL: Readonly<Record<CubicOrHexagonal, number>> = Object.freeze({ sc: 1, bcc: 2, fcc: 4, hcp: 2 });

/**
 * n = z ρ N_A / M [m⁻³], ρ converted g/cm³ → kg/m³ and M g/mol → kg/mol.
 * Throws InputError when ρ or M is ≤ 0 or z < 0 (z = 0 gives n = 0, an insulator).
 */
export function electronDensityFromMassDensity(input: MassDensityInput): number {
  const rho = requirePositive(input.densityGPerCm3, "density") * 1e3;
  const molarMass = requirePositive(input.molarMassGPerMol, "molarMass") * 1e-3;
  const z = checkElectrons(input.electronsPerFormulaUnit);
  return (z * rho * AVOGADRO_PER_MOL) / molarMass;
}

/**
 * Conventional-cell volume [m³]: a³ for cubic, (√3/2) a² c for hcp.
 * Throws InputError if a ≤ 0 or, for hcp, c/a missing or ≤ 0.
 */
export function conventionalCellVolume(structure: CubicOrHexagonal, aAngstrom: number, cOverA?: number): number {
  const a = requirePositive(aAngstrom, "latticeA") * 1e-10;
  if (structure !== "hcp") return a ** 3;
  if (cOverA === undefined) throw invalid("cOverA", "missing", "hcp needs c/a");
  return (Math.sqrt(3) / 2) * a * a * a * requirePositive(cOverA, "cOverA");
}

/**
 * n = (formula units per cell) × z / V_cell [m⁻³]. Throws InputError on an unknown structure,
 * a non-positive a, missing c/a for hcp, or a negative z.
 */
export function electronDensityFromLattice(input: LatticeInput): number {
  const sites = ATOMS_PER_CONVENTIONAL_CELL[input.structure];
  if (sites === undefined) throw invalid("structure", input.structure, "expected sc, bcc, fcc or hcp");
  const perCell = input.formulaUnitsPerCell ?? sites / requirePositive(input.atomsPerFormulaUnit, "atomsPerFormulaUnit");
  requirePositive(perCell, "formulaUnitsPerCell");
  const z = checkElectrons(input.electronsPerFormulaUnit);
  return (perCell * z) / conventionalCellVolume(input.structure, input.aAngstrom, input.cOverA);
}

function checkElectrons(z: number): number {
  if (!Number.isFinite(z) || z < 0) throw invalid("electronsPerFormulaUnit", z, "must be ≥ 0");
  return z;
}
