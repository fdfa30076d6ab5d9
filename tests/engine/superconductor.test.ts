import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "./uncertainty.random";
import { analyzeJump, zeta3, BCS_JUMP_RATIO, BCS_GAP_RATIO, bcsGap, bcsJumpRatioFromGapEquation, fitPolynomial, type JumpInput } from "../../lib/engine/superconductor";
import { InputError } from "../../lib/engine/errors";

describe("BCS reference values", () => {
  // Analytic identity: ζ(3) = 1.2020569031595942… (Apéry's constant, from memory).
  it("zeta3() is Apéry's constant to 1e-14", () => {
    expectClose(zeta3(), 1.2020569031595942, { rel: 1e-14 });
  });
  // BCS, Phys. Rev. 108, 1175 (1957): ΔC/(γT_c) = 12/(7ζ(3)) ≈ 1.43.
  it("BCS_JUMP_RATIO is 12/(7ζ(3)) = 1.426", () => {
    expectClose(BCS_JUMP_RATIO, 1.4261, { abs: 1e-4 });
  });
  it("bcsJumpRatioFromGapEquation solves the gap equation near T_c and gives 12/(7ζ(3)) to 1e-4", () => {
    expectClose(bcsJumpRatioFromGapEquation(), BCS_JUMP_RATIO, { rel: 1e-4 });
  });
  // BCS: Δ(0) = π e^{−γ_Euler} k_BT_c ≈ 1.764 k_BT_c.
  it("bcsGap(t → 0) approaches Δ(0)/k_BT_c = π e^{−γ_E} ≈ 1.764", () => {
    expectClose(bcsGap(0.02), BCS_GAP_RATIO, { rel: 1e-6 });
    expect(() => bcsGap(1)).toThrow(InputError);
  });
});

describe("fitPolynomial", () => {
  it("fitPolynomial(degree 2) recovers an exact quadratic and its integral", () => {
    const x = [1, 2, 3, 4, 5, 6];
    const p = fitPolynomial(x, x.map((v) => 2 - v + 0.5 * v * v), 2);
    expectClose(p.at(10), 2 - 10 + 50, { rel: 1e-10 });
    expectClose(p.integral(0, 3), 6 - 4.5 + 4.5, { rel: 1e-10 });
  });
});

// Seeded synthetic data, invented: T_c = 10 K, γ_n = 5 mJ mol⁻¹ K⁻², β = 0.2 mJ mol⁻¹ K⁻⁴,
// 10 % non-superconducting fraction, the superconducting part a BCS-like
// C_es/T = γ_n(1+J) t^{-2.5} e^{b(1−1/t)} with J = 12/(7ζ(3)) and b fixed by entropy balance
// (∫₀¹ C_es/T dt = γ_n), a Gaussian spread of T_c, and relative noise on C.
const J = 12 / (7 * 1.2020569031595942);
const [GN, BETA, F, TC] = [5e-3, 2e-4, 0.1, 10];
const entropyOfBranch = (b: number) => {
  let s = 0;
  for (let i = 0; i < 20000; i++) {
    const x = (i + 0.5) / 20000;
    s += x ** -2.5 * Math.exp(b * (1 - 1 / x));
  }
  return ((1 + J) * s) / 20000;
};
const B_EXP = (() => {
  let [lo, hi] = [0.1, 10];
  for (let i = 0; i < 60; i++) [lo, hi] = entropyOfBranch((lo + hi) / 2) > 1 ? [(lo + hi) / 2, hi] : [lo, (lo + hi) / 2];
  return (lo + hi) / 2;
})();
const yIdeal = (t: number, tc: number) => (t < tc ? F * GN + (1 - F) * GN * (1 + J) * (t / tc) ** -2.5 * Math.exp(B_EXP * (1 - tc / t)) : GN);

function synthetic(sigmaTcK: number, relNoise: number, seed: number): JumpInput {
  const z = seededNormal(seed);
  const us = sigmaTcK > 0 ? Array.from({ length: 81 }, (_, k) => -4 + 0.1 * k) : [0];
  const ps = us.map((u) => Math.exp(-u * u / 2));
  const norm = ps.reduce((a, c) => a + c, 0);
  const T = Array.from({ length: 340 }, (_, i) => 0.4 + 0.04 * i);
  const clean = T.map((t) => t * us.reduce((acc, u, k) => acc + (ps[k] / norm) * yIdeal(t, TC + sigmaTcK * u), 0) + BETA * t ** 3);
  return {
    temperatureK: T,
    heatCapacityJPerMolK: clean.map((c) => c * (1 + relNoise * z())),
    stdErrorJPerMolK: relNoise > 0 ? clean.map((c) => relNoise * c) : undefined,
    gammaN: { value: GN, stdError: 0.02e-3 },
    beta: { value: BETA, stdError: 0.5e-6 },
    covGammaBeta: -0.8 * 0.02e-3 * 0.5e-6,
    normalState: "above-tc",
  };
}

describe("analyzeJump", () => {
  // Truth: T_c = 10 K, ΔC/(γ_n T_c) = (1 − 0.1) × 1.426 = 1.284, γ_r/γ_n = 0.1.
  const cases: [string, number, number, number][] = [
    ["a sharp, noiseless transition", 0, 0, 1],
    ["a 1.5 % spread of T_c", 0.15, 0, 1],
    ["a 1.5 % spread and 0.2 % noise (seed 1)", 0.15, 0.002, 1],
    ["a 1.5 % spread and 0.2 % noise (seed 2)", 0.15, 0.002, 2],
    ["a 3 % spread and 0.5 % noise", 0.3, 0.005, 3],
  ];
  for (const [label, sT, noise, seed] of cases) {
    it(`analyzeJump on ${label} finds T_c and ΔC/(γ_n T_c) within 3σ of the truth`, () => {
      const r = analyzeJump(synthetic(sT, noise, seed));
      expect(Math.abs(r.tc.value - TC)).toBeLessThanOrEqual(3 * (r.tc.stdError ?? 0));
      expect(Math.abs(r.jumpRatio.value - (1 - F) * J)).toBeLessThanOrEqual(3 * (r.jumpRatio.stdError ?? 0));
      expect(Math.abs((r.nonSuperconductingFraction?.value ?? NaN) - F)).toBeLessThanOrEqual(Math.max(3 * (r.nonSuperconductingFraction?.stdError ?? 0), 0.002));
    });
  }

  it("analyzeJump corrects the jump for the non-superconducting part to about the BCS value", () => {
    const r = analyzeJump(synthetic(0.15, 0, 1));
    expectClose(r.jumpRatioSuperconductingPart?.value ?? NaN, J, { rel: 0.02 });
  });

  it("analyzeJump echoes the normal-state source and returns an idealised step at T_c", () => {
    const r = analyzeJump({ ...synthetic(0.15, 0.002, 1), normalState: "field-above-hc2" });
    expect(r.normalState).toBe("field-above-hc2");
    expect(r.warnings[0]).toMatch(/field above H_c2/);
    const k = r.idealised.temperatureK.length;
    expect(r.idealised.temperatureK[k - 2]).toBe(r.tc.value);
    expect(r.idealised.cElOverT[k - 2]).toBe(GN);
    expect(r.idealised.cElOverT[k - 3]).toBeGreaterThan(GN);
  });

  it("analyzeJump's ΔC and its σ are consistent with ΔC = (ΔC/γ_nT_c)·γ_n·T_c (identity)", () => {
    const r = analyzeJump(synthetic(0.15, 0.004, 3));
    expect(r.deltaC.value).toBeCloseTo(r.jumpRatio.value * GN * r.tc.value * 1e3, 9);
    // The relative σ of ΔC cannot exceed the ratio's and T_c's combined by much, nor be far below the ratio's.
    const relJump = r.jumpRatio.stdError! / r.jumpRatio.value, relTc = r.tc.stdError! / r.tc.value;
    const relDeltaC = r.deltaC.stdError! / r.deltaC.value;
    expect(relDeltaC).toBeLessThan(2 * Math.hypot(relJump, relTc) + 1e-9);
    expect(relDeltaC).toBeGreaterThan(0.2 * relJump);
  });

  it("analyzeJump's σ(T_c) grows with the normal-state σ(γ_n)", () => {
    const base = synthetic(0.15, 0, 1);
    const small = analyzeJump(base).jumpRatio.stdError ?? NaN;
    const large = analyzeJump({ ...base, gammaN: { value: GN, stdError: 0.2e-3 }, covGammaBeta: 0 }).jumpRatio.stdError ?? NaN;
    expect(large).toBeGreaterThan(2 * small);
  });

  it("analyzeJump throws InputError when the data hold no jump", () => {
    const T = Array.from({ length: 50 }, (_, i) => 1 + 0.2 * i);
    const input = { ...synthetic(0, 0, 1), temperatureK: T, heatCapacityJPerMolK: T.map((t) => GN * t * 0.99 + BETA * t ** 3), stdErrorJPerMolK: undefined };
    expect(() => analyzeJump(input)).toThrow(/no superconducting transition/);
  });

  it("analyzeJump throws InputError when no normal-state data lie above the transition", () => {
    const d = synthetic(0, 0, 1);
    const n = d.temperatureK.findIndex((t) => t > 9.5);
    expect(() => analyzeJump({ ...d, temperatureK: d.temperatureK.slice(0, n), heatCapacityJPerMolK: d.heatCapacityJPerMolK.slice(0, n) })).toThrow(InputError);
  });

  it("analyzeJump rejects an unknown normal-state source and γ_n ≤ 0", () => {
    expect(() => analyzeJump({ ...synthetic(0, 0, 1), normalState: "guess" as "above-tc" })).toThrow(/normalState/);
    expect(() => analyzeJump({ ...synthetic(0, 0, 1), gammaN: { value: 0, stdError: null } })).toThrow(/gammaN/);
  });
});
