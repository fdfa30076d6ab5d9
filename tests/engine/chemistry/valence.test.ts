import { describe, expect, it } from "vitest";
import { defaultValence, electronsPerFormulaUnit, groupOf, parseFormula, valenceElectronsPerAtom } from "../../../lib/engine/chemistry";
import { InputError } from "../../../lib/engine/errors";
import { expectClose } from "../../helpers/expectClose";

const els = (f: string) => parseFormula(f).elements;

describe("defaultValence", () => {
  it.each([
    // Free-electron valences of the textbook table of metals (Ashcroft & Mermin, Table 1.1, from memory).
    ["Li", 1], ["Na", 1], ["K", 1], ["Rb", 1], ["Cs", 1], ["Cu", 1], ["Ag", 1], ["Au", 1], ["Be", 2], ["Mg", 2],
    ["Ca", 2], ["Sr", 2], ["Ba", 2], ["Nb", 1], ["Fe", 2], ["Mn", 2], ["Zn", 2], ["Cd", 2], ["Hg", 2], ["Al", 3],
    ["Ga", 3], ["In", 3], ["Tl", 3], ["Sn", 4], ["Pb", 4], ["Bi", 5], ["Sb", 5],
  ])("defaultValence(%s) is the textbook free-electron valence %i", (symbol, valence) => {
    expect(defaultValence(symbol)).toBe(valence);
  });

  it("defaultValence with the group convention counts s + d electrons of transition metals (common practice)", () => {
    expect(["Ti", "V", "Nb", "Mo", "Ta", "W", "Re", "Pd", "Pt", "Cu"].map((s) => defaultValence(s, "group"))).toEqual([4, 5, 5, 6, 5, 6, 7, 10, 10, 11]);
    expect(defaultValence("Al", "group")).toBe(3);
  });

  it("defaultValence gives lanthanides 3 except Eu and Yb 2, and noble gases 0 (common practice)", () => {
    expect(["La", "Ce", "Gd", "Eu", "Yb", "Th", "U", "He", "Ar"].map((s) => defaultValence(s))).toEqual([3, 3, 3, 2, 2, 4, 3, 0, 0]);
  });

  it("defaultValence throws InputError for an unknown symbol", () => {
    expect(() => defaultValence("Q")).toThrow(InputError);
  });

  it("groupOf gives IUPAC groups and null inside the f-block", () => {
    expect([1, 2, 5, 10, 21, 30, 31, 36, 57, 58, 71, 72, 80, 89, 90, 104, 118].map(groupOf)).toEqual([1, 18, 13, 18, 3, 12, 13, 18, 3, null, null, 4, 12, 3, null, 4, 18]);
  });
});

describe("valence electron counts", () => {
  it("valenceElectronsPerAtom gives the Hume-Rothery electron-compound ratios 3/2, 21/13, 7/4 (β, γ, ε brass)", () => {
    expectClose(valenceElectronsPerAtom(els("CuZn")), 3 / 2);
    expectClose(valenceElectronsPerAtom(els("Cu5Zn8")), 21 / 13);
    expectClose(valenceElectronsPerAtom(els("CuZn3")), 7 / 4);
  });

  it("valenceElectronsPerAtom of Nb0.75Mo0.25 with group valences is 5.25", () => {
    expectClose(valenceElectronsPerAtom(els("Nb0.75Mo0.25"), {}, "group"), 5.25);
  });

  it("electronsPerFormulaUnit uses given valences over defaults", () => {
    expect(electronsPerFormulaUnit(els("MgB2"))).toBe(2 + 2 * 3);
    expect(electronsPerFormulaUnit(els("CeCu6"), { Ce: 1 })).toBe(1 + 6);
    expect(electronsPerFormulaUnit(els("Cu"))).toBe(1);
  });

  it("electronsPerFormulaUnit refuses a negative or non-finite valence, naming the element", () => {
    expect(() => electronsPerFormulaUnit(els("Cu"), { Cu: -1 })).toThrow(/invalid valences\.Cu: -1/);
    expect(() => electronsPerFormulaUnit(els("Cu"), { Cu: NaN })).toThrow(InputError);
  });

  it("valenceElectronsPerAtom refuses an empty element list", () => {
    expect(() => valenceElectronsPerAtom([])).toThrow(InputError);
  });
});
