import { describe, expect, it } from "vitest";
import { parseFormula } from "../../../lib/engine/chemistry";
import { InputError } from "../../../lib/engine/errors";
import { expectClose } from "../../helpers/expectClose";

const M = (f: string) => parseFormula(f).molarMassGPerMol;

function failure(text: string): InputError {
  try { parseFormula(text); } catch (e) { if (e instanceof InputError) return e; throw e; }
  throw new Error(`expected ${text} to fail`);
}

describe("parseFormula", () => {
  it("parseFormula of Cu gives 63.546 g/mol (IUPAC 2021 abridged atomic weight)", () => {
    const p = parseFormula("Cu");
    expect(p.elements).toEqual([{ symbol: "Cu", amount: 1 }]);
    expect(p.atomsPerFormulaUnit).toBe(1);
    expectClose(p.molarMassGPerMol, 63.546, { rel: 1e-12 });
    expectClose(p.molarMassUncertainty!, 0.003, { rel: 1e-12 });
  });

  it("parseFormula of H2O gives 18.015 g/mol (CRC Handbook, from memory)", () => {
    expectClose(M("H2O"), 18.015, { abs: 0.0005 });
  });

  it("parseFormula of CuSO4·5H2O gives 249.68 g/mol (CRC Handbook, from memory: 249.685)", () => {
    expectClose(M("CuSO4·5H2O"), 249.685, { abs: 0.01 });
    expect(parseFormula("CuSO4*5H2O").elements).toEqual(parseFormula("CuSO4·5H2O").elements);
  });

  it("parseFormula of YBa2Cu3O7 gives 666.19 g/mol (literature formula weight, from memory)", () => {
    expectClose(M("YBa2Cu3O7"), 666.19, { abs: 0.01 });
  });

  it("parseFormula of MgB2 gives 45.93 g/mol (literature formula weight, from memory)", () => {
    expectClose(M("MgB2"), 45.93, { abs: 0.01 }); // quoted to two decimals
  });

  it.each([
    // Σ nᵢ A_r,i computed by hand from the IUPAC 2021 abridged values.
    ["Nb0.75Mo0.25", 0.75 * 92.906 + 0.25 * 95.95, 1],
    ["(Ti0.5V0.5)3Al", 1.5 * 47.867 + 1.5 * 50.942 + 26.982, 4],
    ["CeCu6", 140.12 + 6 * 63.546, 7],
    ["UPt3", 238.03 + 3 * 195.08, 4],
    ["YBa2Cu3O6.95", 88.906 + 2 * 137.33 + 3 * 63.546 + 6.95 * 15.999, 12.95],
    ["[Nb(Mo0.5W0.5)]2", 2 * 92.906 + 95.95 + 183.84, 4],
    ["Pd0.9Ni0.1", 0.9 * 106.42 + 0.1 * 58.693, 1],
  ])("parseFormula(%s) gives the hand-computed molar mass and atoms per formula unit", (formula, mass, atoms) => {
    const p = parseFormula(formula);
    expectClose(p.molarMassGPerMol, mass, { rel: 1e-12 });
    expectClose(p.atomsPerFormulaUnit, atoms, { rel: 1e-15 });
  });

  it("parseFormula merges repeated elements in order of first appearance", () => {
    expect(parseFormula("CuZnCu2(ZnO)2").elements).toEqual([{ symbol: "Cu", amount: 3 }, { symbol: "Zn", amount: 3 }, { symbol: "O", amount: 2 }]);
  });

  it("parseFormula reads nested mixed brackets, spaces and case-sensitive symbols", () => {
    expect(parseFormula("K3[Fe(CN)6]").elements).toEqual([{ symbol: "K", amount: 3 }, { symbol: "Fe", amount: 1 }, { symbol: "C", amount: 6 }, { symbol: "N", amount: 6 }]);
    expect(parseFormula(" Nb 0.75 Mo .25 ").elements).toEqual([{ symbol: "Nb", amount: 0.75 }, { symbol: "Mo", amount: 0.25 }]);
    expect(parseFormula("Co").elements).toEqual([{ symbol: "Co", amount: 1 }]);
    expect(parseFormula("CO").elements).toEqual([{ symbol: "C", amount: 1 }, { symbol: "O", amount: 1 }]);
  });

  it("parseFormula gives atom and mass fractions that each sum to one", () => {
    const p = parseFormula("(Ti0.5V0.5)3Al");
    expect(p.composition.map((c) => c.atomFraction)).toEqual([0.375, 0.375, 0.25]);
    expectClose(p.composition.reduce((s, c) => s + c.massFraction, 0), 1, { rel: 1e-14 });
    expectClose(p.composition[2].massFraction, 26.982 / p.molarMassGPerMol, { rel: 1e-14 });
  });

  it("parseFormula flags elements without a standard atomic weight and leaves u(M) undefined", () => {
    const p = parseFormula("TcO2");
    expect(p.molarMassGPerMol).toBeCloseTo(97 + 2 * 15.999, 10);
    expect(p.molarMassUncertainty).toBeUndefined();
    expect(p.warnings[0]).toMatch(/Tc has no stable isotope.*\[97\]/);
  });

  it("parseFormula propagates abridged uncertainties in quadrature", () => {
    expectClose(parseFormula("MgB2").molarMassUncertainty!, Math.hypot(0.002, 2 * 0.02), { rel: 1e-12 });
  });

  it.each([
    ["Xx", 1, /unknown element "Xx"/], ["Cu x", 4, /capital letter/], ["cu", 1, /capital letter/],
    ["Nb(Mo", 6, /missing "\)" to close the "\(" of column 3/], ["Nb)", 3, /unexpected "\)"/], ["(Ti]", 4, /unexpected "\]"/],
    ["2Cu", 1, /count must follow/], ["Nb0", 3, /count must be > 0/], ["Fe2O3·", 7, /nothing after the separator/],
    ["()", 1, /empty "\(\)"/], ["Cu$", 3, /unexpected character "\$"/], ["J", 1, /unknown element "J"/],
  ] as const)("parseFormula(%s) throws InputError at column %i", (text, column, message) => {
    const e = failure(text);
    expect(e.where).toEqual({ column, field: "formula" });
    expect(e.message).toMatch(message);
  });

  it("parseFormula refuses empty text", () => {
    expect(failure("  ").where).toEqual({ field: "formula" });
  });
});
