/**
 * Joint fit and γ(H) steps in a notebook chain, on invented data (generated here, seeded):
 * several fields of one sample through data → joint fit (→ γ(H)). Truths are recovered within
 * 3σ; one measurement gives the fit step's values; failures name their field.
 */
import { describe, it, expect } from "vitest";
import { computeChain, type ChainContext, type StepSpec } from "../../lib/engine/notebook";
import type { StepResult } from "../../lib/engine/notebook/registry";
import { BOHR_MAGNETON_J_PER_T as MUB, BOLTZMANN_J_PER_K as KB, GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";

function normal(seed: number): () => number {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

function schottky(t: number, delta: number): number {
  if (delta === 0) return 0;
  const x = delta / t;
  const e = Math.exp(-x);
  return R * x * x * e / (1 + e) ** 2;
}

/** Molar curves at the given fields from c(T, H), 0.5 % σ, seeded noise. */
function context(fields: number[], c: (t: number, h: number) => number, seed: number, tMax = 10): ChainContext {
  const rnd = normal(seed);
  const measurements: ChainContext["measurements"] = {};
  fields.forEach((h, k) => {
    const T = Array.from({ length: 80 }, (_, i) => 0.4 * (tMax / 0.4) ** (i / 79));
    const C0 = T.map((t) => c(t, h));
    const sigma = C0.map((x) => 0.005 * x);
    measurements[`m${k}`] = { id: `m${k}`, label: `${h} T`, kind: "sample", basis: "molar", fieldT: h, sha256: `h${k}`, temperatureK: T, heatCapacity: C0.map((x, i) => x + sigma[i]! * rnd()), sigma };
  });
  return { sample: { id: "s", label: "test", formula: "Cu", molarMassGPerMol: 63.546, atomsPerFormulaUnit: 1, massMg: null, densityGPerCm3: null, valences: {} }, measurements };
}

const data = (n: number): StepSpec => ({ id: "d", kind: "data", config: { measurementIds: Array.from({ length: n }, (_, k) => `m${k}`) } });

describe("joint fit step", () => {
  it("joint fit step recovers shared γ, β, n and g of a Zeeman Schottky term over four fields within 3σ", () => {
    const G = 0.7e-3, B = 0.05e-3, N = 0.004, GF = 2.0; // invented truth (SI, n per mole)
    for (const seed of [1, 2, 3]) {
      const ctx = context([0, 2, 4, 6], (t, h) => G * t + B * t ** 3 + N * schottky(t, (GF * MUB * h) / KB), seed);
      const out = computeChain([data(4), { id: "j", kind: "joint-fit", config: { model: "zeeman-schottky" } }], ctx);
      const j = out[1]!;
      expect(j.ok, j.error ?? "").toBe(true);
      const r = j.result as StepResult<"joint-fit">;
      const p = (k: string) => r.fit.parameters.find((q) => q.key === k)!;
      for (const [k, truth] of [["gamma", G], ["beta", B], ["n", N], ["g", GF]] as const) {
        expect(Math.abs(p(k).value - truth), `${k} seed ${seed}`).toBeLessThan(3 * p(k).stdError!);
      }
      expect(r.fit.measurements.map((m) => m.fieldT)).toEqual([0, 2, 4, 6]);
      expect(r.handsDownFit).toBe(true);
      expect(j.state.fit?.gamma?.value).toBeCloseTo(p("gamma").value, 12);
    }
  });

  it("joint fit step with zeeman-schottky-nuclear recovers γ, β, n, g and the H² nuclear tail from 0.4 K within 3σ", () => {
    const G = 0.71e-3, B = 0.0495e-3, N = 0.004, GF = 2.04, A = 3.2e-6; // invented truth (SI)
    for (const seed of [4, 5, 6]) {
      const ctx = context([0, 2, 4, 6], (t, h) => G * t + B * t ** 3 + N * schottky(t, (GF * MUB * h) / KB) + (A * h * h) / (t * t), seed);
      const out = computeChain([data(4), { id: "j", kind: "joint-fit", config: { model: "zeeman-schottky-nuclear" } }], ctx);
      expect(out[1]!.ok, out[1]!.error ?? "").toBe(true);
      const r = out[1]!.result as StepResult<"joint-fit">;
      const p = (k: string) => r.fit.parameters.find((q) => q.key === k)!;
      for (const [k, truth] of [["gamma", G], ["beta", B], ["n", N], ["g", GF], ["a", A]] as const) {
        expect(Math.abs(p(k).value - truth), `${k} seed ${seed}`).toBeLessThan(3 * p(k).stdError!);
      }
    }
  });

  it("joint fit step with one measurement gives the fit step's γ and β", () => {
    const ctx = context([0], (t) => 1.2e-3 * t + 0.1e-3 * t ** 3, 5, 5);
    const out = computeChain([data(1), { id: "f", kind: "fit", config: { model: "sommerfeld" } }, { id: "j", kind: "joint-fit", config: { model: "sommerfeld" } }], ctx);
    const f = out[1]!.result as StepResult<"fit">, j = out[2]!.result as StepResult<"joint-fit">;
    for (const name of ["gamma", "beta"]) {
      const a = f.fit.parameters.find((q) => q.name === name)!, b = j.fit.parameters.find((q) => q.name === name)!;
      expect(Math.abs(b.value / a.value - 1)).toBeLessThan(1e-9);
      expect(Math.abs(b.stdError! / a.stdError! - 1)).toBeLessThan(1e-6);
    }
  });

  it("joint fit step with an unknown shared name fails and names the shared field", () => {
    const ctx = context([0, 2], (t) => 1e-3 * t + 1e-4 * t ** 3, 1);
    const out = computeChain([data(2), { id: "j", kind: "joint-fit", config: { model: "normal-state", shared: ["gamma", "zeta"] } }], ctx);
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.field).toBe("shared");
  });
});

describe("γ(H) step", () => {
  const GN = 5e-3, B = 0.2e-3, HC2 = 2; // invented truth
  function chain(law: "linear" | "sqrt", seed: number) {
    const fields = [0.2, 0.5, 0.8, 1.1, 1.4, 1.7, 2.5, 3];
    const gammaOf = (h: number) => (h >= HC2 ? GN : GN * (0.05 + 0.95 * (law === "linear" ? h / HC2 : Math.sqrt(h / HC2))));
    const ctx = context(fields, (t, h) => gammaOf(h) * t + B * t ** 3, seed, 3);
    return computeChain([
      data(fields.length),
      { id: "j", kind: "joint-fit", config: { model: "sommerfeld", shared: ["beta"] } },
      { id: "g", kind: "gamma-field", config: { hc2T: HC2 } },
    ], ctx);
  }
  for (const law of ["linear", "sqrt"] as const) {
    it(`γ(H) step recovers and prefers the ${law === "linear" ? "linear" : "√H"} law from a joint fit with γ per field`, () => {
      for (const seed of [11, 12, 13]) {
        const out = chain(law, seed);
        const g = out[2]!;
        expect(g.ok, g.error ?? "").toBe(true);
        const r = g.result as StepResult<"gamma-field">;
        expect(r.preferred, `seed ${seed}`).toBe(law);
        expect(r.fields).toHaveLength(6);
        expect(Math.abs(r.gammaN.value - GN)).toBeLessThan(3 * r.gammaN.stdError!);
        const best = r.laws.find((l) => l.law === law)!;
        expect(Math.abs(best.slope.value - 0.95)).toBeLessThan(3 * best.slope.stdError + 0.02);
        expect(r.gammaNFrom).toContain("2.5, 3 T");
      }
    });
  }

  it("γ(H) step without H_c2 fails and names hc2T; with γ shared it names the joint fit", () => {
    const ctx = context([0.5, 1, 1.5, 3], (t, h) => GN * Math.min(1, h / HC2) * t + B * t ** 3, 1, 3);
    const a = computeChain([data(4), { id: "j", kind: "joint-fit", config: { model: "sommerfeld", shared: ["beta"] } }, { id: "g", kind: "gamma-field", config: {} }], ctx);
    expect(a[2]!.field).toBe("hc2T");
    const b = computeChain([data(4), { id: "j", kind: "joint-fit", config: { model: "sommerfeld", shared: ["gamma", "beta"] } }, { id: "g", kind: "gamma-field", config: { hc2T: 2 } }], ctx);
    expect(b[2]!.ok).toBe(false);
    expect(b[2]!.field).toBe("jointFitStepId");
  });
});
