/**
 * Conversion to SI at the input edge: temperature in K, heat capacity in J/K, J/(mol K) or
 * J/(kg K) according to its basis, magnetic field in T. Factors come from mathjs unit
 * conversion (one conversion of 1 unit, then a multiply per value).
 */
import { VACUUM_PERMEABILITY_N_PER_A2 } from "../constants";
import { invalid } from "../errors";
import type { Location } from "../errors";
import { unitMath } from "./mathjs";
import type { Unit } from "./mathjs";
import { parseUnit } from "./parse";
import type { ParsedUnit } from "./parse";

export type Quantity = "temperature" | "heatCapacity" | "field";
/** "sample": extensive J/K; "molar": J/(mol K) (per mole formula unit or atoms — the unit cannot tell); "specific": J/(kg K). */
export type HeatCapacityBasis = "sample" | "molar" | "specific";

const HEAT_CAPACITY_SI: Record<HeatCapacityBasis, string> = { sample: "J/K", molar: "J/(mol K)", specific: "J/(kg K)" };
const REFERENCE = {
  kelvin: unitMath.unit("K"), tesla: unitMath.unit("T"), amperePerMetre: unitMath.unit("A/m"),
  sample: unitMath.unit("J/K"), molar: unitMath.unit("J/(mol K)"), specific: unitMath.unit("J/(kg K)"),
};

function asParsed(unit: string | ParsedUnit, where?: Location): ParsedUnit {
  return typeof unit === "string" ? parseUnit(unit, where) : unit;
}

function hasOffset(unit: Unit): boolean {
  return unit.units.some((u) => u.unit.offset !== 0);
}

/**
 * Basis of a heat-capacity unit: J/K-like → "sample", J/(mol K)-like → "molar",
 * J/(g K)-like → "specific". Throws InputError naming the unit text for any other
 * dimension or a temperature scale with an offset (J/degC).
 */
export function heatCapacityBasis(unit: string | ParsedUnit, where?: Location): HeatCapacityBasis {
  const p = asParsed(unit, where);
  const at = where ?? { field: "unit" };
  if (hasOffset(p.unit)) throw invalid("unit", p.text, "use kelvin, not a temperature scale with an offset", at);
  for (const basis of ["sample", "molar", "specific"] as const) if (p.unit.equalBase(REFERENCE[basis])) return basis;
  throw invalid("unit", p.text, "not a heat-capacity unit (expected e.g. J/K, mJ/(mol K) or J/(g K))", at);
}

/** The SI unit that `toSI` returns for a quantity given in `unit`, e.g. "J/(mol K)". */
export function siUnitOf(unit: string | ParsedUnit, quantity: Quantity, where?: Location): string {
  if (quantity === "temperature") return "K";
  if (quantity === "field") return "T";
  return HEAT_CAPACITY_SI[heatCapacityBasis(unit, where)];
}

/** SI factor: value_in_SI = factor × value_in_unit. */
export function siFactor(unit: string | ParsedUnit, quantity: Quantity, where?: Location): number {
  const p = asParsed(unit, where);
  const at = where ?? { field: "unit" };
  const one = unitMath.unit(1, p.expression);
  switch (quantity) {
    case "temperature": {
      const absolute = p.unit.units.length === 1 && p.unit.units[0].power === 1 && p.unit.units[0].unit.name === "K";
      if (hasOffset(p.unit)) throw invalid("unit", p.text, "C(T) needs absolute temperature: use K or mK, not °C or °F", at);
      if (!absolute) throw invalid("unit", p.text, "not an absolute temperature unit (use K or mK)", at);
      return one.toNumber("K");
    }
    case "field":
      if (p.unit.equalBase(REFERENCE.tesla)) return one.toNumber("T");
      if (p.unit.equalBase(REFERENCE.amperePerMetre)) return one.toNumber("A/m") * VACUUM_PERMEABILITY_N_PER_A2;
      throw invalid("unit", p.text, "not a magnetic-field unit (expected T, mT, G, kG, Oe, kOe or A/m)", at);
    case "heatCapacity":
      return one.toNumber(siUnitOf(p, "heatCapacity", where));
    default:
      throw invalid("quantity", quantity, "expected temperature, heatCapacity or field");
  }
}

/**
 * Convert values given in `unitText` to SI for `quantity`:
 *   temperature → K (absolute scales only: K, mK, …; °C/°F refused with a message);
 *   heatCapacity → J/K, J/(mol K) or J/(kg K), keeping the basis of the unit (see heatCapacityBasis);
 *   field → T. A field strength H given in Oe, kOe or A/m is returned as μ0H, the flux density
 *   it produces in vacuum, with μ0 = 1.25663706212e-6 N/A² (CODATA 2018), so 1 Oe → 1.0000000006e-4 T
 *   (the familiar 1 Oe ≙ 1 G = 1e-4 T in vacuum); G and kG are flux densities and convert directly.
 * The input array is not mutated. Throws InputError naming the unit text for unknown or
 * incompatible units, and naming the index for a non-finite value.
 */
export function toSI(values: readonly number[], unitText: string | ParsedUnit, quantity: Quantity, where?: Location): number[] {
  const factor = siFactor(unitText, quantity, where);
  const out = new Array<number>(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v)) throw invalid(`${quantity}[${i}]`, v, "not a finite number", where);
    out[i] = v * factor;
  }
  return out;
}
