import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "./uncertainty.random";
import {
  propagate,
  propagatePowerLaw,
  numericalGradient,
  covarianceFromErrors,
  covariance2,
  correlationOf,
  checkCovariance,
  quantity,
  scaleQuantity,
  relativeError,
} from "../../lib/engine/uncertainty";
import { InputError } from "../../lib/engine/errors";

describe("propagate", () => {
  // Analytic identity: σ²(a+b) = σa² + σb² + 2 cov(a,b).
  it("propagate(a+b) adds variances and twice the covariance", () => {
    const r = propagate(([a, b]) => a + b, [3, 4], covariance2(0.3, 0.4, 0.05));
    expectClose(r.value, 7);
    expectClose(r.stdError, Math.sqrt(0.09 + 0.16 + 0.1), { rel: 1e-8 });
  });

  // Analytic identity: fully anticorrelated a and b of equal σ give σ(a+b) = 0.
  it("propagate(a+b) with ρ = −1 and equal σ gives zero error", () => {
    const r = propagate(([a, b]) => a + b, [1, 2], covariance2(0.2, 0.2, -0.04));
    // numerical-gradient rounding leaves a variance ~1e-17, i.e. σ ~ 4e-9 against σ_a = 0.2
    expectClose(r.stdError, 0, { abs: 1e-7 });
  });

  // Analytic identity: (σ_q/q)² = (σa/a)² + (σb/b)² − 2 cov/(ab) for q = a/b.
  it("propagate(a/b) matches the relative-error formula with correlation", () => {
    const cov = covariance2(0.1, 0.2, 0.01);
    const r = propagate(([a, b]) => a / b, [2, 5], cov);
    const rel = Math.sqrt((0.1 / 2) ** 2 + (0.2 / 5) ** 2 - (2 * 0.01) / 10);
    expectClose(r.stdError, 0.4 * rel, { rel: 1e-7 });
  });

  it("propagate with a supplied gradient uses it as given", () => {
    const r = propagate(([a]) => a * a, [3], [[0.01]], [100]);
    expectClose(r.stdError, 10);
  });

  it("propagate skips zero-variance inputs where f is undefined off-axis", () => {
    // f is only defined for integer n; n carries no variance and must not be probed.
    const f = ([x, n]: readonly number[]) => (Number.isInteger(n) ? x * n : NaN);
    const r = propagate(f, [2, 3], covariance2(0.1, 0));
    expectClose(r.stdError, 0.3, { rel: 1e-8 });
    expect(r.gradient[1]).toBe(0);
  });

  // Seeded synthetic: Monte Carlo σ of a smooth nonlinear function with small, correlated
  // input errors agrees with first-order propagation within the MC sampling error (~1.5 %).
  it("propagate agrees with a seeded Monte Carlo for a correlated nonlinear function", () => {
    const f = ([a, b]: readonly number[]) => Math.cbrt(a / b) + Math.log(a * b);
    const [sa, sb, rho] = [0.02, 0.03, 0.7];
    const r = propagate(f, [2, 3], covariance2(sa, sb, rho * sa * sb));
    const z = seededNormal(42);
    const n = 20000;
    let sum = 0;
    let sum2 = 0;
    for (let k = 0; k < n; k++) {
      const z1 = z();
      const z2 = rho * z1 + Math.sqrt(1 - rho * rho) * z();
      const v = f([2 + sa * z1, 3 + sb * z2]);
      sum += v;
      sum2 += v * v;
    }
    const sd = Math.sqrt(sum2 / n - (sum / n) ** 2);
    expectClose(r.stdError, sd, { rel: 0.03 });
  });

  it("propagate throws InputError for a covariance of the wrong size", () => {
    expect(() => propagate(([a]) => a, [1, 2], [[1]])).toThrow(InputError);
  });

  it("propagate throws InputError when f is not finite at the values", () => {
    expect(() => propagate(([a]) => Math.log(a), [-1], [[0.1]])).toThrow(/not finite/);
  });
});

describe("propagatePowerLaw", () => {
  // Analytic identity: Θ ∝ β^(−1/3) gives σ_Θ/Θ = σ_β/(3β).
  it("propagatePowerLaw(c·x^(−1/3)) gives a third of the relative error", () => {
    const r = propagatePowerLaw(10, [8], [-1 / 3], [[0.04 ** 2 * 64]]);
    expectClose(r.value, 5);
    expectClose(r.stdError / r.value, 0.04 / 3, { rel: 1e-12 });
  });
  it("propagatePowerLaw agrees with the numerical gradient", () => {
    const cov = covariance2(0.1, 0.05, 0.002);
    const exact = propagatePowerLaw(2, [1.5, 0.7], [2, -0.5], cov);
    const num = propagate(([a, b]) => 2 * a * a * Math.pow(b, -0.5), [1.5, 0.7], cov);
    expectClose(exact.stdError, num.stdError, { rel: 1e-8 });
  });
});

describe("numericalGradient", () => {
  it("numericalGradient of sin at 0 is cos 0 = 1 to 1e-9", () => {
    expectClose(numericalGradient(([x]) => Math.sin(x), [0])[0], 1, { rel: 1e-9 });
  });
});

describe("covariance helpers", () => {
  it("covarianceFromErrors builds ρσσ and correlationOf reads it back", () => {
    const cov = covarianceFromErrors([2, 3], [[1, -0.5], [-0.5, 1]]);
    expect(cov).toEqual([[4, -3], [-3, 9]]);
    expectClose(correlationOf(cov, 0, 1), -0.5);
  });
  it("covarianceFromErrors rejects a negative standard error", () => {
    expect(() => covarianceFromErrors([1, -1])).toThrow(/stdErrors\[1\]/);
  });
  it("checkCovariance rejects an asymmetric matrix and |ρ| > 1", () => {
    expect(() => checkCovariance([[1, 0.2], [0.3, 1]], 2)).toThrow(/not symmetric/);
    expect(() => checkCovariance([[1, 2], [2, 1]], 2)).toThrow(/correlation/);
  });
});

describe("quantity", () => {
  it("quantity freezes the record and turns a NaN error into null", () => {
    const q = quantity("x", "x", 1, NaN, "K");
    expect(q.stdError).toBeNull();
    expect(Object.isFrozen(q)).toBe(true);
  });
  it("scaleQuantity converts value and error; relativeError is unit-free", () => {
    const q = scaleQuantity(quantity("g", "γ", 1.2e-3, 0.1e-3, "J"), 1e3, "mJ");
    expectClose(q.value, 1.2);
    expectClose(q.stdError ?? NaN, 0.1);
    expectClose(relativeError(q) ?? NaN, 0.1 / 1.2);
  });
});
