import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { cumulativeTrapezoid, simpson, entropyBelow, enthalpyBelow, entropyFromData, enthalpyFromData, entropyOfModel, enthalpyOfModel } from "../../lib/engine/thermo";
import { InputError } from "../../lib/engine/errors";

const G = 1.2e-3; // γ [J mol⁻¹ K⁻²] (invented, for identities)
const B = 5e-5; // β [J mol⁻¹ K⁻⁴]
const C = (t: number) => G * t + B * t ** 3;
const S = (t: number) => G * t + (B * t ** 3) / 3;
const H = (t: number) => (G * t ** 2) / 2 + (B * t ** 4) / 4;
const grid = (a: number, b: number, n: number) => Array.from({ length: n + 1 }, (_, i) => a + ((b - a) * i) / n);
const FIT = { gamma: G, beta: B };

describe("entropyBelow / enthalpyBelow", () => {
  it("entropyBelow and enthalpyBelow are the closed forms γT + βT³/3 and γT²/2 + βT⁴/4", () => {
    expectClose(entropyBelow(2, FIT).value, S(2));
    expectClose(enthalpyBelow(2, FIT).value, H(2));
  });
  // Analytic identity: σ² = T²σ_γ² + (T³/3)²σ_β² + 2T(T³/3)cov.
  it("entropyBelow propagates σ through cov(γ, β)", () => {
    const fit = { ...FIT, gammaStdError: 1e-5, betaStdError: 1e-6, covGammaBeta: -0.5e-11 };
    const t = 1.5;
    const expected = Math.sqrt(t * t * 1e-10 + (t ** 3 / 3) ** 2 * 1e-12 + 2 * t * (t ** 3 / 3) * -0.5e-11);
    expectClose(entropyBelow(t, fit).stdError ?? NaN, expected, { rel: 1e-12 });
    expect(entropyBelow(t, FIT).stdError).toBeNull();
  });
  it("entropyBelow rejects T_min ≤ 0", () => {
    expect(() => entropyBelow(0, FIT)).toThrow(/T_min/);
  });
});

describe("entropyFromData / enthalpyFromData", () => {
  // Analytic identity: the trapezoid error for a quadratic C/T = γ + βT² on a uniform grid is
  // exactly (b − a)h²·(2β)/12 = (b − a)h²β/6.
  it("entropyFromData on C = γT + βT³ exceeds the exact S by exactly (T − T_min)h²β/6", () => {
    const T = grid(0.5, 20, 390);
    const h = T[1] - T[0];
    const r = entropyFromData(T, T.map(C), FIT);
    T.forEach((t, k) => expectClose(r.values[k], S(t) + ((t - 0.5) * h * h * B) / 6, { rel: 1e-10 }));
  });
  it("enthalpyFromData on C = γT + βT³ converges as h² to the closed form", () => {
    const err = (n: number) => {
      const T = grid(0.5, 20, n);
      const r = enthalpyFromData(T, T.map(C), FIT);
      return Math.abs(r.values[n] - H(20));
    };
    expectClose(err(100) / err(200), 4, { rel: 0.01 });
    expect(err(400) / H(20)).toBeLessThan(1e-4);
  });
  it("entropyFromData's σ equals the brute-force Σ (w_i σ_i/T_i)² plus the extrapolation", () => {
    const T = [1, 1.5, 2.5, 3, 4.2];
    const sig = [1e-4, 2e-4, 1.5e-4, 3e-4, 2.5e-4];
    const fit = { ...FIT, gammaStdError: 1e-5, betaStdError: 0 };
    const r = entropyFromData(T, T.map(C), fit, sig);
    const k = 4;
    const w = T.map((_, i) => ((i > 0 ? T[i] - T[i - 1] : 0) + (i < k ? T[i + 1] - T[i] : 0)) / 2);
    const v = w.reduce((acc, wi, i) => acc + (wi * sig[i] / T[i]) ** 2, 0) + (1 * 1e-5) ** 2;
    expectClose(r.stdErrors?.[k] ?? NaN, Math.sqrt(v), { rel: 1e-12 });
    expect(r.method).toBe("trapezoid on data");
  });
  it("entropyFromData rejects a length mismatch and non-increasing temperatures", () => {
    expect(() => entropyFromData([1, 2], [1], FIT)).toThrow(InputError);
    expect(() => entropyFromData([1, 1], [1, 1], FIT)).toThrow(/strictly increasing/);
    expect(() => entropyFromData([-1, 1], [1, 1], FIT)).toThrow(/> 0 K/);
  });
});

describe("entropyOfModel / enthalpyOfModel", () => {
  // Analytic identity: Simpson is exact for the quadratic C/T and the cubic C.
  it("entropyOfModel and enthalpyOfModel reproduce the closed forms to rounding", () => {
    const T = [0.5, 1, 3, 7, 15, 30];
    const s = entropyOfModel(C, T, FIT, 2);
    const h = enthalpyOfModel(C, T, FIT, 2);
    T.forEach((t, k) => {
      expectClose(s.values[k], S(t), { rel: 1e-13 });
      expectClose(h.values[k], H(t), { rel: 1e-13 });
    });
  });
});

describe("simpson / cumulativeTrapezoid", () => {
  it("simpson integrates sin on [0, π] to 2 within 1e-8 at n = 200", () => {
    expectClose(simpson(Math.sin, 0, Math.PI), 2, { rel: 1e-8 });
  });
  it("simpson rejects an odd number of intervals", () => {
    expect(() => simpson(Math.sin, 0, 1, 3)).toThrow(/even/);
  });
  it("cumulativeTrapezoid with two points is the trapezoid area", () => {
    expect(cumulativeTrapezoid([0, 2], [1, 3]).integral).toEqual([0, 4]);
  });
});
