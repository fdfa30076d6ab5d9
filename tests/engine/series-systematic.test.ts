/**
 * The systematic σ of a recommended fit reaches the series values (pure readers of stored step
 * outputs; invented numbers) and the report's compact text.
 */
import { describe, it, expect } from "vitest";
import { valuesFromSteps } from "../../lib/server/series/extract";
import { formatStatSyst } from "../../lib/engine/scan";

const q = (name: string, value: number, stdError: number, systematicError?: number) => ({ name, symbol: name, value, stdError, unit: "mJ mol^-1 K^-2", ...(systematicError !== undefined ? { systematicError } : {}) });

describe("valuesFromSteps with a systematic σ", () => {
  it("valuesFromSteps keeps the systematic σ of γ and β from the derive step and scales it per formula unit", () => {
    const steps = [{ kind: "derive", position: 2, output: { ok: true, result: { basis: "atom", quantities: [q("gamma", 1.5, 0.01, 0.03), q("beta", 0.02, 0.0001, 0.0004), q("thetaD", 300, 1)] } } }];
    const v = valuesFromSteps(steps, 2);
    expect(v.gamma).toEqual({ value: 3, stdError: 0.02, systematicError: 0.06 });
    expect(v.beta!.systematicError).toBeCloseTo(0.0008, 15);
    expect(v.thetaD!.systematicError).toBeUndefined();
  });
  it("valuesFromSteps leaves the systematic σ out when the fit had none", () => {
    const steps = [{ kind: "derive", position: 2, output: { ok: true, result: { basis: "formula-unit", quantities: [q("gamma", 1.5, 0.01), q("beta", 0.02, 0.0001)] } } }];
    expect(valuesFromSteps(steps, 1).gamma).toEqual({ value: 1.5, stdError: 0.01 });
  });
  it("valuesFromSteps reads the systematic σ of a fit step's summary when there is no derive step", () => {
    const steps = [{ kind: "fit", position: 1, output: { ok: true, result: { summary: { basis: "formula-unit", gamma: { value: 3e-3, stdError: 1e-5, systematicError: 4e-5 }, beta: { value: 7e-5, stdError: 1e-7 } } } } }];
    const v = valuesFromSteps(steps, 1);
    expect(v.gamma!.systematicError).toBeCloseTo(0.04, 12);
    expect(formatStatSyst(v.gamma!.value, v.gamma!.stdError, v.gamma!.systematicError!)).toBe("3.000(10)(40)");
  });
});
