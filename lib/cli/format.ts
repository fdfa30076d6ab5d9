/** Text-mode typesetting for the `heatbook` commands (JSON keeps the plain ASCII unit strings). */

const SUPER: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", ".": "·" };

/** "mJ mol^-1 K^-2" → "mJ mol⁻¹ K⁻²"; a unit of "1" (dimensionless) → "". */
export function prettyUnit(unit: string): string {
  if (unit === "1") return "";
  return unit.replace(/\^(-?\d+)/g, (_, e: string) => [...e].map((c) => SUPER[c] ?? c).join(""));
}
