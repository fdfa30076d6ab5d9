import { describe, expect, it } from "vitest";
import { heatCapacityBasis, parseUnit, siFactor, toSI } from "../../../lib/engine/units";
import { InputError } from "../../../lib/engine/errors";
import { VACUUM_PERMEABILITY_N_PER_A2 } from "../../../lib/engine/constants";
import { expectClose } from "../../helpers/expectClose";

const factor = (text: string, q: "temperature" | "heatCapacity" | "field") => siFactor(text, q);

describe("parseUnit and heatCapacityBasis", () => {
  it.each([
    ["J/(mol*K)", "molar", 1], ["J/mol/K", "molar", 1], ["J/(mol K)", "molar", 1], ["J/mol K", "molar", 1],
    ["J/mol-K", "molar", 1], ["J K^-1 mol^-1", "molar", 1], ["J K⁻¹ mol⁻¹", "molar", 1], ["J·mol⁻¹·K⁻¹", "molar", 1],
    ["mJ/(mol*K)", "molar", 1e-3], ["mJ/K", "sample", 1e-3], ["µJ/K", "sample", 1e-6], ["μJ/K", "sample", 1e-6],
    ["uJ/K", "sample", 1e-6], ["µJ K-1", "sample", 1e-6], ["nJ/K", "sample", 1e-9], ["[mJ/K]", "sample", 1e-3],
    ["J/(g K)", "specific", 1e3], ["J/(g*K)", "specific", 1e3], ["J/(kg K)", "specific", 1], ["mJ/(g K)", "specific", 1],
  ] as const)("heatCapacityBasis(%s) is %s and toSI scales by the SI prefix %s", (text, basis, f) => {
    // SI prefixes m = 1e-3, µ = 1e-6, n = 1e-9; 1 g = 1e-3 kg (SI Brochure, 9th ed., 2019).
    expect(heatCapacityBasis(text)).toBe(basis);
    expectClose(factor(text, "heatCapacity"), f, { rel: 1e-15 });
  });

  it("parseUnit keeps the text and gives the normalised mathjs expression", () => {
    expect(parseUnit("J/mol-K")).toMatchObject({ text: "J/mol-K", expression: "J/(mol K)" });
  });

  it("parseUnit throws InputError naming the unit text for unknown units, numbers and empty text", () => {
    for (const text of ["furlong/K", "2 K", "", "  ", "J/(mol K"]) {
      const e = (() => { try { parseUnit(text); } catch (x) { return x; } return null; })();
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).message).toContain(`invalid unit: ${JSON.stringify(text)}`);
      expect((e as InputError).where).toEqual({ field: "unit" });
    }
  });

  it("heatCapacityBasis refuses units that are not heat capacities", () => {
    for (const text of ["J", "K", "J/mol", "J/(mol K^2)", "W/K"]) expect(() => heatCapacityBasis(text)).toThrow(/not a heat-capacity unit/);
    expect(() => heatCapacityBasis("J/degC")).toThrow(/offset/);
  });
});

describe("toSI", () => {
  it("toSI converts temperatures in K and mK and refuses relative scales", () => {
    expect(toSI([1.5, 300], "K", "temperature")).toEqual([1.5, 300]);
    expectClose(toSI([350], "mK", "temperature")[0], 0.35, { rel: 1e-15 });
    for (const t of ["°C", "degC", "℃", "degF"]) expect(() => toSI([1], t, "temperature")).toThrow(/absolute temperature/);
    expect(() => toSI([1], "J/K", "temperature")).toThrow(/not an absolute temperature unit/);
  });

  it("toSI converts flux density in T and G directly (1 G = 1e-4 T exactly, CGS–SI correspondence)", () => {
    expectClose(toSI([9], "T", "field")[0], 9, { rel: 1e-15 });
    expectClose(toSI([250], "mT", "field")[0], 0.25, { rel: 1e-15 });
    expectClose(toSI([5], "kG", "field")[0], 0.5, { rel: 1e-15 });
    expectClose(toSI([1], "G", "field")[0], 1e-4, { rel: 1e-15 });
  });

  it("toSI turns a field strength in Oe into μ0H in tesla (1 Oe = 1000/(4π) A/m, μ0 CODATA 2018)", () => {
    const expected = (1000 / (4 * Math.PI)) * VACUUM_PERMEABILITY_N_PER_A2;
    expectClose(toSI([1], "Oe", "field")[0], expected, { rel: 1e-14 });
    expectClose(toSI([90], "kOe", "field")[0], 90_000 * expected, { rel: 1e-14 });
    expectClose(toSI([1], "Oe", "field")[0], 1e-4, { rel: 1e-9 }); // ≈ 1 G in vacuum
    expectClose(toSI([1e6], "A/m", "field")[0], 1e6 * VACUUM_PERMEABILITY_N_PER_A2, { rel: 1e-15 });
    expect(() => toSI([1], "K", "field")).toThrow(/not a magnetic-field unit/);
  });

  it("toSI keeps the heat-capacity basis and does not mutate its input", () => {
    const input = [1, 2.5];
    expect(toSI(input, "mJ/(mol K)", "heatCapacity")).toEqual([0.001, 0.0025]);
    expect(toSI(input, "J/(g K)", "heatCapacity")).toEqual([1000, 2500]);
    expect(input).toEqual([1, 2.5]);
  });

  it("toSI names the index of a non-finite value", () => {
    expect(() => toSI([1, NaN], "K", "temperature")).toThrow(/invalid temperature\[1\]: NaN/);
  });

  it("toSI of an empty array is empty", () => {
    expect(toSI([], "uJ/K", "heatCapacity")).toEqual([]);
  });
});
