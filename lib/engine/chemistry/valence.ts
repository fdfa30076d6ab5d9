/**
 * Conduction-electron valences per element and electron counts per formula unit / per atom.
 *
 * Two conventions, both editable per sample (the sample's own valences always win):
 *  "free-electron" (default) — the count used for a free-electron estimate of γ and for
 *     Hume-Rothery e/a: s-block = group number (alkali 1, alkaline earth 2); group 12 = 2;
 *     p-block = group − 10 (Al/Ga/In/Tl 3, Sn/Pb 4, Sb/Bi 5), the values of the usual textbook
 *     table of free-electron metals (Ashcroft & Mermin, Table 1.1, from memory); d-block = the
 *     number of s electrons of the free atom (Cu, Ag, Au, Nb, Mo, Cr, Pt, Ru, Rh 1; Fe, Ni, Ti … 2),
 *     except Pd (5s⁰ in the free atom), for which 1 is used; lanthanides 3 (Eu, Yb 2), actinides
 *     3 (Th 4). Noble gases 0. The d-block, f-block and non-metal values are common practice,
 *     not a physical law.
 *  "group" — d-block elements count s + d electrons (group number: Ti 4, V 5, Nb 5, Mo 6, Cu 11),
 *     the e/a axis of Matthias-rule plots of transition-metal alloys (common practice); other
 *     elements as in "free-electron".
 */
import { invalid } from "../errors";
import { elementBySymbol } from "./elements";
import type { ElementAmount } from "./formula";

export type ValenceConvention = "free-electron" | "group";

/** IUPAC group 1–18 of a main-group or d-block element; null for lanthanides (58–71) and actinides (90–103). */
export function groupOf(z: number): number | null {
  const starts = [1, 3, 11, 19, 37, 55, 87];
  const period = starts.filter((s) => z >= s).length;
  const k = z - starts[period - 1];
  if (period === 1) return z === 1 ? 1 : 18;
  if (period <= 3) return k < 2 ? k + 1 : k + 11;
  if (period <= 5) return k + 1;
  if (z >= 58 && z <= 71) return null;
  if (z >= 90 && z <= 103) return null;
  if (k < 3) return k + 1; // Cs/Ba/La, Fr/Ra/Ac
  return k - 14 + 1;
}

const ONE_S_ELECTRON = new Set(["Cr", "Cu", "Nb", "Mo", "Ru", "Rh", "Ag", "Pt", "Au"]);

/**
 * Default valence of an element in a convention (see the file header). Throws InputError for an
 * unknown symbol.
 */
export function defaultValence(symbol: string, convention: ValenceConvention = "free-electron"): number {
  const e = elementBySymbol(symbol);
  if (!e) throw invalid("element", symbol, "unknown element symbol", { field: "valences" });
  const group = groupOf(e.z);
  if (group === null) return symbol === "Eu" || symbol === "Yb" ? 2 : symbol === "Th" ? 4 : 3;
  if (group === 18) return 0;
  if (group <= 2) return group;
  if (group >= 13) return group - 10;
  if (group === 12) return 2;
  if (group === 3) return 3;
  if (convention === "group") return group;
  if (symbol === "Pd") return 1;
  return ONE_S_ELECTRON.has(symbol) ? 1 : 2;
}

function valenceOf(symbol: string, valences: Readonly<Record<string, number>>, convention: ValenceConvention): number {
  const v = valences[symbol];
  if (v === undefined) return defaultValence(symbol, convention);
  if (typeof v !== "number" || !Number.isFinite(v) || v < 0) throw invalid(`valences.${symbol}`, v, "must be a finite number ≥ 0");
  return v;
}

/**
 * Conduction electrons per formula unit z = Σ nᵢ vᵢ, with vᵢ from `valences` or the default
 * of the convention. Throws InputError for a negative or non-finite valence.
 */
export function electronsPerFormulaUnit(
  elements: readonly ElementAmount[], valences: Readonly<Record<string, number>> = {}, convention: ValenceConvention = "free-electron",
): number {
  return elements.reduce((s, { symbol, amount }) => s + amount * valenceOf(symbol, valences, convention), 0);
}

/**
 * Valence electrons per atom e/a = Σ nᵢ vᵢ / Σ nᵢ (the composition axis of series plots).
 * Throws InputError for an empty element list.
 */
export function valenceElectronsPerAtom(
  elements: readonly ElementAmount[], valences: Readonly<Record<string, number>> = {}, convention: ValenceConvention = "free-electron",
): number {
  const atoms = elements.reduce((s, e) => s + e.amount, 0);
  if (!(atoms > 0)) throw invalid("elements", elements.length, "no atoms to average over");
  return electronsPerFormulaUnit(elements, valences, convention) / atoms;
}
