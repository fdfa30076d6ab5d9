import { describe, it, expect } from "vitest";
import { parseArgs, getAssignments, getList, getNumber, getBoolean, getString } from "../../lib/cli/args";
import { InputError } from "../../lib/engine/errors";

const SPEC = {
  "t-min": { kind: "number", help: "lower window edge", meta: "K" },
  model: { kind: "string", help: "model" },
  json: { kind: "boolean", help: "json" },
  T: { kind: "list", help: "temperatures" },
  set: { kind: "assignments", help: "parameters" },
} as const;

describe("parseArgs", () => {
  it("parseArgs reads positionals, --name value, --name=value and booleans", () => {
    const a = parseArgs(["file.csv", "--t-min", "2.5", "--model=debye", "--json", "--T", "5,10", "--set", "thetaD=300,r=2"], SPEC);
    expect(a.positionals).toEqual(["file.csv"]);
    expect(getNumber(a, "t-min")).toBe(2.5);
    expect(getString(a, "model")).toBe("debye");
    expect(getBoolean(a, "json")).toBe(true);
    expect(getList(a, "T")).toEqual([5, 10]);
    expect(getAssignments(a, "set")).toEqual({ thetaD: 300, r: 2 });
  });
  it("parseArgs keeps a negative number as a flag value", () => {
    expect(getNumber(parseArgs(["--t-min", "-1"], SPEC), "t-min")).toBe(-1);
  });
  it("parseArgs throws InputError for unknown, repeated, valueless and non-numeric flags", () => {
    expect(() => parseArgs(["--nope"], SPEC)).toThrow(/unknown option --nope/);
    expect(() => parseArgs(["--json", "--json"], SPEC)).toThrow(/given twice/);
    expect(() => parseArgs(["--t-min"], SPEC)).toThrow(/needs a value/);
    expect(() => parseArgs(["--t-min", "abc"], SPEC)).toThrow(InputError);
    expect(() => parseArgs(["--set", "thetaD"], SPEC)).toThrow(/name=value/);
    expect(() => parseArgs(["--T", "1,,2"], SPEC)).toThrow(/--T/);
  });
});
