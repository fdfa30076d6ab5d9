import { describe, expect, it } from "vitest";
import { extractPoints, parseDelimited } from "../../../lib/engine/importer";
import { InputError } from "../../../lib/engine/errors";

const table = (body: string) => parseDelimited(`T (K),C (J/K),err,H (T)\n${body}`, { fileName: "run7.csv" });

function thrown(fn: () => unknown): InputError {
  try { fn(); } catch (e) { if (e instanceof InputError) return e; throw e; }
  throw new Error("expected an InputError");
}

describe("extractPoints", () => {
  it("extractPoints copies mapped columns to plain arrays with source lines", () => {
    const p = extractPoints(table("1,2,0.1,0\n3,4,0.2,1\n"), { temperature: 0, heatCapacity: 1, sigma: 2, field: 3 });
    expect(p).toEqual({ temperature: [1, 3], heatCapacity: [2, 4], sigma: [0.1, 0.2], field: [0, 1], lineNumbers: [2, 3], skipped: [] });
  });

  it("extractPoints leaves out unmapped optional columns", () => {
    const p = extractPoints(table("1,2,0.1,0\n"), { temperature: 0, heatCapacity: 1 });
    expect(p.sigma).toBeUndefined();
    expect(p.field).toBeUndefined();
  });

  it("extractPoints ignores bad cells in columns that are not mapped", () => {
    expect(extractPoints(table("1,2,x,0\n"), { temperature: 0, heatCapacity: 1 }).temperature).toEqual([1]);
  });

  it("extractPoints throws naming file, first bad line, column, column name and the count of others", () => {
    const e = thrown(() => extractPoints(table("1,2,0.1,0\n-1,2,0.1,0\n0,2,0.1,0\n2,x,0.1,0\n"), { temperature: 0, heatCapacity: 1 }));
    expect(e.where).toEqual({ file: "run7.csv", line: 3, column: 1, field: "T" });
    expect(e.message).toMatch(/invalid temperature: -1 .*> 0.*; 2 more invalid rows/);
  });

  it("extractPoints refuses zero and negative uncertainties", () => {
    const e = thrown(() => extractPoints(table("1,2,0,0\n"), { temperature: 0, heatCapacity: 1, sigma: 2 }));
    expect(e.where).toMatchObject({ line: 2, column: 3, field: "err" });
  });

  it("extractPoints skips bad rows on request and lists them", () => {
    const p = extractPoints(table("1,2,0.1,0\n2,NaN,0.1,0\n3,4,0.1,0\n"), { temperature: 0, heatCapacity: 1 }, { onInvalid: "skip" });
    expect(p.temperature).toEqual([1, 3]);
    expect(p.skipped).toEqual([{ line: 3, column: 2, field: "C", message: "invalid heatCapacity: missing or not a number (heat capacity must be a finite number)" }]);
  });

  it("extractPoints throws when every row is skipped", () => {
    expect(() => extractPoints(table("-1,2,0.1,0\n"), { temperature: 0, heatCapacity: 1 }, { onInvalid: "skip" })).toThrow(/no valid data rows/);
  });

  it("extractPoints refuses a mapping to a missing column or the same column twice", () => {
    expect(thrown(() => extractPoints(table("1,2,3,4\n"), { temperature: 0, heatCapacity: 9 })).where?.field).toBe("heatCapacity");
    expect(() => extractPoints(table("1,2,3,4\n"), { temperature: 0, heatCapacity: 0 })).toThrow(/already mapped to temperature/);
    expect(() => extractPoints(table("1,2,3,4\n"), { temperature: 0.5, heatCapacity: 1 })).toThrow(InputError);
  });
});
