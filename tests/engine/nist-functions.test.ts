/**
 * NIST StRD nonlinear datasets fitted with models written as TypeScript functions through
 * fitCore (source: NIST StRD files in tests/fixtures/nist-strd, used as published).
 * Nelson (two predictors, response log y) uses numerical central-difference derivatives;
 * Misra1a, MGH09 and BoxBOD use analytic Jacobians. Thresholds: values ≥ 6 digits, SE ≥ 4.
 * Outcome per start (measured): BoxBOD start 1 converged:false (stalls where exp(−b2·x) ≈ 0), all others true.
 */
import { describe, it, expect } from "vitest";
import { fitCore, type ModelCore } from "../../lib/engine/fit";
import { loadNist, lreOrAbs } from "./nistData";

type Fn = (x: number, b: Float64Array) => number;
type Grad = (x: number, b: Float64Array, j: number) => number;

function core(names: string[], f: Fn, grad: Grad | null, xs: (i: number) => number): ModelCore {
  return {
    label: "nist",
    names,
    units: names.map(() => ""),
    linear: false,
    evaluate: (x, p, out) => x.forEach((xi, i) => (out[i] = f(xs(xi), p))),
    jacobian: grad ? (x, p, out) => names.forEach((_, j) => x.forEach((xi, i) => (out[j * x.length + i] = grad(xs(xi), p, j)))) : null,
  };
}

const MODELS: Record<string, { f: Fn; g: Grad | null }> = {
  Misra1a: {
    f: (x, b) => b[0] * (1 - Math.exp(-b[1] * x)),
    g: (x, b, j) => (j === 0 ? 1 - Math.exp(-b[1] * x) : b[0] * x * Math.exp(-b[1] * x)),
  },
  BoxBOD: {
    f: (x, b) => b[0] * (1 - Math.exp(-b[1] * x)),
    g: (x, b, j) => (j === 0 ? 1 - Math.exp(-b[1] * x) : b[0] * x * Math.exp(-b[1] * x)),
  },
  MGH09: {
    f: (x, b) => (b[0] * (x * x + x * b[1])) / (x * x + x * b[2] + b[3]),
    g: (x, b, j) => {
      const den = x * x + x * b[2] + b[3];
      const num = x * x + x * b[1];
      return [num / den, (b[0] * x) / den, (-b[0] * num * x) / den ** 2, (-b[0] * num) / den ** 2][j];
    },
  },
};

function run(name: string, start: number) {
  const d = loadNist(name);
  const names = d.certified.parameters.map((p) => p.name);
  const p0 = Float64Array.from(d.starts![start - 1]);
  const common = { start: p0, fixed: names.map(() => false), lower: new Float64Array(names.length).fill(-Infinity), upper: new Float64Array(names.length).fill(Infinity), scaleErrors: false };
  if (name === "Nelson") {
    const X = d.X!;
    const m = core(names, (i, b) => b[0] - b[1] * X[i][0] * Math.exp(-b[2] * X[i][1]), null, (i) => i);
    const index = Float64Array.from(X, (_, i) => i);
    return { d, r: fitCore(m, index, Float64Array.from(d.y, Math.log), null, common) };
  }
  const { f, g } = MODELS[name];
  return { d, r: fitCore(core(names, f, g, (x) => x), Float64Array.from(d.x!), Float64Array.from(d.y), null, common) };
}

describe("fitCore with TypeScript NIST models", () => {
  it.each([["Nelson", 1], ["Nelson", 2], ["Misra1a", 1], ["Misra1a", 2], ["MGH09", 1], ["MGH09", 2], ["BoxBOD", 2]] as const)(
    "fitCore(%s, start %i) meets the certified values",
    (name, start) => {
      const { d, r } = run(name, start);
      expect(r.converged, r.message).toBe(true);
      for (const [j, c] of d.certified.parameters.entries()) {
        expect(lreOrAbs(r.parameters[j].value, c.value, 0), `${name} ${c.name}`).toBeGreaterThanOrEqual(6);
        expect(lreOrAbs(r.parameters[j].stdError!, c.stdError, 0), `${name} ${c.name} SE`).toBeGreaterThanOrEqual(4);
      }
      expect(lreOrAbs(r.chiSquare!, d.certified.residualSumOfSquares, 0)).toBeGreaterThanOrEqual(6);
    },
  );
  it("fitCore(BoxBOD, start 1) reports converged:false with a message instead of a wrong answer", () => {
    const { r } = run("BoxBOD", 1);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/plateau|verified minimum/);
  });
});
