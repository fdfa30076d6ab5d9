import { describe, it, expect } from "vitest";
import { absoluteSigma, parseSigmaFlag, relativeSigma } from "../../lib/cli/data";
import { prettyUnit } from "../../lib/cli/format";
import { checkParameterValues } from "../../lib/cli/modelParams";
import { MODELS } from "../../lib/engine/models";
import { InputError } from "../../lib/engine/errors";

describe("CLI helpers", () => {
  it("relativeSigma gives P % of |C| and refuses C = 0 naming the file and line", () => {
    expect(relativeSigma([2, -4, 10], 5)).toEqual([0.1, 0.2, 0.5]);
    expect(() => relativeSigma([1, 0], 1, { file: "f.csv", lineNumbers: [3, 4] })).toThrow(/f\.csv, line 4/);
    for (const p of [0, -1, 101, NaN]) expect(() => relativeSigma([1], p)).toThrow(InputError);
  });
  it("absoluteSigma repeats one σ and refuses σ ≤ 0", () => {
    expect(absoluteSigma(3, 0.5)).toEqual([0.5, 0.5, 0.5]);
    expect(() => absoluteSigma(2, 0)).toThrow(/invalid --sigma: 0/);
  });
  it("parseSigmaFlag reads a number with an optional unit", () => {
    expect(parseSigmaFlag("0.02")).toEqual({ value: 0.02, unit: null });
    expect(parseSigmaFlag(" 2e-5 J/(mol*K) ")).toEqual({ value: 2e-5, unit: "J/(mol*K)" });
    expect(parseSigmaFlag(".5mJ/(mol*K)")).toEqual({ value: 0.5, unit: "mJ/(mol*K)" });
    for (const bad of ["", "abc", "-1", "0 mJ/(mol*K)"]) expect(() => parseSigmaFlag(bad), bad).toThrow(InputError);
  });
  it("prettyUnit writes exponents as superscripts and drops a dimensionless 1", () => {
    expect(prettyUnit("mJ mol^-1 K^-2")).toBe("mJ mol⁻¹ K⁻²");
    expect(prettyUnit("J mol^-1")).toBe("J mol⁻¹");
    expect(prettyUnit("K")).toBe("K");
    expect(prettyUnit("1")).toBe("");
  });
  it("checkParameterValues refuses a value outside the spec's bounds in display units and accepts the edges", () => {
    expect(() => checkParameterValues(MODELS.debye, { thetaD: 1e-3 }, "set")).not.toThrow();
    expect(() => checkParameterValues(MODELS.debye, { thetaD: 9e-4 }, "set")).toThrow(/--set thetaD=0\.0009/);
    expect(() => checkParameterValues(MODELS.debye, { thetaD: Infinity }, "fix")).toThrow(/--fix thetaD: not a finite number/);
    expect(() => checkParameterValues(MODELS.sommerfeld, { gamma: -1 }, "set")).not.toThrow();
  });
});
