import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { extractPoints, guessColumnRoles, parseDelimited } from "../../../lib/engine/importer";
import { InputError } from "../../../lib/engine/errors";

/** Run fn; only an InputError may escape. Returns the table when parsing succeeded. */
function parseOrInputError(text: string): ReturnType<typeof parseDelimited> | null {
  try {
    return parseDelimited(text);
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return null;
  }
}

const pieces = fc.constantFrom(",", ";", "\t", " ", "\n", "\r\n", "\r", '"', "#", "%", "//", "1", "2.5", "-3e-2",
  "1,5", "NaN", "", "T (K)", "C [mJ/K]", "(", ")", "[", "\ufeff", "µ", "x", "1e999", ".", "+");

describe("parseDelimited fuzz (fast-check, seeded)", () => {
  it("parseDelimited on arbitrary strings either returns a consistent table or throws InputError", () => {
    fc.assert(fc.property(fc.string({ maxLength: 200 }), (text) => {
      const t = parseOrInputError(text);
      if (t) expect(t.rows.every((r) => r.length === t.rowCount)).toBe(true);
    }), { seed: 20240501, numRuns: 2000 });
  });

  it("parseDelimited on delimiter-rich strings keeps row, line and issue invariants", () => {
    fc.assert(fc.property(fc.array(pieces, { maxLength: 80 }), (parts) => {
      const t = parseOrInputError(parts.join(""));
      if (!t) return;
      expect(t.columns.length).toBeGreaterThanOrEqual(2);
      expect(t.lineNumbers.length).toBe(t.rowCount);
      for (let i = 1; i < t.rowCount; i++) expect(t.lineNumbers[i]).toBeGreaterThan(t.lineNumbers[i - 1]);
      for (const issue of t.issues) {
        expect(issue.line).toBeGreaterThanOrEqual(1);
        expect(issue.column).toBeGreaterThanOrEqual(1);
      }
      guessColumnRoles(t.columns);
      try {
        extractPoints(t, { temperature: 0, heatCapacity: 1 });
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
      }
    }), { seed: 7, numRuns: 3000 });
  });

  it("parseDelimited round-trips generated numeric tables in every delimiter", () => {
    const cell = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });
    fc.assert(fc.property(fc.array(fc.tuple(cell, cell, cell), { minLength: 1, maxLength: 30 }), fc.constantFrom(",", ";", "\t", " "), (rows, d) => {
      const text = "T (K)" + d + "C (J/K)" + d + "s\n" + rows.map((r) => r.map((v) => String(v)).join(d)).join("\n");
      const t = parseDelimited(text);
      expect(t.rowCount).toBe(rows.length);
      rows.forEach((r, i) => r.forEach((v, c) => expect(t.rows[c][i]).toBe(v === 0 ? 0 : v)));
    }), { seed: 99, numRuns: 300 });
  });
});
