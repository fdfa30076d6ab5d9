/**
 * The global start on the cases that defeated a start from the model's rough guess, the
 * "better minimum seen" rule, and the engine faults of issue 13 part 5 (overflow, invalid model
 * parameters). Data are invented for the test (deterministic ±0.5 % ripple as noise; σ = 0.5 %
 * of C).
 */
import { describe, it, expect } from "vitest";
import { fitCore, fitHeatCapacity, registryCore } from "../../lib/engine/fit";
import { MODELS, debye, evaluateHeatCapacity, getModel } from "../../lib/engine/models";
import { InputError } from "../../lib/engine/errors";

type P = Record<string, number>;

function data(model: string, truth: P, t0: number, t1: number) {
  const m = MODELS[model];
  const T = Array.from({ length: 80 }, (_, i) => t0 * (t1 / t0) ** (i / 79));
  const clean = T.map((t) => m.evaluate(t, truth));
  return { temperatureK: T, heatCapacity: clean.map((c, i) => c * (1 + 0.005 * Math.sin(7 * i))), sigma: clean.map((c) => 0.005 * c) };
}

const CASES: [string, P, number, number][] = [
  // a Schottky upturn whose peak (T ≈ Δ/2.4 = 0.21 K) lies below the data
  ["schottky", { gamma: 3e-3, beta: 2e-4, n: 2e-3, gap: 0.5, g: 1 }, 0.4, 10],
  ["schottky", { gamma: 3e-3, beta: 2e-4, n: 5e-3, gap: 1.5, g: 1 }, 1.0, 12],
  ["einstein", { gamma: 2e-3, beta: 1e-4, nE: 0.05, thetaE: 25 }, 2, 40],
  ["einstein", { gamma: 2e-3, beta: 1e-4, nE: 0.05, thetaE: 8 }, 1, 30],
];

describe("global start where the model's guess alone fails", () => {
  it.each(CASES)("fitHeatCapacity(%s %j) without a start finds the true minimum; from the guess alone (globalSearch: false) it does not", (model, truth, t0, t1) => {
    const d = data(model, truth, t0, t1);
    const global = fitHeatCapacity(d, { model });
    const local = fitHeatCapacity(d, { model, globalSearch: false });
    expect(global.converged, global.message).toBe(true);
    expect(global.reducedChiSquare!).toBeLessThan(1.5);
    const nonlinear = model === "schottky" ? "gap" : "thetaE";
    const p = global.parameters.find((q) => q.name === nonlinear)!;
    expect(Math.abs(p.value - truth[nonlinear])).toBeLessThan(5 * p.stdError!);
    expect(local.chiSquare!).toBeGreaterThan(10 * global.chiSquare!);
  });
});

describe("user expressions without a start", () => {
  it("fitHeatCapacity({expression: a user's two-level Schottky}) without a start finds the gap by the multi-start (γ, β, n solved exactly)", () => {
    const truth = { gamma: 3e-3, beta: 2e-4, n: 5e-3, gap: 1.5, g: 1 };
    const d = data("schottky", truth, 0.3, 10);
    const r = fitHeatCapacity(d, { model: { expression: "g*T + b*T^3 + n*8.314462618*(D/T)^2*exp(-D/T)/(1+exp(-D/T))^2" } });
    expect(r.converged, r.message).toBe(true);
    expect(r.message).toMatch(/global search \(\d+ of \d+ starts over D with the linear parameters solved exactly/);
    const D = r.parameters.find((p) => p.name === "D")!;
    expect(Math.abs(D.value - 1.5)).toBeLessThan(5 * D.stdError!);
    expect(r.reducedChiSquare!).toBeLessThan(1.5);
  });
});

describe("a fit that ends where a better minimum was seen is not converged", () => {
  it("fitHeatCapacity(einstein, start Θ_E = 1000 K) ends on a worse minimum and says converged:false, naming the lower χ² of the search", () => {
    const d = data("einstein", { gamma: 2e-3, beta: 1e-4, nE: 0.3, thetaE: 60 }, 2, 40);
    const r = fitHeatCapacity(d, { model: "einstein", start: { thetaE: 1000 } });
    expect(r.converged).toBe(false);
    expect(r.warnings.join(" ")).toMatch(/not converged: ended at χ² = .* although the search met χ² = .* at thetaE = 60\.\d* K: not the global minimum/);
    expect(r.parameters.every((p) => p.stdError === null)).toBe(true);
  });
  it("fitHeatCapacity(einstein, start near the truth) converges and says it was checked against the search", () => {
    const d = data("einstein", { gamma: 2e-3, beta: 1e-4, nE: 0.3, thetaE: 60 }, 2, 40);
    const r = fitHeatCapacity(d, { model: "einstein", start: { thetaE: 55 } });
    expect(r.converged, r.message).toBe(true);
    expect(r.message).toMatch(/from the given start, checked against a global search/);
  });
  it("fitHeatCapacity(globalSearch: false) runs LM alone and mentions no search", () => {
    const d = data("einstein", { gamma: 2e-3, beta: 1e-4, nE: 0.3, thetaE: 60 }, 2, 40);
    expect(fitHeatCapacity(d, { model: "einstein", start: { thetaE: 55 }, globalSearch: false }).message).not.toMatch(/search/);
  });
});

describe("engine faults: overflow and invalid parameters", () => {
  const T = Array.from({ length: 30 }, (_, i) => 2 + i);
  it("fitHeatCapacity(debye) on C near 1e300 refuses with InputError naming heatCapacity and the overflow", () => {
    const C = T.map((t) => 1e300 * (1e-3 * t + 1e-5 * t ** 3));
    let err: unknown;
    try {
      fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "debye" });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).field).toBe("heatCapacity");
    expect((err as Error).message).toMatch(/overflows/);
  });
  it("fitCore on values whose squares overflow reports converged:false with a message, never converged with χ² = null", () => {
    const x = Float64Array.from(T);
    const y = Float64Array.from(T, (t) => 1e200 * (t + 0.3 * Math.sin(3 * t)));
    const core = registryCore(getModel("sommerfeld"), {});
    const r = fitCore(core, x, y, null, { start: new Float64Array(2).fill(NaN), fixed: [false, false], lower: Float64Array.of(-Infinity, -Infinity), upper: Float64Array.of(Infinity, Infinity), scaleErrors: false });
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/not finite/);
  });
  it("evaluateHeatCapacity(debye, Θ_D = −5 K) throws InputError naming thetaD", () => {
    let err: unknown;
    try {
      evaluateHeatCapacity(debye, [1, 2], { gamma: 1e-3, thetaD: -5 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).field).toBe("thetaD");
    expect((err as Error).message).toMatch(/invalid thetaD: -5/);
  });
  it("evaluateHeatCapacity refuses a missing or non-finite parameter by name", () => {
    expect(() => evaluateHeatCapacity(debye, [1], { gamma: 1e-3 })).toThrow(/invalid thetaD: undefined/);
    expect(() => evaluateHeatCapacity(debye, [1], { gamma: NaN, thetaD: 300 })).toThrow(/invalid gamma: NaN/);
  });
  it("evaluateHeatCapacity gives the model's values for valid parameters", () => {
    expect(evaluateHeatCapacity(debye, [2, 5], { gamma: 1e-3, thetaD: 300 })).toEqual([2, 5].map((t) => debye.evaluate(t, { gamma: 1e-3, thetaD: 300 })));
  });
  it("fitHeatCapacity(debye, fixed Θ_D = −5) throws InputError naming thetaD", () => {
    expect(() => fitHeatCapacity({ temperatureK: T, heatCapacity: T.map((t) => 1e-3 * t) }, { model: "debye", fixed: { thetaD: -5 } })).toThrow(/invalid thetaD: -5/);
  });
});
