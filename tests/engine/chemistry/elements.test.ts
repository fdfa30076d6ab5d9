import { describe, expect, it } from "vitest";
import { ELEMENTS, elementBySymbol } from "../../../lib/engine/chemistry";

describe("ELEMENTS", () => {
  it("ELEMENTS lists H to Og with atomic numbers 1–118 and unique symbols", () => {
    expect(ELEMENTS.length).toBe(118);
    ELEMENTS.forEach((e, i) => expect(e.z).toBe(i + 1));
    expect(new Set(ELEMENTS.map((e) => e.symbol)).size).toBe(118);
    expect([ELEMENTS[0].symbol, ELEMENTS[117].symbol]).toEqual(["H", "Og"]);
  });

  it("every element has a plausible atomic weight Z ≤ A_r ≤ 2.7 Z and a ± value unless it has no stable isotope", () => {
    for (const e of ELEMENTS) {
      expect(e.symbol).toMatch(/^[A-Z][a-z]?$/);
      expect(e.atomicWeight).toBeGreaterThanOrEqual(e.z);
      expect(e.atomicWeight).toBeLessThanOrEqual(2.7 * e.z);
      if (e.kind === "no-stable") {
        expect(e.uncertainty).toBeNull();
        expect(Number.isInteger(e.atomicWeight)).toBe(true);
      } else {
        expect(e.uncertainty).toBeGreaterThan(0);
        expect(e.uncertainty).toBeLessThan(0.01 * e.atomicWeight);
      }
    }
  });

  it("the elements without a stable isotope are Tc, Pm and Po onwards except Th, Pa, U (IUPAC 2021)", () => {
    const noStable = ELEMENTS.filter((e) => e.kind === "no-stable").map((e) => e.symbol);
    const expected = ["Tc", "Pm", ...ELEMENTS.filter((e) => e.z >= 84 && ![90, 91, 92].includes(e.z)).map((e) => e.symbol)];
    expect(noStable).toEqual(expected);
  });

  it.each([
    // IUPAC 2021 abridged standard atomic weights (Pure Appl. Chem. 94, 573 (2022)), from memory.
    ["Cu", 63.546], ["Al", 26.982], ["Nb", 92.906], ["Mo", 95.95], ["Ti", 47.867], ["V", 50.942], ["Fe", 55.845],
    ["Ni", 58.693], ["Pd", 106.42], ["Pt", 195.08], ["Au", 196.97], ["Ag", 107.87], ["Na", 22.99], ["K", 39.098],
    ["Ce", 140.12], ["U", 238.03], ["O", 15.999], ["B", 10.81], ["Mg", 24.305], ["Y", 88.906], ["Ba", 137.33],
    ["Cr", 51.996], ["Co", 58.933], ["Zr", 91.224], ["Hf", 178.49], ["Ta", 180.95], ["W", 183.84], ["Re", 186.21],
    ["Sn", 118.71], ["Pb", 207.2], ["In", 114.82], ["Ga", 69.723], ["Si", 28.085], ["Ge", 72.63], ["La", 138.91],
    ["H", 1.008], ["C", 12.011],
  ])("elementBySymbol(%s) has A_r = %s", (symbol, weight) => {
    expect(elementBySymbol(symbol)?.atomicWeight).toBe(weight);
  });

  it("elements with interval atomic weights are marked and use the conventional value", () => {
    const interval = ELEMENTS.filter((e) => e.kind === "interval").map((e) => e.symbol);
    expect(interval).toEqual(["H", "Li", "B", "C", "N", "O", "Mg", "Si", "S", "Cl", "Ar", "Br", "Tl", "Pb"]);
  });

  it("elementBySymbol is case-sensitive and undefined for unknown symbols", () => {
    expect(elementBySymbol("co")).toBeUndefined();
    expect(elementBySymbol("Xx")).toBeUndefined();
  });
});
