/**
 * The notebook's fit step with the model-and-window recommendation and the weighting choices,
 * on invented molar data with known truth (tests/engine/recommend.data.ts).
 */
import { describe, it, expect } from "vitest";
import { computeChain, type ChainContext, type StepSpec } from "../../lib/engine/notebook";
import { makeData, betaOf, type Truth } from "./recommend.data";
import { expectClose } from "../helpers/expectClose";

const TRUTH: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "schottky", n: 2e-4, gapK: 1.5 }, tLoK: 0.5, tHiK: 15, points: 300, relSigma: 0.005 };

function context(withSigma: boolean, truth = TRUTH, seed = 3): ChainContext {
  const d = makeData(truth, seed, withSigma);
  return {
    sample: { id: "s", label: "invented", formula: "Nb", molarMassGPerMol: 92.90637, atomsPerFormulaUnit: 1, massMg: 20, densityGPerCm3: 8.57, valences: { Nb: 1 } },
    measurements: { m1: { id: "m1", label: "invented", kind: "sample", basis: "molar", fieldT: 0, sha256: "x", temperatureK: d.temperatureK, heatCapacity: d.heatCapacity, sigma: d.sigma ?? null } },
  } as ChainContext;
}

const steps = (fit: Record<string, unknown>): StepSpec[] => [
  { id: "d", kind: "data", config: { measurementIds: ["m1"] } },
  { id: "f", kind: "fit", config: fit },
  { id: "v", kind: "derive", config: {} },
];

type FitOut = {
  fit: { modelName: string; parameters: { name: string; value: number; stdError: number }[] };
  window: { tMinK: number; tMaxK: number };
  weighting: { kind: string; sigmaKnown: boolean; text: string };
  quality: { reducedChiSquare: number | null; residualStdDev: number | null; text: string };
  recommendation: { recommended: boolean; model: string; gamma: number; gammaStdError: number; gammaSystematicError: number; betaSystematicError: number; reason: string; window: { tMinK: number; tMaxK: number }; candidates: { model: string; cells: unknown[] }[] } | null;
};

describe("fit step with recommend", () => {
  it("fit step with recommend fits the recommended model and window and hands γ with both σ to the derive step", () => {
    const out = computeChain(steps({ recommend: true }), context(true));
    expect(out[1]!.ok, JSON.stringify(out[1]!.error)).toBe(true);
    const r = out[1]!.result as unknown as FitOut;
    const rec = r.recommendation!;
    expect(rec.recommended).toBe(true);
    expect(r.fit.modelName).toBe(rec.model);
    expect([r.window.tMinK, r.window.tMaxK]).toEqual([rec.window.tMinK, rec.window.tMaxK]);
    const g = r.fit.parameters.find((p) => p.name === "gamma")!;
    expectClose(g.value, rec.gamma, { rel: 1e-6 });
    expect(Math.abs(g.value - TRUTH.gamma)).toBeLessThanOrEqual(3 * Math.hypot(rec.gammaStdError, rec.gammaSystematicError));
    expect(rec.candidates.map((c) => c.model)).toEqual(["sommerfeld", "sommerfeld-t5", "nuclear", "schottky"]);
    const stored = (out[1]!.result as unknown as { summary: { gamma: { systematicError: number } } }).summary;
    expect(stored.gamma.systematicError).toBe(rec.gammaSystematicError);
    const q = (out[2]!.result as unknown as { quantities: { name: string; value: number; stdError: number; unit: string; systematicError?: number }[] }).quantities;
    const gq = q.find((x) => x.name === "gamma")!;
    // stored in SI (J mol⁻¹ K⁻², named in its unit), as the fit's own σ
    expect(gq.unit).toBe("J mol^-1 K^-2");
    expectClose(gq.systematicError!, rec.gammaSystematicError, { rel: 1e-9 });
    const th = q.find((x) => x.name === "thetaD")!;
    const bq = q.find((x) => x.name === "beta")!;
    expectClose(th.systematicError!, (th.value * bq.systematicError!) / (3 * bq.value), { rel: 1e-9 });
    expect(Math.abs(bq.value - betaOf(300))).toBeLessThanOrEqual(3 * Math.hypot(bq.stdError, bq.systematicError!));
  });
  it("fit step with recommend fails with the reason, naming the missing term, when nothing describes the data", () => {
    const bump: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "einstein", nE: 0.02, thetaEK: 40 }, tLoK: 4, tHiK: 20, points: 300, relSigma: 0.005 };
    const out = computeChain(steps({ recommend: true }), context(true, bump, 1));
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.error).toMatch(/^Not recommended.*Likely missing: .*Einstein/);
  });
  it("fit step without recommend leaves the systematic σ out", () => {
    const out = computeChain(steps({ tMinK: 2, tMaxK: 15 }), context(true));
    expect((out[1]!.result as unknown as { summary: { gamma: { systematicError?: number } } }).summary.gamma.systematicError).toBeUndefined();
    const q = (out[2]!.result as unknown as { quantities: { name: string; systematicError?: number }[] }).quantities;
    expect(q.find((x) => x.name === "gamma")!.systematicError).toBeUndefined();
  });
});

describe("fit step weighting", () => {
  it("fit step on data without σ: unweighted reports the residual standard deviation, no χ²_red, and says so", () => {
    const out = computeChain(steps({ weighting: "none", tMinK: 3 }), context(false));
    const r = out[1]!.result as unknown as FitOut;
    expect(r.weighting.kind).toBe("none");
    expect(r.weighting.sigmaKnown).toBe(false);
    expect(r.quality.reducedChiSquare).toBeNull();
    expect(r.quality.residualStdDev!).toBeGreaterThan(0);
    expect(r.quality.text).toMatch(/residual standard deviation .* mJ mol⁻¹ K⁻¹ \(σ unknown: no χ²_red\)/);
  });
  it("fit step with a relative σ weights by p % of C and reports χ²_red near 1 when p matches the noise", () => {
    const out = computeChain(steps({ weighting: "relative", relativeSigmaPercent: 0.5, tMinK: 3 }), context(false));
    const r = out[1]!.result as unknown as FitOut;
    expect(r.weighting.text).toBe("weighted by an assumed σ = 0.5 % of C");
    expect(r.quality.reducedChiSquare!).toBeGreaterThan(0.7);
    expect(r.quality.reducedChiSquare!).toBeLessThan(1.4);
    // the same fit as weighting by the data's own σ = 0.5 % of the noise-free C, to within the noise's effect on the weights
    const ref = computeChain(steps({ weighting: "sigma", tMinK: 3 }), context(true));
    const g = (o: typeof out) => (o[1]!.result as unknown as FitOut).fit.parameters.find((p) => p.name === "gamma")!;
    expect(Math.abs(g(out).value - g(ref).value)).toBeLessThan(0.2 * g(ref).stdError);
  });
  it("fit step with an absolute σ weights every point equally and keeps standard errors unscaled", () => {
    const a = computeChain(steps({ weighting: "absolute", absoluteSigmaSI: 1e-4, tMinK: 3 }), context(false));
    const b = computeChain(steps({ weighting: "absolute", absoluteSigmaSI: 2e-4, tMinK: 3 }), context(false));
    const ra = a[1]!.result as unknown as FitOut, rb = b[1]!.result as unknown as FitOut;
    expect(ra.weighting.text).toMatch(/assumed σ = 0\.0001 J mol⁻¹ K⁻¹ for every point/);
    const ga = ra.fit.parameters[0]!, gb = rb.fit.parameters[0]!;
    expectClose(ga.value, gb.value, { rel: 1e-10 });
    expectClose(gb.stdError, 2 * ga.stdError, { rel: 1e-10 });
    expectClose(rb.quality.reducedChiSquare!, ra.quality.reducedChiSquare! / 4, { rel: 1e-10 });
  });
  it("fit step refuses a relative weighting without its percentage, saying what is wrong", () => {
    const out = computeChain(steps({ weighting: "relative" }), context(false));
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.error).toMatch(/give the relative σ in % of C/);
  });
});
