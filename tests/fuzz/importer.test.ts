/**
 * Fuzzing the delimited-text importer (lib/engine/importer) with fast-check, seeded and
 * bounded (≤ 60 lines of ≤ 8 cells): text built from numbers in many spellings (decimal
 * comma, exponents, signs, NaN/inf words), delimiters mixed on purpose, quotes, comment lines,
 * header and unit rows, BOMs, CR/LF mixes and stray unicode. Properties: parseDelimited never
 * throws anything but InputError; its table is self-consistent (one row array per column, each
 * rowCount long, a source line per row, issues on real lines); extractPoints on any mapping
 * returns equal-length finite arrays or throws InputError naming a line or field.
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { parseDelimited, extractPoints } from "../../lib/engine/importer";
import { InputError } from "../../lib/engine/errors";

const SEED = 20261202;

const number = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e9, max: 1e9 }).map(String),
  fc.double({ noNaN: true, noDefaultInfinity: true, min: 0, max: 1e3 }).map((v) => v.toFixed(4).replace(".", ",")),
  fc.integer({ min: -5, max: 5 }).map((e) => `1.5e${e}`),
  fc.constantFrom("NaN", "nan", "inf", "-Infinity", "", " ", "--", "1.2.3", "1,234.5", "0x1F", "１２", "٣", "1e999", "-0", "+3"),
);
const cell = fc.oneof({ weight: 5, arbitrary: number }, fc.string({ maxLength: 6 }), fc.constantFrom('"a,b"', '"x""y"', "T (K)", "C (mJ/K)", "σ", "µJ/K"));
const delimiter = fc.constantFrom(",", ";", "\t", " ", "  ", ", ");
const line = fc.oneof(
  { weight: 8, arbitrary: fc.tuple(fc.array(cell, { minLength: 1, maxLength: 8 }), delimiter).map(([cells, d]) => cells.join(d)) },
  fc.constantFrom("# comment", "% note", "", "[Header]", "Sample mass: 12.3 mg", "\uFEFFT,C", "T,C,err", "K,J/K,J/K"),
);
const file = fc.tuple(fc.array(line, { maxLength: 60 }), fc.constantFrom("\n", "\r\n", "\r")).map(([lines, eol]) => lines.join(eol));
const options = fc.record({
  delimiter: fc.constantFrom(",", ";", "\t", "whitespace", "auto"),
  decimalComma: fc.constantFrom(true, false, "auto"),
}, { requiredKeys: [] });

function parseOrInputError(text: string, opts: object) {
  try {
    return parseDelimited(text, { ...opts, fileName: "fuzz.csv" });
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return null;
  }
}

describe("importer under fuzzing", () => {
  it("parseDelimited of generated files throws only InputError and returns a consistent table", () => {
    fc.assert(fc.property(file, options, (text, opts) => {
      const table = parseOrInputError(text, opts);
      if (!table) return;
      expect(table.rows.length).toBe(table.columns.length);
      for (const col of table.rows) expect(col.length).toBe(table.rowCount);
      expect(table.lineNumbers.length).toBe(table.rowCount);
      const lines = text.split(/\r\n|\r|\n/).length;
      for (const l of table.lineNumbers) expect(l >= 1 && l <= lines).toBe(true);
    }), { seed: SEED, numRuns: 800 });
  });

  it("extractPoints of any mapping gives equal-length finite arrays or an InputError naming where", () => {
    const mapping = fc.record({ temperature: fc.integer({ min: -1, max: 9 }), heatCapacity: fc.integer({ min: -1, max: 9 }), sigma: fc.option(fc.integer({ min: -1, max: 9 }), { nil: undefined }) });
    fc.assert(fc.property(file, mapping, (text, map) => {
      const table = parseOrInputError(text, {});
      if (!table) return;
      let points;
      try {
        points = extractPoints(table, map);
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        const where = (err as InputError).where;
        expect(where?.line !== undefined || where?.field !== undefined || where?.column !== undefined).toBe(true);
        return;
      }
      const n = points.temperature.length;
      for (const arr of [points.heatCapacity, points.lineNumbers, points.sigma, points.field]) if (arr) expect(arr.length).toBe(n);
      for (const arr of [points.temperature, points.heatCapacity, points.sigma ?? [], points.field ?? []]) for (const v of arr) expect(Number.isFinite(v)).toBe(true);
    }), { seed: SEED, numRuns: 600 });
  });

  it("parseDelimited of arbitrary unicode text throws only InputError", () => {
    fc.assert(fc.property(fc.string({ unit: "grapheme", maxLength: 400 }), (text) => { parseOrInputError(text, {}); }), { seed: SEED, numRuns: 800 });
  });
});
