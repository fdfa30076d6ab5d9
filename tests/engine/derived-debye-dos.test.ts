import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { thetaDFromBeta, betaFromThetaD, debyeTemperature, gammaPerDosFactor, dosFromGamma, gammaFromDos, densityOfStates } from "../../lib/engine/derived";
import { propagate } from "../../lib/engine/uncertainty";
import { GAS_CONSTANT_J_PER_MOL_K } from "../../lib/engine/constants";
import { InputError } from "../../lib/engine/errors";

describe("thetaDFromBeta / betaFromThetaD", () => {
  // Pin: the Debye T³ prefactor 12π⁴/5 ≈ 234 ("C ≈ 234 N k_B (T/θ)³", Kittel, Introduction to
  // Solid State Physics, ch. 5, from memory), i.e. 1944 J mol⁻¹ K⁻¹ with R.
  it("betaFromThetaD(1 K, r = 1) is 12π⁴R/5 ≈ 234 R ≈ 1944 J mol⁻¹ K⁻⁴", () => {
    expectClose(betaFromThetaD(1, 1) / GAS_CONSTANT_J_PER_MOL_K, 233.78, { rel: 1e-4 });
    expectClose(betaFromThetaD(1, 1), 1943.8, { rel: 1e-4 });
  });

  // Check value: Cu Θ_D = 343 K (Kittel, Table 5.1, from memory) corresponds to
  // β ≈ 0.048 mJ mol⁻¹ K⁻⁴, close to measured Cu β ≈ 0.047–0.048 (from memory).
  it("betaFromThetaD(343 K) gives Cu's β ≈ 0.0482 mJ mol⁻¹ K⁻⁴", () => {
    expectClose(betaFromThetaD(343, 1) * 1e3, 0.0482, { rel: 0.005 });
  });

  it("thetaDFromBeta inverts betaFromThetaD for r = 1…5", () => {
    for (const r of [1, 2, 3, 5]) expectClose(thetaDFromBeta(betaFromThetaD(250, r), r), 250, { rel: 1e-13 });
  });

  // Analytic identity: per-atom β (β/r, r = 1) gives the same Θ_D as per-f.u. β with r.
  it("thetaDFromBeta is the same per formula unit (β, r) and per atom (β/r, 1)", () => {
    expectClose(thetaDFromBeta(3e-4, 3), thetaDFromBeta(1e-4, 1), { rel: 1e-14 });
  });

  it("thetaDFromBeta throws InputError naming beta for β ≤ 0", () => {
    expect(() => thetaDFromBeta(-1e-5, 1)).toThrow(InputError);
    expect(() => thetaDFromBeta(0, 1)).toThrow(/invalid beta/);
  });
});

describe("debyeTemperature", () => {
  // Analytic identity: Θ ∝ β^{−1/3} ⇒ σ_Θ/Θ = σ_β/(3β); also agrees with numerical propagation.
  it("debyeTemperature propagates σ_β as a third of the relative error", () => {
    const q = debyeTemperature({ value: 5e-5, stdError: 1e-6 }, 1);
    expectClose((q.stdError ?? NaN) / q.value, 0.02 / 3, { rel: 1e-12 });
    const num = propagate(([b]) => thetaDFromBeta(b, 1), [5e-5], [[1e-12]]);
    expectClose(q.stdError ?? NaN, num.stdError, { rel: 1e-7 });
    expect(q.unit).toBe("K");
  });
  it("debyeTemperature keeps a null σ null", () => {
    expect(debyeTemperature({ value: 5e-5, stdError: null }, 1).stdError).toBeNull();
  });
});

describe("gammaPerDosFactor / dosFromGamma", () => {
  // Check value: γ [mJ mol⁻¹ K⁻²] ≈ 2.357 × D(E_F) [states eV⁻¹ f.u.⁻¹], the factor quoted in
  // DESIGN.md and in many experimental papers (from memory); here computed from CODATA 2018
  // k_B, N_A, e as (π²/3) k_B² N_A × 1 eV × 10³.
  it("gammaPerDosFactor() from CODATA constants is 2.357 to four digits", () => {
    expectClose(gammaPerDosFactor(), 2.357, { abs: 0.0005 });
  });
  it("dosFromGamma(1 mJ) is 1/2.357 states per eV and gammaFromDos inverts it", () => {
    expectClose(dosFromGamma(1e-3), 1 / gammaPerDosFactor(), { rel: 1e-14 });
    expectClose(gammaFromDos(dosFromGamma(2.1e-3)), 2.1e-3, { rel: 1e-14 });
  });
  it("densityOfStates carries σ linearly and names the particle in the unit", () => {
    const q = densityOfStates({ value: 2.357e-3, stdError: 0.2357e-3 }, "atom");
    expectClose(q.value, 2.357 / gammaPerDosFactor(), { rel: 1e-12 });
    expectClose(q.stdError ?? NaN, q.value / 10, { rel: 1e-12 });
    expect(q.unit).toBe("states eV^-1 atom^-1");
  });
});
