import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { expectClose } from "../helpers/expectClose";
import {
  lambdaFromBandGamma,
  mcMillanTc,
  lambdaFromMcMillan,
  mcMillanTcQuantity,
  lambdaFromMcMillanQuantity,
  wilsonRatio,
  kadowakiWoodsRatio,
  molarSusceptibilitySI,
  dosFromGamma,
  KADOWAKI_WOODS_UNIVERSAL,
} from "../../lib/engine/derived";
import { AVOGADRO_PER_MOL, BOHR_MAGNETON_J_PER_T, ELECTRONVOLT_J, VACUUM_PERMEABILITY_N_PER_A2 } from "../../lib/engine/constants";
import { InputError } from "../../lib/engine/errors";

describe("lambdaFromBandGamma", () => {
  it("lambdaFromBandGamma(1.5, 1.0) is 0.5 with σ from both inputs", () => {
    const q = lambdaFromBandGamma({ value: 1.5e-3, stdError: 0.03e-3 }, { value: 1e-3, stdError: 0.04e-3 });
    expectClose(q.value, 0.5, { rel: 1e-12 });
    // analytic: σ² = (σ_γ/γ_b)² + (γ σ_b/γ_b²)²
    expectClose(q.stdError ?? NaN, Math.hypot(0.03, 1.5 * 0.04), { rel: 1e-7 });
  });
  it("lambdaFromBandGamma rejects γ_band ≤ 0", () => {
    expect(() => lambdaFromBandGamma({ value: 1, stdError: null }, { value: 0, stdError: null })).toThrow(/gammaBand/);
  });
});

describe("mcMillanTc / lambdaFromMcMillan", () => {
  it("lambdaFromMcMillan inverts mcMillanTc for λ in 0.3–2 and μ* in 0–0.2", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 2, noNaN: true }), fc.double({ min: 0, max: 0.2, noNaN: true }), fc.double({ min: 80, max: 600, noNaN: true }), (l, mu, th) => {
        const tc = mcMillanTc(l, th, mu);
        expectClose(lambdaFromMcMillan(tc, th, mu), l, { rel: 1e-9 });
      }),
      { seed: 7, numRuns: 200 },
    );
  });
  it("mcMillanTc rises with λ and falls with μ*", () => {
    expect(mcMillanTc(0.9, 300, 0.13)).toBeGreaterThan(mcMillanTc(0.8, 300, 0.13));
    expect(mcMillanTc(0.8, 300, 0.15)).toBeLessThan(mcMillanTc(0.8, 300, 0.1));
  });
  it("mcMillanTc is 0 when λ ≤ μ*(1+0.62λ)", () => {
    expect(mcMillanTc(0.1, 300, 0.13)).toBe(0);
    expect(mcMillanTcQuantity({ value: 0.1, stdError: 0.01 }, { value: 300, stdError: 3 }, 0.13).note).toMatch(/no superconductivity/);
  });
  // Check value: Nb, T_c = 9.25 K, Θ_D = 275 K (Kittel Table 5.1, from memory), μ* = 0.13 gives
  // λ ≈ 0.82, as in McMillan, Phys. Rev. 167, 331 (1968), Table IV (from memory; tolerance 0.05).
  it("lambdaFromMcMillan(Nb: 9.25 K, 275 K, 0.13) is about 0.82", () => {
    expectClose(lambdaFromMcMillan(9.25, 275, 0.13), 0.82, { abs: 0.05 });
  });
  it("lambdaFromMcMillan throws InputError when T_c is too high for Θ_D", () => {
    expect(() => lambdaFromMcMillan(100, 120, 0.13)).toThrow(InputError);
  });
  it("mcMillanTc rejects μ* ≥ 1 and λ < 0", () => {
    expect(() => mcMillanTc(0.5, 300, 1)).toThrow(/muStar/);
    expect(() => mcMillanTc(-0.5, 300, 0.1)).toThrow(/lambda/);
  });
  it("lambdaFromMcMillanQuantity: a larger Θ_D at fixed T_c needs a smaller λ, and σ is positive", () => {
    const q = lambdaFromMcMillanQuantity(9.25, { value: 275, stdError: 5 }, 0.13);
    expect(lambdaFromMcMillan(9.25, 280, 0.13)).toBeLessThan(q.value);
    expect(q.stdError).toBeGreaterThan(0);
  });
});

describe("wilsonRatio", () => {
  // Analytic identity: a free-electron gas has χ_Pauli = μ0 μ_B² D(E_F) and γ = (π²/3) k_B² D,
  // hence R_W = 1 exactly; given in cgs-emu the same χ must also give 1.
  it("wilsonRatio of a Pauli χ and γ from the same D(E_F) is 1 in SI and in emu/mol", () => {
    const gamma = 2e-3;
    const dosPerJPerMol = (dosFromGamma(gamma) / ELECTRONVOLT_J) * AVOGADRO_PER_MOL;
    const chiSI = VACUUM_PERMEABILITY_N_PER_A2 * BOHR_MAGNETON_J_PER_T ** 2 * dosPerJPerMol;
    expectClose(wilsonRatio({ value: chiSI, stdError: null }, "m3/mol", { value: gamma, stdError: null }).value, 1, { rel: 1e-12 });
    const chiEmu = chiSI / (4 * Math.PI * 1e-6);
    expectClose(wilsonRatio({ value: chiEmu, stdError: null }, "emu/mol", { value: gamma, stdError: null }).value, 1, { rel: 1e-9 });
  });
  // Check value: R_W ≈ 72.9 χ[10⁻³ emu/mol] / γ[mJ mol⁻¹ K⁻²], the form common in the
  // heavy-fermion literature (from memory).
  it("wilsonRatio(1e-3 emu/mol, 1 mJ mol⁻¹ K⁻²) is about 72.9", () => {
    expectClose(wilsonRatio({ value: 1e-3, stdError: null }, "emu/mol", { value: 1e-3, stdError: null }).value, 72.9, { rel: 0.005 });
  });
  it("wilsonRatio adds relative errors of χ and γ in quadrature", () => {
    const q = wilsonRatio({ value: 1e-3, stdError: 0.03e-3 }, "emu/mol", { value: 1e-3, stdError: 0.04e-3 });
    expectClose((q.stdError ?? NaN) / q.value, 0.05, { rel: 1e-9 });
  });
  it("molarSusceptibilitySI rejects an unknown unit", () => {
    expect(() => molarSusceptibilitySI(1, "cm3" as "m3/mol")).toThrow(/chi unit/);
  });
});

describe("kadowakiWoodsRatio", () => {
  it("kadowakiWoodsRatio(A = 10 μΩ cm K⁻², γ = 1000 mJ) is the universal 1.0e-5", () => {
    const q = kadowakiWoodsRatio({ value: 10, stdError: null }, { value: 1, stdError: null });
    expectClose(q.value, KADOWAKI_WOODS_UNIVERSAL, { rel: 1e-12 });
    expect(q.unit).toBe("μΩ cm K^2 mol^2 mJ^-2");
  });
  // Independent unit path: A in Ω m K⁻² over γ² in J² mol⁻² K⁻⁴; 1 μΩ cm K² mol² mJ⁻² = 10⁻² SI.
  it("kadowakiWoodsRatio equals the SI ratio A/γ² divided by 10⁻²", () => {
    const [A, g] = [0.37, 0.084];
    const q = kadowakiWoodsRatio({ value: A, stdError: 0.01 }, { value: g, stdError: 0.002 });
    expectClose(q.value * 1e-2, (A * 1e-8) / (g * g), { rel: 1e-12 });
    expectClose((q.stdError ?? NaN) / q.value, Math.hypot(0.01 / A, (2 * 0.002) / g), { rel: 1e-9 });
  });
  it("kadowakiWoodsRatio rejects A ≤ 0", () => {
    expect(() => kadowakiWoodsRatio({ value: 0, stdError: null }, { value: 1, stdError: null })).toThrow(/kwA/);
  });
});
