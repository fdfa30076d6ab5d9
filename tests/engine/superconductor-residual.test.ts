/**
 * Residual γ of a superconductor (lib/engine/superconductor/residual.ts) on seeded synthetic
 * data, invented for the test: C = γ_r T + (γ_n − γ_r) T_c c_α(T/T_c) + βT³ with the α-model c_α
 * of lib/engine/models (weak-coupling BCS for α = 1.764), noise relative to C; and a power-law
 * state C_es = 3(γ_n − γ_r) T_c (T/T_c)³ (entropy-conserving, as for point nodes).
 * Truth: T_c = 10 K, γ_n = 5 mJ mol⁻¹ K⁻², β = 0.2 mJ mol⁻¹ K⁻⁴, γ_r/γ_n as given per case.
 */
import { describe, it, expect } from "vitest";
import { analyzeJump, fitPolynomial, residualGamma, type JumpInput } from "../../lib/engine/superconductor";
import { alphaModelReducedHeatCapacity, BCS_GAP_RATIO } from "../../lib/engine/models";
import { seededNormal } from "./uncertainty.random";

const [GN, BETA, TC] = [5e-3, 2e-4, 10];

function data(fraction: number, alpha: number, relNoise: number, seed: number): JumpInput {
  const z = seededNormal(seed);
  const T = Array.from({ length: 300 }, (_, i) => 0.6 + 0.05 * i);
  const clean = T.map((t) => fraction * GN * t + (1 - fraction) * GN * TC * alphaModelReducedHeatCapacity(t / TC, alpha) + BETA * t ** 3);
  return {
    temperatureK: T,
    heatCapacityJPerMolK: clean.map((c) => c * (1 + relNoise * z())),
    stdErrorJPerMolK: relNoise > 0 ? clean.map((c) => relNoise * c) : undefined,
    gammaN: { value: GN, stdError: 0.01e-3 },
    beta: { value: BETA, stdError: 0.2e-6 },
    normalState: "above-tc",
  };
}

describe("residual γ of a gapped superconductor", () => {
  it("a straight line in T² through clean BCS C_el/T at T ≤ 0.15 T_c has an intercept more than 2σ below 0 (why the gapped form is needed)", () => {
    const d = data(0, BCS_GAP_RATIO, 0, 1);
    const idx = d.temperatureK.map((t, i) => (t <= 0.15 * TC ? i : -1)).filter((i) => i >= 0);
    const line = fitPolynomial(idx.map((i) => d.temperatureK[i] ** 2), idx.map((i) => d.heatCapacityJPerMolK[i] / d.temperatureK[i] - BETA * d.temperatureK[i] ** 2), 1);
    expect(line.at(0)).toBeLessThan(-2 * line.stdErrorAt(0));
  });

  for (const [alpha, label] of [[BCS_GAP_RATIO, "weak-coupling BCS"], [2.2, "a strong-coupling gap α = 2.2"], [1.5, "a small gap α = 1.5"]] as const) {
    it(`analyzeJump on clean ${label} data finds γ_r ≈ 0 and warns of no negative γ_r`, () => {
      const r = analyzeJump(data(0, alpha, 0, 1));
      expect(r.gammaResidual).not.toBeNull();
      expect(Math.abs(r.gammaResidual!.value)).toBeLessThan(0.01 * GN * 1e3);
      expect(r.warnings.join(" ")).not.toMatch(/negative residual/);
    });
  }

  for (const seed of [1, 2, 3]) {
    it(`analyzeJump with 10 % non-superconducting fraction and 0.3 % noise (seed ${seed}) gives γ_r/γ_n within 3σ of 0.1`, () => {
      const r = analyzeJump(data(0.1, BCS_GAP_RATIO, 0.003, seed));
      const f = r.nonSuperconductingFraction!;
      expect(Math.abs(f.value - 0.1)).toBeLessThanOrEqual(3 * f.stdError!);
      expect(f.stdError!).toBeLessThan(0.02);
      expect(r.gammaResidual!.note).toMatch(/T\^\(−5\/2\) e\^\(−Δ\/T\)/);
    });
  }

  for (const seed of [1, 2]) {
    it(`analyzeJump on a power-law superconducting state (C_es ∝ T³, nodes; 5 % normal fraction, seed ${seed}) chooses the line in T² by AICc and finds γ_r within 3σ`, () => {
      const z = seededNormal(seed);
      const T = Array.from({ length: 300 }, (_, i) => 0.6 + 0.05 * i);
      const clean = T.map((t) => (t >= TC ? GN * t : 0.05 * GN * t + 0.95 * GN * 3 * TC * (t / TC) ** 3) + BETA * t ** 3);
      const r = analyzeJump({ ...data(0, BCS_GAP_RATIO, 0, 1), heatCapacityJPerMolK: clean.map((c) => c * (1 + 0.003 * z())), stdErrorJPerMolK: clean.map((c) => 0.003 * c) });
      const g = r.gammaResidual!;
      expect(g.note).toMatch(/power law; lower AICc/);
      expect(Math.abs(g.value - 0.05 * GN * 1e3)).toBeLessThanOrEqual(3 * g.stdError!);
    });
  }

  it("residualGamma returns null with fewer than 6 points below the limit", () => {
    expect(residualGamma([1, 2, 3, 4, 5], [1, 1, 1, 1, 1], 10, undefined, 20)).toBeNull();
  });
});
