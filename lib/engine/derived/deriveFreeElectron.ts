/**
 * The free-electron part of deriveAll: n from density or lattice, the Fermi-gas parameters,
 * γ_free, m* / m and the room-temperature electronic-to-classical ratio.
 */
import { ELECTRONVOLT_J } from "../constants";
import { quantity, type Quantity } from "../uncertainty";
import { electronDensityFromLattice, electronDensityFromMassDensity, type LatticeInput } from "./electronDensity";
import { electronicToClassicalRatio, freeElectronGas, gammaFree } from "./freeElectron";
import { thermalMassRatio } from "./effectiveMass";
import { MILLI_PER_UNIT, type Measured } from "./measured";

export type LatticeSpec = Omit<LatticeInput, "atomsPerFormulaUnit" | "electronsPerFormulaUnit">;

/** Where n comes from: mass density [g/cm³], lattice parameters, or both (density wins, lattice cross-checks). */
export interface FreeElectronSource {
  readonly densityGPerCm3?: number;
  readonly lattice?: LatticeSpec;
}

interface Needs {
  readonly gamma: Measured;
  readonly formula: { atomsPerFormulaUnit: number; molarMassGPerMol: number; electronsPerFormulaUnit?: number };
  readonly free?: FreeElectronSource;
  readonly roomTemperatureK?: number;
}

/**
 * Free-electron quantities (display units) and m* / m; pushes a warning when a source of n
 * is given but z is not, or when density and lattice disagree by more than 5 %.
 * Throws InputError on invalid density/lattice values.
 */
export function freeElectronQuantities(input: Needs, perBasis: number, warnings: string[]): { quantities: Quantity[]; massRatio?: number } {
  const src = input.free;
  if (!src || (src.densityGPerCm3 === undefined && !src.lattice)) return { quantities: [] };
  const z = input.formula.electronsPerFormulaUnit;
  if (z === undefined || z <= 0) {
    warnings.push("free-electron comparison skipped: conduction electrons per formula unit unknown or zero (give valences)");
    return { quantities: [] };
  }
  const n = electronDensity(input, src, z, warnings);
  const gas = freeElectronGas(n);
  const g0 = gammaFree(gas.fermiTemperatureK, z);
  const ratio = thermalMassRatio(input.gamma, g0);
  const T = input.roomTemperatureK ?? 300;
  const qs = [
    quantity("electronDensity", "n", n, null, "m^-3", `z = ${z} conduction electrons per formula unit`),
    quantity("fermiWavevector", "k_F", gas.fermiWavevectorPerM * 1e-10, null, "Å^-1"),
    quantity("fermiEnergy", "E_F", gas.fermiEnergyJ / ELECTRONVOLT_J, null, "eV", "free-electron value, bare m_e"),
    quantity("fermiTemperature", "T_F", gas.fermiTemperatureK, null, "K"),
    quantity("fermiVelocity", "v_F", gas.fermiVelocityMPerS, null, "m s^-1"),
    quantity("rsOverA0", "r_s/a_0", gas.rsOverA0, null, "1"),
    quantity("gammaFree", "γ_free", g0 * MILLI_PER_UNIT * perBasis, null, "mJ mol^-1 K^-2", "(π²/2) z R / T_F"),
    ratio,
    quantity("electronicToClassical", "C_el/(3/2 zR)", electronicToClassicalRatio(T, gas.fermiTemperatureK), null, "1", `at ${T} K: (π²/3) T/T_F, why γ needs low temperatures`),
  ];
  return { quantities: qs, massRatio: ratio.value };
}

function electronDensity(input: Needs, src: FreeElectronSource, z: number, warnings: string[]): number {
  const fromLattice = src.lattice
    ? electronDensityFromLattice({ ...src.lattice, atomsPerFormulaUnit: input.formula.atomsPerFormulaUnit, electronsPerFormulaUnit: z })
    : undefined;
  if (src.densityGPerCm3 === undefined) return fromLattice as number;
  const fromDensity = electronDensityFromMassDensity({ densityGPerCm3: src.densityGPerCm3, molarMassGPerMol: input.formula.molarMassGPerMol, electronsPerFormulaUnit: z });
  if (fromLattice !== undefined && Math.abs(fromLattice / fromDensity - 1) > 0.05) {
    warnings.push(`electron density from the lattice (${fromLattice.toPrecision(3)} m^-3) differs from the mass-density value (${fromDensity.toPrecision(3)} m^-3) by more than 5 %: check the structure, a, or the density; the density value is used`);
  }
  return fromDensity;
}
