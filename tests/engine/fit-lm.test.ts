import { describe, it, expect } from "vitest";
import { levenbergMarquardt, fitCurve, type LeastSquaresProblem } from "../../lib/engine/fit";
import { expectClose } from "../helpers/expectClose";

function expProblem(lower?: number[], upper?: number[], analytic = true): LeastSquaresProblem {
  const x = Float64Array.from({ length: 20 }, (_, i) => i / 4);
  const y = Float64Array.from(x, (v) => 3 * Math.exp(-0.7 * v));
  return {
    m: 20,
    n: 2,
    y,
    w: null,
    model: (p, out) => x.forEach((v, i) => (out[i] = p[0] * Math.exp(-p[1] * v))),
    jacobian: analytic ? (p, out) => x.forEach((v, i) => ((out[i] = Math.exp(-p[1] * v)), (out[20 + i] = -p[0] * v * Math.exp(-p[1] * v)))) : undefined,
    lower: lower ? Float64Array.from(lower) : undefined,
    upper: upper ? Float64Array.from(upper) : undefined,
  };
}

describe("levenbergMarquardt", () => {
  it("levenbergMarquardt reaches an exact fit with analytic and with numerical derivatives", () => {
    for (const analytic of [true, false]) {
      const r = levenbergMarquardt(expProblem(undefined, undefined, analytic), [1, 0.1]);
      expect(r.converged, r.message).toBe(true);
      expectClose(r.p[0], 3, { rel: 1e-10 });
      expectClose(r.p[1], 0.7, { rel: 1e-10 });
    }
  });
  it("levenbergMarquardt keeps parameters inside bounds and reports the one left on a bound", () => {
    const r = levenbergMarquardt(expProblem([0, 0], [10, 0.5]), [1, 0.1]);
    expect(r.p[1]).toBe(0.5);
    expect(r.atBound).toEqual([false, true]);
    expect(r.converged, r.message).toBe(true);
  });
  it("levenbergMarquardt stops with converged:false and a message at the evaluation limit", () => {
    const r = levenbergMarquardt(expProblem(), [1, 0.1], { maxEvaluations: 3 });
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/within 3 evaluations/);
  });
  it("levenbergMarquardt reports a non-finite model at the start instead of throwing", () => {
    const p = expProblem();
    const r = levenbergMarquardt({ ...p, model: (_q, out) => out.fill(NaN) }, [1, 1]);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/not finite/);
  });
});

describe("fitCurve", () => {
  it("fitCurve holds a fixed parameter and fits the others", () => {
    const x = [0, 1, 2, 3, 4, 5];
    const r = fitCurve(x, x.map((v) => 2 * Math.exp(-0.5 * v) + 1), undefined, "a*exp(-k*x) + c", { a: 1, k: 1 }, { fixed: { c: 1 } });
    expect(r.converged, r.message).toBe(true);
    expectClose(r.parameters[0].value, 2, { rel: 1e-9 });
    expect(r.parameters[2].fixed).toBe(true);
    expect(r.nFree).toBe(2);
  });
  it("fitCurve throws for unknown parameter names and unequal lengths", () => {
    expect(() => fitCurve([1, 2], [1, 2], undefined, "a*x", { b: 1 })).toThrow(/unknown parameter "b"/);
    expect(() => fitCurve([1, 2], [1], undefined, "a*x")).toThrow(/x has 2 values but y has 1/);
  });
});
