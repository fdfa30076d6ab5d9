/**
 * Chemistry: formulas, IUPAC 2021 abridged atomic weights, valences.
 *
 *   parseFormula(text)                          elements, atoms/f.u., molar mass ± u, fractions
 *   parseElementCounts(text)                    only the merged element counts
 *   molarMassOf(elements)                       M and u(M) from element counts
 *   ELEMENTS, elementBySymbol(symbol)           the atomic-weight table H–Og
 *   defaultValence(symbol, convention)          free-electron or group valence (common practice)
 *   electronsPerFormulaUnit(elements, valences) z = Σ nᵢvᵢ
 *   valenceElectronsPerAtom(elements, valences) e/a = Σ nᵢvᵢ / Σ nᵢ
 */
export { parseFormula, molarMassOf } from "./molarMass";
export { parseElementCounts } from "./formula";
export type { CompositionEntry, ElementAmount, ParsedFormula } from "./formula";
export { ATOMIC_WEIGHT_SOURCE, ELEMENTS, elementBySymbol } from "./elements";
export type { AtomicWeightKind, Element } from "./elements";
export { defaultValence, electronsPerFormulaUnit, groupOf, valenceElectronsPerAtom } from "./valence";
export type { ValenceConvention } from "./valence";
