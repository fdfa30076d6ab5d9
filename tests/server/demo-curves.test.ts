/** The demo's curves in field (INVENTED DATA): the laws they follow, checked as analytic identities and pins. */
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { betaFromTheta, molarHeatCapacity, type CurveSpec } from "../../lib/server/demo/curves";
import { DEMO_HC2_T, MAGNETIC_ALLOY, magneticAlloyHeatCapacity, mixedStateSpec, zeemanGapK } from "../../lib/server/demo/fieldCurves";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";

const NB: CurveSpec = { gammaMJ: 7.7, thetaDK: 276, deltaMJ: 2e-6, tcK: 9.1, residualGammaFraction: 0.03, tcSpreadK: 0.08 };

/** ∫ f dT over [a, b] by Simpson's rule with n (even) intervals. */
function simpson(f: (T: number) => number, a: number, b: number, n = 2000): number {
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * f(a + i * h);
  return (s * h) / 3;
}

describe("mixedStateSpec", () => {
  it("mixedStateSpec in zero field returns the zero-field T_c, residual γ and spread", () => {
    expect(mixedStateSpec(NB, 0)).toEqual(NB);
  });

  it("mixedStateSpec at 1 T gives T_c(H) = T_c(0)√(1 − H/H_c2) and γ(H)/γ_n linear in H", () => {
    const s = mixedStateSpec(NB, 1);
    expectClose(s.tcK!, 9.1 * Math.sqrt(1 - 1 / DEMO_HC2_T), { rel: 1e-14 });
    expectClose(s.residualGammaFraction!, 0.03 + 0.97 / DEMO_HC2_T, { rel: 1e-14 });
    expectClose(s.tcSpreadK!, 0.18, { rel: 1e-14 });
    expect(s.gammaMJ).toBe(7.7);
    expect(s.thetaDK).toBe(276);
  });

  it("mixedStateSpec at or above H_c2(0), or of a spec without T_c, throws", () => {
    expect(() => mixedStateSpec(NB, DEMO_HC2_T)).toThrow(/not below H_c2/);
    expect(() => mixedStateSpec(NB, -0.1)).toThrow(/not below H_c2/);
    expect(() => mixedStateSpec({ gammaMJ: 1, thetaDK: 300 }, 0.5)).toThrow(/no T_c/);
  });

  it("mixed-state curves conserve the electronic entropy at T_c(H): ∫₀^T_c C_e/T dT = γ_n T_c", () => {
    for (const h of [0.25, 0.5, 1, 1.5]) {
      const s = { ...mixedStateSpec(NB, h), tcSpreadK: 0, thetaDK: 1e9, deltaMJ: 0 };
      // Up to just below T_c: at T_c itself the curve is already normal (the step).
      const entropy = simpson((T) => molarHeatCapacity(s, T) / T, 1e-9, s.tcK! * (1 - 1e-12));
      expectClose(entropy, 7.7e-3 * s.tcK!, { rel: 1e-6 }, `${h} T`);
    }
  });

  it("mixed-state curves below T_c(H) are γ(H)T + [β + 3(γ_n − γ(H))/T_c²]T³ + δT⁵ exactly", () => {
    const s = { ...mixedStateSpec(NB, 0.5), tcSpreadK: 0 };
    const gr = 7.7e-3 * s.residualGammaFraction!;
    for (const T of [0.6, 2, 5]) {
      const expected = gr * T + (betaFromTheta(276) + (3 * (7.7e-3 - gr)) / s.tcK! ** 2) * T ** 3 + 2e-9 * T ** 5;
      expectClose(molarHeatCapacity(s, T), expected, { rel: 1e-12 }, `${T} K`);
    }
  });
});

describe("magneticAlloyHeatCapacity", () => {
  const spec = MAGNETIC_ALLOY.spec;
  const beta = (12 * Math.PI ** 4 * R) / (5 * 340 ** 3); // Debye T³ law, Θ_D = 340 K

  it("zeemanGapK(2, 1 T) is 2 μ_B/k_B = 1.343427631 K (CODATA 2018 μ_B/k_B = 0.67171381563 K T⁻¹)", () => {
    expectClose(zeemanGapK(2, 1), 2 * 0.67171381563, { rel: 1e-10 });
  });

  it("magneticAlloyHeatCapacity in zero field is γT + βT³ alone", () => {
    for (const T of [0.4, 3, 16]) expectClose(magneticAlloyHeatCapacity(spec, T, 0), 0.71e-3 * T + beta * T ** 3, { rel: 1e-12 });
  });

  it("magneticAlloyHeatCapacity at 4 T has a Schottky maximum 0.4392 nR at T ≈ Δ/2.40 (Gopal 1966, ch. 4)", () => {
    const gap = zeemanGapK(spec.g, 4);
    const excess = (T: number) => magneticAlloyHeatCapacity(spec, T, 4) - 0.71e-3 * T - beta * T ** 3 - (spec.nuclearPerT2MJ * 1e-3 * 16) / T ** 2;
    let best = { T: 0, c: 0 };
    for (let T = 0.5; T < 10; T += 1e-4) if (excess(T) > best.c) best = { T, c: excess(T) };
    expectClose(best.c, 0.4392 * spec.n * R, { rel: 1e-3 });
    expectClose(best.T, gap / 2.40, { rel: 2e-3 });
  });

  it("magneticAlloyHeatCapacity's nuclear tail grows as H²: A(6 T)/A(2 T) = 9 at low T", () => {
    const tail = (h: number) => (magneticAlloyHeatCapacity(spec, 0.05, h) - magneticAlloyHeatCapacity(spec, 0.05, 0)) * 0.05 ** 2;
    // At 50 mK the Zeeman Schottky term is frozen out (Δ/T > 50), so the difference is A/T².
    expectClose(tail(6) / tail(2), 9, { rel: 1e-9 });
    expectClose(tail(6), spec.nuclearPerT2MJ * 1e-3 * 36, { rel: 1e-9 });
  });
});
