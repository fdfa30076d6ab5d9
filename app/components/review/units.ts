/**
 * Result values as people read them (display only): "J/(mol*K^2)" (the fit's SI) becomes
 * mJ mol⁻¹ K⁻² (×1000, the unit of γ), caret exponents become superscripts, "1" disappears.
 */
import { formatUncertainty } from "@/lib/engine/units/format";
import { prettyUnit } from "@/lib/charts/notebook";

const SI_MOLAR = /^J\/\(mol\*K\^(\d)\)$/;

/** "4.1044(68) mJ mol⁻¹ K⁻²" from a value, its standard error and its unit text. */
export function valueText(value: number, stdError: number | null, unit: string): string {
  const m = SI_MOLAR.exec(unit.replace(/\s+/g, ""));
  if (m) return `${formatUncertainty(value * 1e3, stdError === null ? null : stdError * 1e3)} mJ mol⁻¹ K${prettyUnit(`^-${m[1]}`)}`;
  const u = unit === "1" || !unit ? "" : ` ${prettyUnit(unit)}`;
  return `${formatUncertainty(value, stdError)}${u}`;
}
