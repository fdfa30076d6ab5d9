/**
 * The notebook chain end to end on seeded synthetic data (invented, generated here):
 * data → addenda → normalise → fit → derive recovers the γ and β the data were made from.
 */
import { describe, it, expect } from "vitest";
import { computeChain, computeChainFrom, computeStep, EMPTY_STATE, parseStepConfig, type ChainContext, type StepSpec } from "../../lib/engine/notebook";
import { GAS_CONSTANT_J_PER_MOL_K } from "../../lib/engine/constants";
import { expectClose } from "../helpers/expectClose";

function normal(seed: number): () => number {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

const GAMMA = 7.0e-3, BETA = 1.2e-4; // J mol⁻¹ K⁻², J mol⁻¹ K⁻⁴ (synthetic truth)
const MASS_MG = 20, MOLAR = 92.90637; // Nb, IUPAC 2021
const moles = MASS_MG * 1e-3 / MOLAR;
const addenda = (T: number) => 1.6e-7 * T + 2.2e-9 * T ** 3;

function context(): ChainContext {
  const rnd = normal(7);
  const T = Array.from({ length: 120 }, (_, i) => 1.8 * (8 / 1.8) ** (i / 119));
  const total = T.map((t) => moles * (GAMMA * t + BETA * t ** 3) + addenda(t));
  const sigma = total.map((c) => c * 0.003);
  const C = total.map((c, i) => c + sigma[i]! * rnd());
  const TA = Array.from({ length: 60 }, (_, i) => 1.5 + (10 - 1.5) * (i / 59));
  const CA = TA.map(addenda);
  return {
    sample: { id: "s", label: "Nb test", formula: "Nb", molarMassGPerMol: MOLAR, atomsPerFormulaUnit: 1, massMg: MASS_MG, densityGPerCm3: 8.57, valences: { Nb: 1 } },
    measurements: {
      m1: { id: "m1", label: "zero field", kind: "sample", basis: "sample", fieldT: 0, sha256: "x", temperatureK: T, heatCapacity: C, sigma },
      a1: { id: "a1", label: "addenda", kind: "addenda", basis: "sample", fieldT: 0, sha256: "y", temperatureK: TA, heatCapacity: CA, sigma: CA.map((c) => c * 1e-4) },
    },
  };
}

const chain: StepSpec[] = [
  { id: "d", kind: "data", config: { measurementIds: ["m1"] } },
  { id: "a", kind: "addenda", config: { addendaMeasurementId: "a1", method: "linear" } },
  { id: "n", kind: "normalise", config: { per: "formula-unit" } },
  { id: "f", kind: "fit", config: { model: "sommerfeld", scan: true } },
  { id: "v", kind: "derive", config: {} },
];

describe("computeChain", () => {
  it("computeChain recovers γ and β within 3σ of the synthetic truth and derives Θ_D from β", () => {
    const out = computeChain(chain, context());
    expect(out.map((o) => o.error)).toEqual([null, null, null, null, null]);
    const fit = (out[3]!.result as unknown as { fit: { parameters: { name: string; value: number; stdError: number }[] } }).fit;
    const g = fit.parameters.find((p) => p.name === "gamma")!, b = fit.parameters.find((p) => p.name === "beta")!;
    expect(Math.abs(g.value - GAMMA)).toBeLessThan(3 * g.stdError);
    expect(Math.abs(b.value - BETA)).toBeLessThan(3 * b.stdError);
    const q = (out[4]!.result as unknown as { quantities: { name: string; value: number }[] }).quantities;
    const thetaD = q.find((x) => x.name === "thetaD")!.value;
    // Analytic identity: Θ_D = (12π⁴R/(5β))^{1/3} with r = 1.
    expectClose(thetaD, Math.cbrt((12 * Math.PI ** 4 * GAS_CONSTANT_J_PER_MOL_K) / (5 * b.value)), { rel: 1e-9 });
  });

  it("computeChainFrom resumed below the normalisation gives exactly what the whole chain gives", () => {
    const ctx = context();
    const whole = computeChain(chain, ctx);
    const resumed = computeChainFrom(chain, ctx, 3, whole[2]!.state);
    expect(resumed.map((o) => JSON.stringify(o.result))).toEqual(whole.slice(3).map((o) => JSON.stringify(o.result)));
  });

  it("computeChain's derive step passes over an expression fit without γ and β and uses the fit above it", () => {
    const steps: StepSpec[] = [...chain.slice(0, 4), { id: "x", kind: "fit", config: { model: "expression", expression: "g*T + b*T^3" } }, { id: "v", kind: "derive", config: {} }];
    const out = computeChain(steps, context());
    expect(out[4]!.ok).toBe(true);
    expect(out[5]!.error).toBeNull();
    expect((out[5]!.result as unknown as { fitStepId: string }).fitStepId).toBe("f");
  });

  it("computeChain reports a fit above a missing normalisation as a step error, not an exception", () => {
    const out = computeChain([chain[0]!, chain[3]!], context());
    expect(out[0]!.ok).toBe(true);
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.error).toMatch(/normalisation/);
  });

  it("computeStep with a bad configuration names the field in its error", () => {
    const o = computeStep({ id: "d", kind: "data", config: { measurementIds: [] } }, EMPTY_STATE, context());
    expect(o.ok).toBe(false);
    expect(o.error).toMatch(/measurementIds/);
  });

  it("parseStepConfig of an unknown kind throws naming the kind field", () => {
    expect(() => parseStepConfig("séance", {})).toThrow(/invalid step kind/);
  });

  it("computeChain with a narrower window changes γ only within its uncertainty", () => {
    const ctx = context();
    const wide = computeChain(chain, ctx)[3]!.result as unknown as { fit: { parameters: { name: string; value: number; stdError: number }[] } };
    const narrow = computeChain([...chain.slice(0, 3), { id: "f", kind: "fit", config: { model: "sommerfeld", tMinK: 2, tMaxK: 5 } }], ctx)[3]!.result as unknown as typeof wide;
    const gw = wide.fit.parameters[0]!, gn = narrow.fit.parameters[0]!;
    expect(gn.value).not.toBe(gw.value);
    expect(Math.abs(gn.value - gw.value)).toBeLessThan(3 * gn.stdError);
  });

  it("computeChain excludes hand-picked points and keeps their reason", () => {
    const out = computeChain([{ id: "d", kind: "data", config: { measurementIds: ["m1"], excluded: [{ measurementId: "m1", index: 3, reason: "heater glitch" }] } }], context());
    const r = out[0]!.result as unknown as { points: number; excluded: { reason: string }[] };
    expect(r.points).toBe(119);
    expect(r.excluded[0]!.reason).toBe("heater glitch");
  });
});
