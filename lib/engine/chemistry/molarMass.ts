/**
 * parseFormula: formula text → elements, atoms per formula unit, molar mass with uncertainty,
 * atom and mass fractions.
 */
import { ATOMIC_WEIGHT_SOURCE, elementBySymbol } from "./elements";
import type { Element } from "./elements";
import { parseElementCounts } from "./formula";
import type { ElementAmount, ParsedFormula } from "./formula";

function element(symbol: string): Element {
  const e = elementBySymbol(symbol);
  if (!e) throw new Error(`internal: unknown element ${symbol} after parsing`);
  return e;
}

/**
 * M = Σ nᵢ A_r,i [g/mol] with IUPAC 2021 abridged atomic weights, and
 * u(M) = √Σ (nᵢ uᵢ)², treating the abridged ± values as independent standard uncertainties
 * (they are not strictly standard uncertainties: common practice for a quick error budget).
 * u(M) is undefined when an element has no standard atomic weight.
 */
export function molarMassOf(elements: readonly ElementAmount[]): { molarMassGPerMol: number; molarMassUncertainty?: number } {
  let m = 0;
  let u2 = 0;
  let known = true;
  for (const { symbol, amount } of elements) {
    const e = element(symbol);
    m += amount * e.atomicWeight;
    if (e.uncertainty === null) known = false;
    else u2 += (amount * e.uncertainty) ** 2;
  }
  return known ? { molarMassGPerMol: m, molarMassUncertainty: Math.sqrt(u2) } : { molarMassGPerMol: m };
}

/**
 * Parse a chemical formula (see formula.ts for the grammar): "Cu", "Nb0.75Mo0.25",
 * "(Ti0.5V0.5)3Al", "YBa2Cu3O6.95", "CuSO4·5H2O".
 * Returns merged elements in order of first appearance, atoms per formula unit r = Σ nᵢ,
 * molar mass [g/mol] with uncertainty, atom fractions nᵢ/r and mass fractions nᵢA_r,i/M,
 * and warnings for elements without a standard atomic weight (mass number used).
 * Throws InputError with where.column (1-based character position) and field "formula".
 */
export function parseFormula(text: string): ParsedFormula {
  const elements = parseElementCounts(text);
  const atoms = elements.reduce((s, e) => s + e.amount, 0);
  const mass = molarMassOf(elements);
  const warnings: string[] = [];
  for (const { symbol } of elements) {
    const e = element(symbol);
    if (e.kind === "no-stable") {
      warnings.push(`${symbol} has no stable isotope and no standard atomic weight: the mass number [${e.atomicWeight}] of its longest-lived isotope is used (IUPAC practice)`);
    }
  }
  return {
    formula: text.trim(),
    elements,
    atomsPerFormulaUnit: atoms,
    ...mass,
    composition: elements.map(({ symbol, amount }) => ({
      symbol,
      atomFraction: amount / atoms,
      massFraction: (amount * element(symbol).atomicWeight) / mass.molarMassGPerMol,
    })),
    warnings,
    source: ATOMIC_WEIGHT_SOURCE,
  };
}
