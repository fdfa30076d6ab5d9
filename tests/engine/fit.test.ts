import { describe, it, expect } from "vitest";
import { fitHeatCapacity, type FitParameter } from "../../lib/engine/fit";
import { debyeHeatCapacity, schottkyHeatCapacity, einsteinHeatCapacity, alphaModelReducedHeatCapacity } from "../../lib/engine/models";
import { InputError } from "../../lib/engine/errors";
import { expectClose } from "../helpers/expectClose";

/** Seeded Gaussian noise (mulberry32 + Box–Muller). */
function rng(seed: number) {
  let a = seed >>> 0;
  const u = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(u() + 1e-300)) * Math.cos(2 * Math.PI * u());
}

const grid = (n: number, lo: number, hi: number) => Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
const byName = (r: { parameters: readonly FitParameter[] }, n: string) => r.parameters.find((p) => p.name === n)!;

// Synthetic data (invented, seeded): γ = 1.35 mJ mol⁻¹ K⁻², β = 0.0204 mJ mol⁻¹ K⁻⁴ (roughly Θ_D ≈ 460 K).
const GAMMA = 1.35e-3;
const BETA = 2.04e-5;

describe("fitHeatCapacity with linear models", () => {
  it("fitHeatCapacity(sommerfeld) recovers γ and β within 3σ from seeded noisy data with absolute σ", () => {
    const noise = rng(7);
    const T = grid(40, 1.5, 8);
    const sigma = T.map((t) => 0.005 * (GAMMA * t + BETA * t ** 3));
    const C = T.map((t, i) => GAMMA * t + BETA * t ** 3 + sigma[i] * noise());
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C, sigma });
    expect(r.method).toBe("linear-qr");
    expect(r.weighted).toBe(true);
    expect(r.errorsScaledByReducedChiSquare).toBe(false);
    expect(Math.abs(byName(r, "gamma").value - GAMMA)).toBeLessThan(3 * byName(r, "gamma").stdError!);
    expect(Math.abs(byName(r, "beta").value - BETA)).toBeLessThan(3 * byName(r, "beta").stdError!);
    expect(r.reducedChiSquare!).toBeGreaterThan(0.5);
    expect(r.reducedChiSquare!).toBeLessThan(1.6);
    expect(r.dof).toBe(38);
    expect(r.correlation!.names).toEqual(["gamma", "beta"]);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(Object.isFrozen(r) && Object.isFrozen(r.parameters[0])).toBe(true);
  });
  it("fitHeatCapacity without σ is unweighted and scales errors by the residual variance", () => {
    const noise = rng(3);
    const T = grid(30, 1, 6);
    const C = T.map((t) => GAMMA * t + BETA * t ** 3 + 1e-6 * noise());
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C });
    expect(r.weighted).toBe(false);
    expect(r.errorsScaledByReducedChiSquare).toBe(true);
    expect(r.parameters[0].unit).toBe("J/(mol*K^2)");
  });
  it("fitHeatCapacity with scaleErrors multiplies the covariance by χ²_red", () => {
    const noise = rng(5);
    const T = grid(30, 1, 6);
    const sigma = T.map(() => 2e-6);
    const C = T.map((t) => GAMMA * t + BETA * t ** 3 + 1e-6 * noise());
    const a = fitHeatCapacity({ temperatureK: T, heatCapacity: C, sigma });
    const b = fitHeatCapacity({ temperatureK: T, heatCapacity: C, sigma }, { scaleErrors: true });
    expectClose(byName(b, "gamma").stdError!, byName(a, "gamma").stdError! * Math.sqrt(a.reducedChiSquare!), { rel: 1e-12 });
    expect(b.errorsScaledByReducedChiSquare).toBe(true);
  });
  it("fitHeatCapacity window bounds are inclusive", () => {
    const T = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: T.map((t) => GAMMA * t + BETA * t ** 3) }, { tMinK: 2, tMaxK: 9 });
    expect(r.window.nPoints).toBe(8);
    expect(r.window.indices).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
  });
  it("fitHeatCapacity({expression}) detects a linear expression and matches the nuclear model", () => {
    const T = grid(25, 0.3, 5);
    const C = T.map((t) => GAMMA * t + BETA * t ** 3 + 2e-5 / t ** 2 + 1e-7 * Math.sin(7 * t));
    const a = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: { expression: "g*T + b*T^3 + a/T^2" } });
    const b = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "nuclear" });
    expect(a.method).toBe("linear-qr");
    expectClose(byName(a, "g").value, byName(b, "gamma").value, { rel: 1e-12 });
    expectClose(byName(a, "a").stdError!, byName(b, "A").stdError!, { rel: 1e-10 });
  });
  it("fitHeatCapacity with fixed β fits γ alone", () => {
    const T = grid(20, 1, 5);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: T.map((t) => GAMMA * t + BETA * t ** 3) }, { fixed: { beta: BETA } });
    expectClose(byName(r, "gamma").value, GAMMA, { rel: 1e-12 });
    expect(byName(r, "beta").fixed).toBe(true);
    expect(byName(r, "beta").stdError).toBeNull();
    expect(r.nFree).toBe(1);
  });
});

describe("fitHeatCapacity input errors and degenerate cases", () => {
  it("fitHeatCapacity throws InputError for a length mismatch, T ≤ 0, σ ≤ 0 and an unknown parameter", () => {
    expect(() => fitHeatCapacity({ temperatureK: [1, 2, 3], heatCapacity: [1, 2] })).toThrow(InputError);
    expect(() => fitHeatCapacity({ temperatureK: [1, 2], heatCapacity: [1, 2], sigma: [1] })).toThrow(/sigma/);
    expect(() => fitHeatCapacity({ temperatureK: [0, 2, 3], heatCapacity: [1, 2, 3] })).toThrow(/point 1/);
    expect(() => fitHeatCapacity({ temperatureK: [1, 2, 3], heatCapacity: [1, 2, 3], sigma: [1, 0, 1] })).toThrow(/point 2/);
    expect(() => fitHeatCapacity({ temperatureK: [1, 2, 3], heatCapacity: [1, 2, 3] }, { fixed: { theta: 1 } })).toThrow(/unknown parameter/);
    expect(() => fitHeatCapacity({ temperatureK: [1, 2, 3], heatCapacity: [1, 2, 3] }, { tMinK: 5 })).toThrow(/no points/);
  });
  it("fitHeatCapacity on one point reports converged:false (rank deficient) and no standard errors", () => {
    const r = fitHeatCapacity({ temperatureK: [2], heatCapacity: [0.003] });
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/rank deficient/);
    expect(r.parameters.every((p) => p.stdError === null)).toBe(true);
    expect(r.warnings.join(" ")).toMatch(/fewer than 8/);
  });
  it("fitHeatCapacity on equal temperatures reports converged:false (γ and β cannot be separated)", () => {
    const r = fitHeatCapacity({ temperatureK: [3, 3, 3, 3], heatCapacity: [0.004, 0.0041, 0.0039, 0.004] });
    expect(r.converged).toBe(false);
  });
  it("fitHeatCapacity on equal C values fits them (a finite answer, negative β warned)", () => {
    const T = grid(10, 1, 5);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: T.map(() => 0.002) });
    expect(r.converged).toBe(true);
    expect(r.warnings.join(" ")).toMatch(/β is negative/);
  });
  it("fitHeatCapacity holds a parameter on its bound, with no standard error and a warning", () => {
    const T = grid(20, 1, 5);
    const C = T.map((t) => -2e-4 * t + BETA * t ** 3);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { bounds: { gamma: [0, null] } });
    expect(byName(r, "gamma").value).toBe(0);
    expect(r.parameters[0].atBound).toBe(true);
    expect(byName(r, "gamma").stdError).toBeNull();
    expect(byName(r, "beta").stdError).not.toBeNull();
    expect(r.warnings.join(" ")).toMatch(/gamma ends on its bound/);
  });
  it("fitHeatCapacity(debye) with Θ_D on its upper bound holds it there", () => {
    const T = grid(30, 2, 20);
    const C = T.map((t) => GAMMA * t + debyeHeatCapacity(t, 300));
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "debye", bounds: { thetaD: [10, 250] } });
    expect(byName(r, "thetaD").value).toBe(250);
    expect(r.parameters.find((p) => p.name === "thetaD")!.atBound).toBe(true);
    expect(byName(r, "thetaD").stdError).toBeNull();
  });
});

describe("fitHeatCapacity with nonlinear models (noiseless synthetic data)", () => {
  it("fitHeatCapacity(debye) recovers γ and Θ_D", () => {
    const T = grid(60, 2, 40);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: T.map((t) => GAMMA * t + debyeHeatCapacity(t, 343, 2)) }, { model: "debye", r: 2 });
    expect(r.converged, r.message).toBe(true);
    expectClose(byName(r, "thetaD").value, 343, { rel: 1e-9 });
    expectClose(byName(r, "gamma").value, GAMMA, { rel: 1e-8 });
  });
  it("fitHeatCapacity(einstein) recovers Θ_E and n_E", () => {
    const T = grid(60, 2, 30);
    const C = T.map((t) => GAMMA * t + BETA * t ** 3 + einsteinHeatCapacity(t, 60, 0.3));
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "einstein", start: { thetaE: 50, nE: 0.2 } });
    expect(r.converged, r.message).toBe(true);
    expectClose(byName(r, "thetaE").value, 60, { rel: 1e-8 });
    expectClose(byName(r, "nE").value, 0.3, { rel: 1e-8 });
  });
  it("fitHeatCapacity(schottky) recovers the gap and amount from its own guess", () => {
    const T = grid(80, 0.5, 12);
    const C = T.map((t) => GAMMA * t + BETA * t ** 3 + schottkyHeatCapacity(t, 6, 1, 0.01));
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "schottky" });
    expect(r.converged, r.message).toBe(true);
    expectClose(byName(r, "gap").value, 6, { rel: 1e-8 });
    expectClose(byName(r, "n").value, 0.01, { rel: 1e-8 });
    expect(byName(r, "g").fixed).toBe(true);
  });
  it("fitHeatCapacity(bcs) needs γ_n and T_c, then recovers a and b", () => {
    const T = grid(40, 0.3, 1.2);
    const C = T.map((t) => 1e-3 * 1.5 * 8.5 * Math.exp((-1.44 * 1.5) / t) + BETA * t ** 3);
    expect(() => fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "bcs" })).toThrow(/needs gammaN/);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "bcs", fixed: { gammaN: 1e-3, tc: 1.5 } });
    expect(r.converged, r.message).toBe(true);
    expectClose(byName(r, "a").value, 8.5, { rel: 1e-7 });
    expectClose(byName(r, "b").value, 1.44, { rel: 1e-7 });
  });
  it("fitHeatCapacity(alpha-model) recovers α, T_c, γ_n and β", () => {
    const T = grid(60, 0.4, 4);
    const C = T.map((t) => 2e-3 * 1.9 * alphaModelReducedHeatCapacity(t / 1.9, 2.1) + BETA * t ** 3);
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "alpha-model" });
    expect(r.converged, r.message).toBe(true);
    expectClose(byName(r, "alpha").value, 2.1, { rel: 1e-6 });
    expectClose(byName(r, "tc").value, 1.9, { rel: 1e-6 });
    expectClose(byName(r, "gammaN").value, 2e-3, { rel: 1e-6 });
  });
});

describe("fitHeatCapacity warnings", () => {
  const T = grid(40, 1, 30);
  it("fitHeatCapacity(sommerfeld) warns when the window reaches past Θ_D/15 and when residuals have structure", () => {
    const C = T.map((t) => GAMMA * t + debyeHeatCapacity(t, 200));
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C });
    const w = r.warnings.join("\n");
    expect(w).toMatch(/Θ_D\//);
    expect(w).toMatch(/T³ law is off the Debye function/);
    expect(w).toMatch(/runs test/);
  });
  it("fitHeatCapacity(sommerfeld) warns about a low-T upturn in C/T from a nuclear tail", () => {
    const Tn = grid(40, 0.1, 3);
    const C = Tn.map((t) => GAMMA * t + BETA * t ** 3 + 3e-6 / t ** 2);
    expect(fitHeatCapacity({ temperatureK: Tn, heatCapacity: C }).warnings.join(" ")).toMatch(/turns up/);
    expect(fitHeatCapacity({ temperatureK: Tn, heatCapacity: C }, { model: "nuclear" }).warnings.join(" ")).not.toMatch(/turns up/);
  });
  it("fitHeatCapacity warns about χ²_red far from 1 when σ is too small", () => {
    const noise = rng(11);
    const Tw = grid(30, 1, 5);
    const C = Tw.map((t) => GAMMA * t + BETA * t ** 3 + 1e-6 * noise());
    const r = fitHeatCapacity({ temperatureK: Tw, heatCapacity: C, sigma: Tw.map(() => 1e-7) });
    expect(r.warnings.join(" ")).toMatch(/χ²_red = .* is far from 1/);
  });
  it("fitHeatCapacity warns about |corr(γ, β)| > 0.98 in a narrow window", () => {
    const noise = rng(2);
    const Tw = grid(12, 4, 4.4);
    const C = Tw.map((t) => GAMMA * t + BETA * t ** 3 + 1e-7 * noise());
    expect(fitHeatCapacity({ temperatureK: Tw, heatCapacity: C }).warnings.join(" ")).toMatch(/strongly correlated/);
  });
  it("fitHeatCapacity warns about implausible magnitudes (common practice ranges)", () => {
    const Tw = grid(12, 1, 4);
    const C = Tw.map((t) => 5 * t + BETA * t ** 3);
    expect(fitHeatCapacity({ temperatureK: Tw, heatCapacity: C }).warnings.join(" ")).toMatch(/outside the usual/);
  });
  it("fitHeatCapacity on clean low-T data gives no warnings", () => {
    const noise = rng(19);
    const Tw = grid(30, 1, 6);
    const sigma = Tw.map((t) => 0.003 * (GAMMA * t + BETA * t ** 3));
    const C = Tw.map((t, i) => GAMMA * t + BETA * t ** 3 + sigma[i] * noise());
    expect(fitHeatCapacity({ temperatureK: Tw, heatCapacity: C, sigma }).warnings).toEqual([]);
  });
});
