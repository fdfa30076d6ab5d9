/**
 * Fuzzing the formula parser (lib/engine/chemistry) with fast-check, seeded and bounded:
 * formulas built from element symbols (real and fake), counts (integer, decimal, decimal comma,
 * negative, huge), nested groups with unbalanced brackets, hydrate dots, charges, spaces and
 * unicode subscripts. Properties: parseFormula throws only InputError naming the field
 * "formula"; an accepted formula has positive finite atoms per formula unit and molar mass,
 * and its elements are real ones. Well-formed formulas built from known parts are accepted and
 * their molar mass is the sum over the generated counts (IUPAC 2021 weights from the table).
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { parseFormula, elementBySymbol } from "../../lib/engine/chemistry";
import { InputError } from "../../lib/engine/errors";

const SEED = 20261202;
const REAL = ["H", "C", "N", "O", "Cu", "Nb", "Mo", "Fe", "Ni", "La", "Ba", "Sr", "Ti", "Al", "U", "Og"];
const FAKE = ["Xx", "Qq", "J", "cu", "CU", "Zz", "Aa"];

const count = fc.oneof(fc.constant(""), fc.integer({ min: 1, max: 20 }).map(String), fc.double({ min: 0.01, max: 9, noNaN: true }).map((v) => v.toFixed(2)), fc.constantFrom("0", "-1", "1e3", "0,5", "1e400", "NaN", "₂", "²", "x"));
const token: fc.Arbitrary<string> = fc.letrec((tie) => ({
  part: fc.oneof(
    { weight: 6, arbitrary: fc.tuple(fc.constantFrom(...REAL, ...FAKE), count).map(([e, n]) => e + n) },
    fc.tuple(fc.array(tie("part"), { minLength: 1, maxLength: 3 }), fc.constantFrom("()", "[]", "(]", "(", ")"), count).map(([inner, br, n]) => `${br[0]}${inner.join("")}${br[1] ?? ""}${n}`),
    fc.constantFrom("·", ".", "*", " ", "+", "2-", "^", "·5H2O", "\u0000"),
  ),
})).part as fc.Arbitrary<string>;
const formula = fc.array(token, { minLength: 0, maxLength: 6 }).map((p) => p.join(""));

describe("parseFormula under fuzzing", () => {
  it("parseFormula of generated text throws only InputError on field formula, else gives sane numbers", () => {
    fc.assert(fc.property(formula, (text) => {
      let f;
      try {
        f = parseFormula(text);
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        expect((err as InputError).field).toBe("formula");
        return;
      }
      expect(f.atomsPerFormulaUnit > 0 && Number.isFinite(f.atomsPerFormulaUnit)).toBe(true);
      expect(f.molarMassGPerMol > 0 && Number.isFinite(f.molarMassGPerMol)).toBe(true);
      for (const e of f.elements) expect(elementBySymbol(e.symbol)).toBeDefined();
    }), { seed: SEED, numRuns: 2000 });
  });

  it("parseFormula of well-formed formulas sums the atomic weights of the generated counts", () => {
    const part = fc.tuple(fc.constantFrom(...REAL.filter((e) => e !== "Og")), fc.integer({ min: 1, max: 12 }));
    fc.assert(fc.property(fc.array(part, { minLength: 1, maxLength: 5 }), (parts) => {
      const f = parseFormula(parts.map(([e, n]) => `${e}${n}`).join(""));
      const expected = parts.reduce((s, [e, n]) => s + n * elementBySymbol(e)!.atomicWeight, 0);
      expect(Math.abs(f.molarMassGPerMol - expected) / expected).toBeLessThan(1e-12);
      expect(f.atomsPerFormulaUnit).toBe(parts.reduce((s, [, n]) => s + n, 0));
    }), { seed: SEED, numRuns: 500 });
  });

  it("parseFormula of arbitrary unicode text throws only InputError", () => {
    fc.assert(fc.property(fc.string({ unit: "grapheme", maxLength: 80 }), (text) => {
      try { parseFormula(text); } catch (err) { expect(err).toBeInstanceOf(InputError); }
    }), { seed: SEED, numRuns: 1500 });
  });
});
