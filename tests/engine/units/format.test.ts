import { describe, expect, it } from "vitest";
import { DISPLAY_UNITS, formatBeta, formatGamma, formatUncertainty, formatWithUnit } from "../../../lib/engine/units";
import { InputError } from "../../../lib/engine/errors";

const f = (value: number, sigma: number | null | undefined) => formatUncertainty(value, sigma);

describe("formatUncertainty", () => {
  it.each([
    [4.2134, 0.0246, "4.213(25)"],
    [4.2134, 0.0996, "4.21(10)"], // σ rounds up to a new decade
    [1234.4, 56, "1234(56)"],
    [12345, 123, "12350(120)"],
    [12.34, 1.5, "12.3(1.5)"],
    [0.5, 1.2, "0.5(1.2)"],
    [-4.2134, 0.0246, "-4.213(25)"],
    [99.96, 0.05, "99.960(50)"],
    [1.2345e-5, 5.6e-8, "1.2345(56)e-5"],
    [6.02214076e23, 1.2e20, "6.0221(12)e23"],
  ])("formatUncertainty(%s, %s) gives %s (two significant digits of σ, common practice)", (value, sigma, expected) => {
    expect(f(value, sigma)).toBe(expected);
  });

  it("formatUncertainty gives the CODATA 2018 electron mass in its published concise form", () => {
    // CODATA 2018: m_e = 9.1093837015(28) × 10⁻³¹ kg.
    expect(formatUncertainty(9.1093837015e-31, 0.0000000028e-31, { exponent: "times" })).toBe("9.1093837015(28)×10⁻³¹");
  });

  it("formatUncertainty shows the value alone for zero, null or missing σ", () => {
    expect(f(4.2134, 0)).toBe("4.2134");
    expect(f(4.21345678, null)).toBe("4.21346");
    expect(f(-1.5e-7, undefined)).toBe("-1.5e-7");
    expect(f(NaN, 0.1)).toBe("NaN");
  });

  it("formatUncertainty refuses a negative or non-finite σ", () => {
    expect(() => f(1, -0.1)).toThrow(InputError);
    expect(() => f(1, Infinity)).toThrow(InputError);
  });
});

describe("formatWithUnit", () => {
  it("formatGamma shows γ in mJ mol⁻¹ K⁻² and names the mole", () => {
    expect(formatGamma(1.234e-3, 1.2e-5)).toBe("1.234(12) mJ mol⁻¹ K⁻²");
    expect(formatGamma(0.695e-3, null, "formula-unit")).toBe("0.695 mJ mol⁻¹ K⁻² (per mole formula unit)");
  });

  it("formatBeta shows β in mJ mol⁻¹ K⁻⁴", () => {
    expect(formatBeta(4.8e-5, 2.1e-7, "atom")).toBe("0.04800(21) mJ mol⁻¹ K⁻⁴ (per mole of atoms)");
  });

  it("formatWithUnit converts with mathjs and refuses an impossible display unit", () => {
    expect(formatWithUnit(0.35, 0.001, DISPLAY_UNITS.temperature)).toBe("0.3500(10) K");
    expect(() => formatWithUnit(1, null, { si: "K", display: "J", label: "J" })).toThrow(InputError);
  });
});
