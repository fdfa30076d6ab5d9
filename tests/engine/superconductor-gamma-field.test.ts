/** γ(H)/γ_n: a linear law and a √H law, each recovered from seeded synthetic data and preferred by AICc. */
import { describe, expect, it } from "vitest";
import { analyseGammaField } from "../../lib/engine/superconductor";

function normal(seed: number): () => number {
  let s = seed;
  const u = () => (s = (s * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

const gn = 7e-3; // J mol⁻¹ K⁻² (invented)
const hc2 = 4; // T
const fields = [0, 0.2, 0.4, 0.6, 0.8, 1.0, 1.3, 1.6, 2.0, 2.5, 3.0, 3.5];

function data(law: (h: number) => number, seed: number, rel = 0.01) {
  const z = normal(seed);
  const gamma = fields.map((f) => gn * law(f / hc2) * (1 + rel * z()) + 1e-6 * z());
  const sigma = fields.map((f) => Math.hypot(gn * law(f / hc2) * rel, 1e-6));
  return { fieldT: fields, gamma, sigma, gammaN: { value: gn, stdError: 0.01 * gn }, hc2T: hc2 };
}

describe("analyseGammaField", () => {
  it.each([3, 11, 23, 37, 51])("recovers a linear (fully gapped) γ(H) and prefers it by AICc (seed %i)", (seed) => {
    const r = analyseGammaField(data((h) => 0.05 + 0.95 * h, seed));
    expect(r.preferred).toBe("linear");
    const lin = r.laws[0];
    expect(Math.abs(lin.intercept.value - 0.05)).toBeLessThan(3 * lin.intercept.stdError + 0.01);
    expect(Math.abs(lin.slope.value - 0.95)).toBeLessThan(3 * lin.slope.stdError + 0.015);
  });

  it.each([3, 11, 23, 37, 51])("recovers a √H (line nodes) γ(H) and prefers it by AICc (seed %i)", (seed) => {
    const r = analyseGammaField(data((h) => 0.02 + 0.98 * Math.sqrt(h), seed));
    expect(r.preferred).toBe("sqrt");
    const sq = r.laws[1];
    expect(Math.abs(sq.slope.value - 0.98)).toBeLessThan(3 * sq.slope.stdError + 0.015);
    expect(r.deltaAicc!).toBeGreaterThan(10);
    expect(r.cautions.join(" ")).toMatch(/multiband/);
  });

  it("analyseGammaField refuses fewer than three fields, a field above H_c2 and mismatched arrays", () => {
    const base = data((h) => h, 1);
    expect(() => analyseGammaField({ ...base, fieldT: [0, 1], gamma: [1, 2], sigma: null })).toThrow(/three fields/);
    expect(() => analyseGammaField({ ...base, fieldT: fields.map((f) => f + 1) })).toThrow(/H_c2/);
    expect(() => analyseGammaField({ ...base, gamma: [1] })).toThrow(/gamma/);
  });
});
