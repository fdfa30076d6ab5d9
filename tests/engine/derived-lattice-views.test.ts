/** Θ_D(T) by inverting the Debye function, and C/T³: identities and propagated σ. */
import { describe, expect, it } from "vitest";
import { effectiveDebyeTemperature, invertDebye, latticeOverT3 } from "../../lib/engine/derived";
import { debyeHeatCapacity } from "../../lib/engine/models/debyeFunction";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";
import { expectClose } from "../helpers/expectClose";

const temps = [0.5, 1, 2, 5, 10, 20, 40, 80, 150, 300];

describe("effectiveDebyeTemperature", () => {
  it.each([[100, 1], [343.5, 1], [275, 2]])("is constant at Θ_D = %s K (r = %s) for a pure Debye solid plus γT, to 6 digits (analytic identity)", (theta, r) => {
    const gamma = 1.5e-3;
    const c = temps.map((t) => gamma * t + debyeHeatCapacity(t, theta, r));
    const { points } = effectiveDebyeTemperature({ temperatureK: temps, heatCapacity: c, sigma: null, gamma: { value: gamma, stdError: null }, r });
    for (const p of points.filter((p) => p.temperatureK >= 1 && p.temperatureK <= 3 * theta)) expectClose(p.thetaDK!, theta, { rel: 1e-6 });
  });

  it("invertDebye round-trips the Debye function from T/Θ = 1e-3 to 10", () => {
    for (const ratio of [1e-3, 0.01, 0.07, 0.1, 0.5, 1, 3, 10]) {
      const theta = 250;
      const t = ratio * theta;
      expectClose(invertDebye(t, debyeHeatCapacity(t, theta)), theta, { rel: 1e-9 });
    }
  });

  it("effectiveDebyeTemperature gives null with a reason where C − γT is ≤ 0 or above 3rR", () => {
    const { points } = effectiveDebyeTemperature({ temperatureK: [1, 2], heatCapacity: [1e-3, 3 * R * 1.01], sigma: null, gamma: { value: 2e-3, stdError: null } });
    expect(points[0]!.thetaDK).toBeNull();
    expect(points[0]!.note).toMatch(/≤ 0/);
    expect(points[1]!.thetaDK).toBeNull();
    expect(points[1]!.note).toMatch(/Dulong–Petit/);
  });

  it("effectiveDebyeTemperature propagates σ(C) and σ(γ) to first order (checked by finite differences)", () => {
    const theta = 300, gamma = 2e-3, t = 8;
    const c = gamma * t + debyeHeatCapacity(t, theta);
    const sC = 1e-4, sG = 2e-5;
    const { points } = effectiveDebyeTemperature({ temperatureK: [t], heatCapacity: [c], sigma: [sC], gamma: { value: gamma, stdError: sG } });
    const h = 1e-7;
    const dThetaDC = (invertDebye(t, c - gamma * t + h) - invertDebye(t, c - gamma * t - h)) / (2 * h);
    expectClose(points[0]!.stdErrorK!, Math.abs(dThetaDC) * Math.hypot(sC, t * sG), { rel: 1e-4 });
  });

  it("effectiveDebyeTemperature refuses arrays of different lengths and a bad r", () => {
    expect(() => effectiveDebyeTemperature({ temperatureK: [1, 2], heatCapacity: [1], sigma: null, gamma: { value: 0, stdError: null } })).toThrow(/heatCapacity/);
    expect(() => effectiveDebyeTemperature({ temperatureK: [1], heatCapacity: [1], sigma: null, gamma: { value: 0, stdError: null }, r: 0 })).toThrow(/r/);
  });
});

describe("latticeOverT3", () => {
  it("latticeOverT3 is flat at 12π⁴R/(5Θ_D³) at low T for a Debye solid (analytic limit) and peaks near Θ_E/5 with an Einstein mode", () => {
    const theta = 200;
    const low = latticeOverT3({ temperatureK: [0.5, 1], heatCapacity: [0.5, 1].map((t) => 1e-3 * t + debyeHeatCapacity(t, theta)), sigma: null, gamma: { value: 1e-3, stdError: null } });
    expectClose(low[0]!.latticeOverT3, (12 * Math.PI ** 4 * R) / (5 * theta ** 3), { rel: 1e-6 });
    const thetaE = 50;
    const einstein = (t: number) => { const x = thetaE / t; return 3 * 0.05 * R * x * x * Math.exp(x) / (Math.exp(x) - 1) ** 2; };
    const ts = Array.from({ length: 200 }, (_, i) => 1 + i * 0.2);
    const v = latticeOverT3({ temperatureK: ts, heatCapacity: ts.map((t) => debyeHeatCapacity(t, 400) + einstein(t)), sigma: null, gamma: { value: 0, stdError: null } });
    const peak = v.reduce((a, b) => (b.latticeOverT3 > a.latticeOverT3 ? b : a));
    expect(peak.temperatureK).toBeGreaterThan(thetaE / 6);
    expect(peak.temperatureK).toBeLessThan(thetaE / 4);
  });
});
