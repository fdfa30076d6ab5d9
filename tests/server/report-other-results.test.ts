/**
 * The report's entries for the steps across fields and over a wide range (otherResult): what was
 * done in a sentence, and each parameter in the trade's units — on invented data computed here.
 */
import { describe, expect, it } from "vitest";
import { computeChain, type ChainContext } from "../../lib/engine/notebook";
import { otherResult } from "../../lib/server/review/report";
import { BOHR_MAGNETON_J_PER_T as MUB, BOLTZMANN_J_PER_K as KB, GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";

function ctx(fields: number[], c: (t: number, h: number) => number): ChainContext {
  const measurements: ChainContext["measurements"] = {};
  fields.forEach((h, k) => {
    const T = Array.from({ length: 60 }, (_, i) => 0.5 * (8 / 0.5) ** (i / 59));
    const C = T.map((t, i) => c(t, h) * (1 + 0.002 * Math.sin(7.3 * i + k)));
    measurements[`m${k}`] = { id: `m${k}`, label: `${h} T`, kind: "sample", basis: "molar", fieldT: h, sha256: `${k}`, temperatureK: T, heatCapacity: C, sigma: C.map((x) => 0.002 * x) };
  });
  return { sample: { id: "s", label: "s", formula: "Cu", molarMassGPerMol: 63.546, atomsPerFormulaUnit: 1, massMg: null, densityGPerCm3: null, valences: {} }, measurements };
}

describe("report entries of joint fits and γ(H)", () => {
  it("otherResult of a joint fit lists shared and per-field parameters in mJ and says what was fitted", () => {
    const sch = (t: number, h: number) => { const x = (2 * MUB * h) / (KB * t); return h ? 0.004 * R * x * x * Math.exp(-x) / (1 + Math.exp(-x)) ** 2 : 0; };
    const out = computeChain([{ id: "d", kind: "data", config: { measurementIds: ["m0", "m1", "m2"] } }, { id: "j", kind: "joint-fit", config: { model: "zeeman-schottky", shared: ["gamma", "beta", "n"] } }], ctx([1, 2, 4], (t, h) => 1e-3 * t + 5e-5 * t ** 3 + sch(t, h)));
    const e = otherResult("joint-fit", 1, out[1]!)!;
    expect(e.summary).toContain("3 measurements in 1–4 T fitted together");
    expect(e.summary).toContain("shared: gamma, beta, n");
    const gamma = e.values.find((v) => v.name === "gamma")!;
    expect(gamma.unit).toBe("mJ mol⁻¹ K⁻²");
    expect(gamma.compact).toMatch(/^1\.000\d*\(\d+\) mJ mol⁻¹ K⁻²$/);
    expect(e.values.filter((v) => v.name.startsWith("g#")).map((v) => v.symbol)).toEqual(["g (1 T)", "g (2 T)", "g (4 T)"]);
  });
  it("otherResult of a γ(H) step names the preferred law, γ_n and its source, and both laws' a and b", () => {
    const out = computeChain([
      { id: "d", kind: "data", config: { measurementIds: ["m0", "m1", "m2", "m3", "m4"] } },
      { id: "j", kind: "joint-fit", config: { model: "sommerfeld", shared: ["beta"] } },
      { id: "g", kind: "gamma-field", config: { hc2T: 2, gammaNMJ: { value: 5, stdError: 0.01 } } },
    ], ctx([0.2, 0.6, 1, 1.4, 1.8], (t, h) => 5e-3 * (0.02 + 0.98 * h / 2) * t + 2e-4 * t ** 3));
    expect(out[2]!.ok, out[2]!.error ?? "").toBe(true);
    const e = otherResult("gamma-field", 2, out[2]!)!;
    expect(e.summary).toContain("preferred: linear in H");
    expect(e.summary).toContain("from the value given");
    expect(e.values.map((v) => v.name)).toEqual(["linear-a", "linear-b", "sqrt-a", "sqrt-b"]);
  });
  it("otherResult of other kinds is null", () => {
    expect(otherResult("fit", 0, { kind: "fit", ok: true, result: {} })).toBeNull();
  });
});

describe("report fit parameters", () => {
  it("parameter writes a recommended fit's γ as value(stat)(syst) in mJ mol⁻¹ K⁻², and a plain one as value(σ)", async () => {
    const { parameter } = await import("../../lib/server/review/report");
    const g = { name: "gamma", value: 2.0e-3, stdError: 1.0e-5, unit: "J/(mol*K^2)" };
    expect(parameter(g, 4.0e-5).compact).toBe("2.000(10)(40) mJ mol⁻¹ K⁻² (stat)(syst)");
    expect(parameter(g, 4.0e-5).systematicError).toBeCloseTo(0.04, 12);
    expect(parameter(g).compact).toBe("2.000(10) mJ mol⁻¹ K⁻²");
  });
});
