/**
 * parseUnit: unit text from headers or forms → a mathjs unit. Besides mathjs syntax
 * ("J/(mol K)", "J/mol/K", "J K^-1 mol^-1") it reads common instrument spellings:
 *   µ or μ for micro ("µJ/K" = "uJ/K"); "·", "⋅", "×" and "-" or "." between letters as
 *   products ("J/mol-K", "J/mol.K"); exponents written "K-1", "K2", "K⁻¹", "K²";
 *   "°C", "℃", "°F" (recognised so they can be refused for absolute temperature);
 *   a single unbracketed "/" followed by several factors puts all of them in the
 *   denominator: "J/mol K" = J/(mol K), the way such labels are meant (common practice;
 *   strict left-to-right reading would give J·K/mol, never a heat-capacity unit).
 */
import { invalid } from "../errors";
import type { Location } from "../errors";
import { unitMath } from "./mathjs";
import type { Unit } from "./mathjs";

export interface ParsedUnit {
  /** The text as given. */
  text: string;
  /** The normalised mathjs expression that was parsed. */
  expression: string;
  /** The mathjs unit (value null). */
  unit: Unit;
}

const SUPERSCRIPTS: Record<string, string> = { "⁻": "-", "⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7", "⁸": "8", "⁹": "9" };

/** Rewrite instrument spellings into mathjs unit syntax (see the file header). */
export function normaliseUnitText(text: string): string {
  let s = text.trim();
  if (/^\[.*\]$/.test(s) || (/^\(.*\)$/.test(s) && balanced(s.slice(1, -1)))) s = s.slice(1, -1).trim();
  s = s.replace(/[µμ]/g, "u").replace(/[·⋅×]/g, " ").replace(/℃|°\s*C\b/g, "degC").replace(/°\s*F\b/g, "degF");
  s = s.replace(/[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+/g, (m) => "^" + [...m].map((c) => SUPERSCRIPTS[c]).join(""));
  s = s.replace(/([A-Za-z])[-.](?=[A-Za-z])/g, "$1 ");
  s = s.replace(/([A-Za-z])(-?\d+)/g, "$1^$2");
  s = s.replace(/\s*\*\s*/g, " ").replace(/\s+/g, " ").trim();
  const slash = s.indexOf("/");
  if (slash >= 0 && s.indexOf("/", slash + 1) < 0 && !s.includes("(")) {
    const denominator = s.slice(slash + 1).trim();
    if (/\s/.test(denominator)) s = `${s.slice(0, slash).trim()}/(${denominator})`;
  }
  return s;
}

function balanced(s: string): boolean {
  let depth = 0;
  for (const c of s) {
    if (c === "(") depth++;
    else if (c === ")" && --depth < 0) return false;
  }
  return depth === 0;
}

/**
 * Parse unit text. Throws InputError `invalid unit: "…" (why)` for empty text, text with a
 * number in front ("2 K"), or a unit mathjs does not know; `where` defaults to field "unit".
 */
export function parseUnit(text: string, where?: Location): ParsedUnit {
  if (typeof text !== "string" || text.trim() === "") throw invalid("unit", text, "empty unit text", where ?? { field: "unit" });
  const expression = normaliseUnitText(text);
  let unit: Unit;
  try {
    unit = unitMath.unit(expression);
  } catch (e) {
    throw invalid("unit", text, `unknown unit: ${(e as Error).message}`, where ?? { field: "unit" });
  }
  if (unit.value !== null) throw invalid("unit", text, "unit text must not contain a number", where ?? { field: "unit" });
  return { text, expression, unit };
}
