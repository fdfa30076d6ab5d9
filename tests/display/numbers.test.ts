/**
 * The one number rule for readers: value(σ) with two digits of σ, × 10ⁿ with superscripts (no
 * e-notation), units with superscript exponents, no unit on dimensionless values, UTC minutes.
 * Expected strings are worked by hand from the rule (JCGM 100:2008 §7.2.2 concise notation).
 */
import { describe, it, expect } from "vitest";
import { cleanText, formatCount, formatNumber, formatQuantity, formatRange, formatTime, formatUnit, formatValue } from "@/lib/display";
import { htmlSymbol, plainSymbol, runs } from "@/lib/display";

describe("formatValue", () => {
  it.each([
    [4.483, 0.01734, "4.483(17)"],
    [1234.4, 56, "1234(56)"],
    [12.34, 1.5, "12.3(1.5)"],
    [-4.2134, 0.0246, "−4.213(25)"],
    [1.2345e-5, 5.6e-8, "1.2345(56) × 10⁻⁵"],
    [338.79, 1.7, "338.8(1.7)"],
  ])("formatValue(%s, %s) is %s", (v, s, want) => expect(formatValue(v, s)).toBe(want));

  it("formatValue without σ gives significant digits, never a float artefact or e-notation", () => {
    expect(formatValue(48.78949999999999, null, 6)).toBe("48.7895");
    expect(formatValue(8.147e-8, null)).toBe("8.147 × 10⁻⁸");
    expect(formatValue(5.800000000000001, null)).toBe("5.8");
    expect(formatNumber(2.48e-8, 3)).toBe("2.48 × 10⁻⁸");
    expect(formatNumber(123456, 3)).toBe("1.23 × 10⁵");
    expect(formatNumber(null)).toBe("—");
  });
});

describe("formatUnit", () => {
  it.each([
    ["mJ mol^-1 K^-2", "mJ mol⁻¹ K⁻²"],
    ["J/(mol*K^2)", "J mol⁻¹ K⁻²"],
    ["J/(mol*K)", "J mol⁻¹ K⁻¹"],
    ["m s^-1", "m s⁻¹"],
    ["Å^-1", "Å⁻¹"],
    ["m^-3", "m⁻³"],
    ["J*K/mol", "J K mol⁻¹"],
    ["states eV^-1 f.u.^-1", "states eV⁻¹ f.u.⁻¹"],
    ["1", ""],
    ["K", "K"],
  ])("formatUnit(%s) is %s", (u, want) => expect(formatUnit(u)).toBe(want));

  it("formatQuantity writes no unit for a dimensionless value", () => {
    expect(formatQuantity(4.461, 0.02, "1")).toBe("4.461(20)");
    expect(formatQuantity(1.3e-3 * 1e3, 1.2e-5 * 1e3, "mJ mol^-1 K^-2")).toBe("1.300(12) mJ mol⁻¹ K⁻²");
  });
});

describe("formatTime, formatCount, formatRange", () => {
  it("formatTime gives UTC minutes for ISO text with milliseconds and for a Date", () => {
    expect(formatTime("2026-12-04T14:52:31.123Z")).toBe("2026-12-04 14:52 UTC");
    expect(formatTime(new Date(Date.UTC(2026, 11, 4, 9, 5)))).toBe("2026-12-04 09:05 UTC");
    expect(formatTime(null)).toBe("—");
  });
  it("formatCount agrees in number", () => {
    expect(formatCount(1, "atom")).toBe("1 atom");
    expect(formatCount(4, "point")).toBe("4 points");
  });
  it("formatRange uses the same digits as a window button", () => {
    expect(formatRange(1.8, 7.5051, "K")).toBe("1.8–7.505 K");
  });
});

describe("cleanText", () => {
  it("cleanText shows float artefacts to 12 digits and agrees counts of one, leaving other numbers as written", () => {
    expect(cleanText("z = 5.800000000000001 conduction electrons per formula unit")).toBe("z = 5.8 conduction electrons per formula unit");
    expect(cleanText("from β with r = 1 atoms per formula unit")).toBe("from β with r = 1 atom per formula unit");
    expect(cleanText("r = 11 atoms, 2.5 K, 0.1 atoms")).toBe("r = 11 atoms, 2.5 K, 0.1 atoms");
    expect(cleanText("μ* = 0.13, 1.23456789012 K")).toBe("μ* = 0.13, 1.23456789012 K");
  });
});

describe("symbol markup", () => {
  it("runs splits subscripts and superscripts", () => {
    expect(runs("Θ_D")).toEqual([{ text: "Θ", shift: "base" }, { text: "D", shift: "sub" }]);
    expect(runs("χ²_red")).toEqual([{ text: "χ²", shift: "base" }, { text: "red", shift: "sub" }]);
    expect(runs("H_{c2}")).toEqual([{ text: "H", shift: "base" }, { text: "c2", shift: "sub" }]);
    expect(runs("T^{3/2}")).toEqual([{ text: "T", shift: "base" }, { text: "3/2", shift: "sup" }]);
  });
  it("htmlSymbol escapes text and uses <sub>", () => {
    expect(htmlSymbol("γ_n T_c")).toBe("γ<sub>n</sub> T<sub>c</sub>");
    expect(htmlSymbol("<b>_x")).toBe("&lt;b&gt;<sub>x</sub>");
  });
  it("plainSymbol never leaves an underscore", () => {
    for (const m of ["Θ_D", "E_F", "r_s/a_0", "γ_n T_c", "H_c2", "χ²_red"]) expect(plainSymbol(m)).not.toContain("_");
    expect(plainSymbol("r_s/a_0")).toBe("rₛ/a₀");
  });
});
