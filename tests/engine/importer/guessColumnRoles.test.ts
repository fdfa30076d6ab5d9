import { describe, expect, it } from "vitest";
import { guessColumnRoles, parseDelimited } from "../../../lib/engine/importer";

const roles = (header: string) => {
  const g = guessColumnRoles(parseDelimited(`${header}\n${header.split(",").map((_, i) => i + 1).join(",")}\n`).columns);
  return { T: g.temperature?.index, C: g.heatCapacity?.index, s: g.sigma?.index, H: g.field?.index };
};

describe("guessColumnRoles", () => {
  it("guessColumnRoles finds T, C and σ from names with units", () => {
    expect(roles("T (K),C [mJ/K],dC (mJ/K)")).toEqual({ T: 0, C: 1, s: 2, H: undefined });
  });

  it("guessColumnRoles reads a typical instrument header with field and several temperatures", () => {
    const header = "Time Stamp (s),Puck Temp (K),Sample Temp (K),Field (Oe),Samp HC (µJ/K),Samp HC Err (µJ/K),Addenda HC (µJ/K)";
    expect(roles(header)).toEqual({ T: 2, C: 4, s: 5, H: 3 });
  });

  it("guessColumnRoles tells the field column by its unit", () => {
    expect(roles("Temperature (K),B (T),HC (J/mol-K),sigma")).toEqual({ T: 0, C: 2, s: 3, H: 1 });
    expect(roles("mu0H (T),T (K),Cp (J/(mol K))")).toEqual({ T: 1, C: 2, s: undefined, H: 0 });
  });

  it("guessColumnRoles does not take C/T for the heat capacity", () => {
    expect(roles("T (K),C/T (mJ/mol K^2)")).toEqual({ T: 0, C: undefined, s: undefined, H: undefined });
  });

  it("guessColumnRoles falls back to column position with low confidence for headerless data", () => {
    const g = guessColumnRoles(parseDelimited("1 2 3\n4 5 6\n").columns);
    expect(g.temperature).toMatchObject({ index: 0, confidence: 0.2 });
    expect(g.heatCapacity).toMatchObject({ index: 1, confidence: 0.2 });
    expect(g.sigma).toBeNull();
  });

  it("guessColumnRoles gives full confidence only when name and unit agree", () => {
    const g = guessColumnRoles([{ index: 0, name: "T" }, { index: 1, name: "Cp", unitText: "J/K" }]);
    expect(g.temperature?.confidence).toBe(0.6);
    expect(g.heatCapacity?.confidence).toBe(1);
  });
});
