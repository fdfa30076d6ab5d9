/**
 * Result values as people read them (display only), by the one display rule (lib/display):
 * "J/(mol*K^2)" (the fit's SI) becomes mJ mol⁻¹ K⁻² (×1000, the unit of γ), caret exponents
 * become superscripts, "1" disappears, no e-notation.
 */
import { formatQuantity } from "@/lib/display";

const SI_MOLAR = /^J\/\(mol\*K\^(\d)\)$/;

/** "4.1044(68) mJ mol⁻¹ K⁻²" from a value, its standard error and its unit text. */
export function valueText(value: number, stdError: number | null, unit: string): string {
  if (SI_MOLAR.test(unit.replace(/\s+/g, ""))) return formatQuantity(value * 1e3, stdError === null ? null : stdError * 1e3, `m${unit.replace(/\s+/g, "")}`);
  return formatQuantity(value, stdError, unit);
}
