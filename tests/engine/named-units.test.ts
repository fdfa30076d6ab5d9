/**
 * Named units of stored results (lib/engine/units/named.ts): the trade units convert to SI and
 * back exactly, σ and systematic σ alike; SI and unlisted units pass unchanged. Check values:
 * 1 eV = 1.602176634 × 10⁻¹⁹ J (CODATA 2018, exact), 1 Å⁻¹ = 10¹⁰ m⁻¹, 1 μΩ cm = 10⁻⁸ Ω m.
 */
import { describe, expect, it } from "vitest";
import { toSI, toTrade, TRADE_UNITS } from "../../lib/engine/units/named";
import { quantity } from "../../lib/engine/uncertainty/quantity";

describe("named units", () => {
  it("toSI converts each trade unit by its factor and toTrade brings it back", () => {
    const checks: [string, number, string][] = [
      ["mJ mol^-1 K^-2", 1e-3, "J mol^-1 K^-2"],
      ["eV", 1.602176634e-19, "J"],
      ["Å^-1", 1e10, "m^-1"],
      ["states eV^-1 f.u.^-1", 1 / 1.602176634e-19, "states J^-1 f.u.^-1"],
      ["μΩ cm K^2 mol^2 mJ^-2", 1e-8 * 1e6, "Ω m K^2 mol^2 J^-2"],
    ];
    for (const [unit, factor, si] of checks) {
      const q = { ...quantity("x", "x", 2.5, 0.1, unit), systematicError: 0.2 };
      const s = toSI(q);
      expect(s.unit).toBe(si);
      expect(s.value / (2.5 * factor)).toBeCloseTo(1, 14);
      expect(s.stdError! / (0.1 * factor)).toBeCloseTo(1, 14);
      expect(s.systematicError! / (0.2 * factor)).toBeCloseTo(1, 14);
      const back = toTrade(s);
      expect(back.unit).toBe(unit);
      expect(back.value).toBeCloseTo(2.5, 12);
    }
  });
  it("toSI and toTrade leave K, dimensionless and unlisted units as they are", () => {
    for (const unit of ["K", "1", "m s^-1", "m^-3", "furlong"]) {
      const q = quantity("x", "x", 3, 0.1, unit);
      expect(toSI(q)).toBe(q);
      expect(toTrade(q)).toBe(q);
    }
  });
  it("every trade unit has its own SI unit (the way back is unique)", () => {
    const si = Object.values(TRADE_UNITS).map((u) => u.si);
    expect(new Set(si).size).toBe(si.length);
  });
});
