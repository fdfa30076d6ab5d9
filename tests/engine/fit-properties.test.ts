/** Property tests (fast-check, fixed seeds) on fitHeatCapacity: recovery, unit and order invariance. */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { fitHeatCapacity } from "../../lib/engine/fit";
import { debyeHeatCapacity } from "../../lib/engine/models";

const params = fc.record({
  gamma: fc.double({ min: 0.3e-3, max: 50e-3, noNaN: true }),
  beta: fc.double({ min: 1e-6, max: 1e-3, noNaN: true }),
  delta: fc.double({ min: -1e-7, max: 1e-7, noNaN: true }),
});
const grid = fc.record({ n: fc.integer({ min: 12, max: 80 }), lo: fc.double({ min: 0.4, max: 2, noNaN: true }), span: fc.double({ min: 3, max: 12, noNaN: true }) });
const temps = (g: { n: number; lo: number; span: number }) => Array.from({ length: g.n }, (_, i) => g.lo + (g.span * i) / (g.n - 1));
const value = (r: { parameters: readonly { name: string; value: number }[] }, n: string) => r.parameters.find((p) => p.name === n)!.value;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("fitHeatCapacity properties", () => {
  it("fitHeatCapacity(sommerfeld-t5) recovers γ, β, δ from noiseless data to ~1e-9", () => {
    fc.assert(
      fc.property(params, grid, (p, g) => {
        const T = temps(g);
        const C = T.map((t) => p.gamma * t + p.beta * t ** 3 + p.delta * t ** 5);
        const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C }, { model: "sommerfeld-t5" });
        expect(rel(value(r, "gamma"), p.gamma)).toBeLessThan(1e-9);
        expect(rel(value(r, "beta"), p.beta)).toBeLessThan(1e-9);
        expect(Math.abs(value(r, "delta") - p.delta)).toBeLessThan(1e-9 * (p.beta / g.span ** 2 + Math.abs(p.delta)));
      }),
      { seed: 20240601, numRuns: 60 },
    );
  });
  it("fitHeatCapacity(debye) recovers Θ_D from noiseless data to ~1e-9", () => {
    fc.assert(
      fc.property(fc.double({ min: 80, max: 600, noNaN: true }), fc.double({ min: 0.5e-3, max: 10e-3, noNaN: true }), (thetaD, gamma) => {
        const T = Array.from({ length: 40 }, (_, i) => 1 + (thetaD / 8) * (i / 39));
        const r = fitHeatCapacity({ temperatureK: T, heatCapacity: T.map((t) => gamma * t + debyeHeatCapacity(t, thetaD)) }, { model: "debye" });
        expect(r.converged).toBe(true);
        expect(rel(value(r, "thetaD"), thetaD)).toBeLessThan(1e-9);
        expect(rel(value(r, "gamma"), gamma)).toBeLessThan(1e-8);
      }),
      { seed: 7, numRuns: 25 },
    );
  });
  it("fitHeatCapacity is invariant under a change of units (C and σ in mJ instead of J) and a reordering of points", () => {
    fc.assert(
      fc.property(params, grid, fc.integer({ min: 1, max: 2 ** 30 }), (p, g, seed) => {
        const T = temps(g);
        let s = seed;
        const noise = () => ((s = (s * 16807) % 2147483647) / 2147483647 - 0.5) * 0.01;
        const C = T.map((t) => (p.gamma * t + p.beta * t ** 3) * (1 + noise()));
        const sigma = C.map((c) => 0.003 * Math.abs(c));
        const a = fitHeatCapacity({ temperatureK: T, heatCapacity: C, sigma });
        const b = fitHeatCapacity({ temperatureK: T, heatCapacity: C.map((c) => c * 1e3), sigma: sigma.map((x) => x * 1e3) });
        const perm = T.map((_, i) => i).sort((i, j) => ((i * 7919) % T.length) - ((j * 7919) % T.length));
        const c = fitHeatCapacity({ temperatureK: perm.map((i) => T[i]), heatCapacity: perm.map((i) => C[i]), sigma: perm.map((i) => sigma[i]) });
        a.parameters.forEach((q, k) => {
          expect(rel(b.parameters[k].value / 1e3, q.value)).toBeLessThan(1e-11);
          expect(rel(b.parameters[k].stdError! / 1e3, q.stdError!)).toBeLessThan(1e-10);
          expect(rel(c.parameters[k].value, q.value)).toBeLessThan(1e-11);
          expect(rel(c.parameters[k].stdError!, q.stdError!)).toBeLessThan(1e-10);
        });
        expect(rel(b.reducedChiSquare!, a.reducedChiSquare!)).toBeLessThan(1e-10);
        expect(rel(c.chiSquare!, a.chiSquare!)).toBeLessThan(1e-9);
      }),
      { seed: 99, numRuns: 50 },
    );
  });
});
