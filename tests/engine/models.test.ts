import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import {
  debyeReducedHeatCapacity, debyeD3, debyeHeatCapacity, debyeHeatCapacityDThetaD, t3LawDeviation, einsteinHeatCapacity,
  schottkyHeatCapacity, solveBcsGap, BCS_GAP_RATIO, BCS_GAP_SLOPE_AT_TC, ZETA3, alphaModelReducedHeatCapacity,
  alphaModelReducedEntropy, integrateGauss, MODELS, getModel, debyeTemperatureFromBeta,
} from "../../lib/engine/models";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";

/** Independent check: composite 40×20-point Gauss–Legendre of the original Debye integrand. */
function debyeByQuadrature(y: number): number {
  const f = (x: number) => (x === 0 ? 0 : (x ** 4 * Math.exp(x)) / Math.expm1(x) ** 2);
  let s = 0;
  for (let k = 0; k < 40; k++) s += integrateGauss(f, (k * y) / 40, ((k + 1) * y) / 40, 20);
  return (3 / y ** 3) * s;
}

describe("Debye function", () => {
  // Published table: R. Pässler, Adv. Condens. Matter Phys. 2017, 9321439, Table 7
  // (C_V/3R and D₃ versus x = Θ_D/T, 10 significant digits).
  const TABLE: [number, number][] = [
    [0.1, 0.9995001785], [0.5, 0.9876107521], [1, 0.9517321357], [1.5, 0.8959504801], [5, 0.3686348236],
    [6, 0.2655968891], [8, 0.1381873779], [10, 0.07582100303], [12, 0.04478011684], [15, 0.0230712873],
  ];
  it.each(TABLE)("debyeReducedHeatCapacity(%f) matches Pässler (2017) Table 7", (x, v) => {
    expectClose(debyeReducedHeatCapacity(x), v, { rel: 1e-9 });
  });
  it("debyeD3 matches Pässler (2017) Table 7 at x = 1, 5, 10", () => {
    expectClose(debyeD3(1), 0.6744155641, { rel: 1e-9 });
    expectClose(debyeD3(5), 0.1175974118, { rel: 1e-9 });
    expectClose(debyeD3(10), 0.01929576569, { rel: 1e-9 });
  });
  it.each([1e-6, 0.3, 1.999, 2, 2.001, 3.7, 9, 25, 60])("debyeReducedHeatCapacity(%f) agrees with direct quadrature of x⁴eˣ/(eˣ−1)² to 1e-12", (y) => {
    expectClose(debyeReducedHeatCapacity(y), debyeByQuadrature(y), { rel: 1e-12 });
  });
  it("debyeHeatCapacity approaches (12π⁴/5) r R (T/Θ_D)³ at low T (analytic limit)", () => {
    const thetaD = 300;
    const T = 0.3;
    expectClose(debyeHeatCapacity(T, thetaD, 2), ((12 * Math.PI ** 4) / 5) * 2 * R * (T / thetaD) ** 3, { rel: 1e-13 });
  });
  it("debyeHeatCapacity approaches the Dulong–Petit value 3rR at high T (C/3rR = 1 − y²/20 + …)", () => {
    const y = 1e-3;
    expectClose(debyeHeatCapacity(300 / y, 300, 3) / (9 * R), 1 - (y * y) / 20, { rel: 1e-12 });
  });
  it("debyeHeatCapacityDThetaD matches a central difference", () => {
    const h = 1e-4;
    const fd = (debyeHeatCapacity(12, 250 + h) - debyeHeatCapacity(12, 250 - h)) / (2 * h);
    expectClose(debyeHeatCapacityDThetaD(12, 250), fd, { rel: 1e-7 });
  });
  it("t3LawDeviation is ≈0.1–0.2 % at Θ_D/14 and ≈3 % at Θ_D/10, as DESIGN.md states", () => {
    expect(t3LawDeviation(1 / 14)).toBeGreaterThan(0.001);
    expect(t3LawDeviation(1 / 14)).toBeLessThan(0.002);
    expect(t3LawDeviation(1 / 10)).toBeGreaterThan(0.025);
    expect(t3LawDeviation(1 / 10)).toBeLessThan(0.035);
    expect(t3LawDeviation(1 / 50)).toBeLessThan(1e-12);
  });
  it("debyeTemperatureFromBeta inverts β = 12π⁴rR/(5Θ_D³)", () => {
    expectClose(debyeTemperatureFromBeta((12 * Math.PI ** 4 * R) / (5 * 343 ** 3)), 343, { rel: 1e-14 });
  });
});

describe("Einstein and Schottky terms", () => {
  it("einsteinHeatCapacity tends to 3n_E R at high T and 3n_E R x²e^{−x} at low T (analytic limits)", () => {
    expectClose(einsteinHeatCapacity(1e6, 100, 2), 6 * R, { rel: 1e-8 });
    const x = 50;
    expectClose(einsteinHeatCapacity(100 / x, 100, 1), 3 * R * x * x * Math.exp(-x), { rel: 1e-12 });
  });
  it("schottkyHeatCapacity for g = 1 peaks at x tanh(x/2) = 2 with C_max ≈ 0.439 R (derived by bisection)", () => {
    // d/dx [x² eˣ/(1+eˣ)²] = 0  ⇔  x·tanh(x/2) = 2
    let lo = 1;
    let hi = 4;
    for (let i = 0; i < 200; i++) {
      const mid = (lo + hi) / 2;
      if (mid * Math.tanh(mid / 2) < 2) lo = mid;
      else hi = mid;
    }
    const xMax = lo;
    const cMax = (xMax ** 2 * Math.exp(xMax)) / (1 + Math.exp(xMax)) ** 2;
    expectClose(schottkyHeatCapacity(10 / xMax, 10, 1, 1) / R, cMax, { rel: 1e-13 });
    expectClose(cMax, 0.44, { abs: 0.005 });
    const near = [0.999, 1.001].map((f) => schottkyHeatCapacity(10 / (xMax * f), 10, 1, 1));
    near.forEach((c) => expect(c).toBeLessThan(cMax * R));
  });
  it("schottkyHeatCapacity high-T tail is nR g x²/(1+g)² (analytic limit)", () => {
    const x = 1e-4;
    expectClose(schottkyHeatCapacity(1 / x, 1, 3, 0.5), (0.5 * R * 3 * x * x) / 16, { rel: 1e-3 });
  });
});

describe("BCS gap and α-model", () => {
  it("ZETA3 equals Σ 1/n³ (direct summation with Euler–Maclaurin tail)", () => {
    let s = 0;
    const N = 10000;
    for (let n = 1; n <= N; n++) s += 1 / n ** 3;
    s += 1 / (2 * N * N) - 1 / (2 * N ** 3);
    expectClose(ZETA3, s, { rel: 1e-13 });
  });
  it("solveBcsGap gives δ(0) = π e^{−γ_E} ≈ 1.764 and δ² → 8π²/(7ζ(3))(1 − t) near T_c (analytic limits)", () => {
    expectClose(solveBcsGap(0.05), BCS_GAP_RATIO, { rel: 1e-12 });
    expectClose(BCS_GAP_RATIO, 1.764, { abs: 5e-4 });
    expectClose(solveBcsGap(1 - 1e-6) ** 2 / 1e-6, BCS_GAP_SLOPE_AT_TC, { rel: 1e-5 });
  });
  it("alphaModelReducedHeatCapacity gives the BCS jump ΔC/(γ_n T_c) = 12/(7ζ(3)) ≈ 1.43 (analytic)", () => {
    expectClose(alphaModelReducedHeatCapacity(1 - 1e-9) - 1, 12 / (7 * ZETA3), { rel: 1e-6 });
    expectClose(12 / (7 * ZETA3), 1.426, { abs: 1e-3 });
  });
  it.each([1.2, BCS_GAP_RATIO, 2.5])("alphaModelReducedHeatCapacity(α = %f) conserves entropy: ∫₀¹ c/t dt = S(T_c) = 1", (alpha) => {
    let s = 0;
    for (let k = 0; k < 100; k++) s += integrateGauss((t) => alphaModelReducedHeatCapacity(t, alpha) / t, k / 100, (k + 1) / 100, 12);
    expectClose(s, 1, { rel: 1e-10 });
    expectClose(alphaModelReducedEntropy(1 - 1e-12, alpha), 1, { rel: 1e-10 });
  });
  it("alphaModelReducedHeatCapacity jump scales as (α/α_BCS)²", () => {
    const j = (a: number) => alphaModelReducedHeatCapacity(1 - 1e-9, a) - 1;
    expectClose(j(2.5) / j(BCS_GAP_RATIO), (2.5 / BCS_GAP_RATIO) ** 2, { rel: 1e-5 });
  });
});

describe("model registry", () => {
  it("getModel returns every registered model and each has named parameters with units", () => {
    for (const [name, m] of Object.entries(MODELS)) {
      expect(getModel(name)).toBe(m);
      expect(m.parameters.length).toBeGreaterThan(0);
      m.parameters.forEach((p) => expect(p.unit.length).toBeGreaterThan(0));
      if (m.linear) expect(m.basis!.length).toBe(m.parameters.length);
    }
  });
  it("getModel throws InputError listing the known names for an unknown model", () => {
    expect(() => getModel("toString")).toThrow(/known: sommerfeld/);
  });
  it("linear model gradients equal their basis functions", () => {
    for (const m of Object.values(MODELS).filter((x) => x.linear)) {
      const g = m.gradient!(3.5, {});
      m.parameters.forEach((p, k) => expect(g[p.name]).toBe(m.basis![k](3.5)));
    }
  });
});
