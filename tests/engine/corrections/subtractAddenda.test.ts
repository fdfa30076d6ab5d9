import { describe, expect, it } from "vitest";
import { subtractAddenda } from "../../../lib/engine/corrections";
import { InputError } from "../../../lib/engine/errors";
import { expectClose } from "../../helpers/expectClose";

/** Seeded uniform PRNG (mulberry32) and standard normal deviates (Box–Muller). */
function normalRng(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const grid = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));

describe("subtractAddenda analytic identities", () => {
  const sampleT = [2.1, 3.3, 4.7, 6.05, 8.9];
  const total = sampleT.map((t) => 1e-5 * t + 2e-7 * t ** 3);

  it("subtractAddenda with a constant addenda subtracts the constant exactly (linear and smooth)", () => {
    const addenda = { temperatureK: grid(2, 10, 9), heatCapacityJPerK: Array(9).fill(2e-6) };
    for (const method of ["linear", "smooth"] as const) {
      const r = subtractAddenda({ temperatureK: sampleT, heatCapacityJPerK: total }, addenda, { method, smoothingDegree: method === "smooth" ? 0 : undefined });
      r.heatCapacityJPerK.forEach((c, i) => expectClose(c, total[i] - 2e-6, { rel: 1e-12 }, `${method} point ${i}`));
    }
  });

  it("subtractAddenda with a linear addenda reproduces it exactly by interpolation and by a degree-1 or AICc polynomial", () => {
    const at = grid(1.5, 12, 15);
    const line = (t: number) => 3e-6 + 4e-7 * t;
    const addenda = { temperatureK: at, heatCapacityJPerK: at.map(line) };
    for (const options of [{ method: "linear" as const }, { method: "smooth" as const, smoothingDegree: 1 }, { method: "smooth" as const, smoothingIn: "T" as const }]) {
      const r = subtractAddenda({ temperatureK: sampleT, heatCapacityJPerK: total }, addenda, options);
      r.addendaJPerK.forEach((a, i) => expectClose(a, line(sampleT[i]), { rel: 1e-10 }, JSON.stringify(options)));
    }
  });

  it("subtractAddenda propagates σ: midway between two addenda points σ_a = σ/√2 and σ_net² = σ_s² + σ_a²", () => {
    const r = subtractAddenda(
      { temperatureK: [1.5], heatCapacityJPerK: [10], sigma: [0.3] },
      { temperatureK: [1, 2], heatCapacityJPerK: [1, 3], sigma: [0.4, 0.4] },
      { method: "linear" },
    );
    expectClose(r.addendaJPerK[0], 2);
    expectClose(r.addendaSigma![0], 0.4 / Math.SQRT2);
    expectClose(r.sigma![0], Math.sqrt(0.09 + 0.08));
    expectClose(r.heatCapacityJPerK[0], 8);
  });

  it("subtractAddenda on an addenda point uses that point and its σ", () => {
    const r = subtractAddenda({ temperatureK: [2], heatCapacityJPerK: [5], sigma: [0.1] }, { temperatureK: [1, 2, 3], heatCapacityJPerK: [1, 2, 3], sigma: [0.2, 0.2, 0.2] }, { method: "linear" });
    expect([r.heatCapacityJPerK[0], r.addendaSigma![0]]).toEqual([3, 0.2]);
  });

  it("subtractAddenda merges repeated addenda temperatures by their inverse-variance mean", () => {
    const r = subtractAddenda({ temperatureK: [2], heatCapacityJPerK: [5] },
      { temperatureK: [3, 2, 1, 2], heatCapacityJPerK: [3, 1, 1, 4], sigma: [1, 1, 1, 2] }, { method: "linear" });
    expectClose(r.addendaJPerK[0], (1 + 4 / 4) / (1 + 1 / 4));
    expectClose(r.addendaSigma![0], 1 / Math.sqrt(1.25));
  });

  it("subtractAddenda with a single addenda point works only at that temperature", () => {
    const addenda = { temperatureK: [2], heatCapacityJPerK: [1] };
    expect(subtractAddenda({ temperatureK: [2], heatCapacityJPerK: [3] }, addenda, { method: "linear" }).heatCapacityJPerK).toEqual([2]);
    expect(() => subtractAddenda({ temperatureK: [2.5], heatCapacityJPerK: [3] }, addenda, { method: "linear" })).toThrow(InputError);
  });
});

describe("subtractAddenda range, warnings and provenance", () => {
  const addenda = { temperatureK: grid(2, 10, 5), heatCapacityJPerK: grid(2, 10, 5).map((t) => 1e-6 * t) };

  it("subtractAddenda refuses sample points outside the addenda range, naming the first and the count", () => {
    try {
      subtractAddenda({ temperatureK: [1.8, 5, 11, 12], heatCapacityJPerK: [1, 1, 1, 1] }, addenda, { method: "linear" });
      throw new Error("no error");
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).message).toMatch(/1\.8 K is outside the addenda range 2 K–10 K \(3 points outside in all\)/);
      expect((e as InputError).where).toEqual({ field: "sample.temperatureK", line: 1 });
    }
  });

  it("subtractAddenda with outsideRange flag leaves those points out, lists them and warns", () => {
    const r = subtractAddenda({ temperatureK: [1.8, 5, 11], heatCapacityJPerK: [1, 1, 1] }, addenda, { method: "smooth", smoothingDegree: 1, outsideRange: "flag" });
    expect(r.temperatureK).toEqual([5]);
    expect(r.sourceIndex).toEqual([1]);
    expect(r.excluded.map((x) => x.index)).toEqual([0, 2]);
    expect(r.warnings.join(" ")).toMatch(/2 sample points outside the addenda range 2 K–10 K left out \(not extrapolated\)/);
  });

  it("subtractAddenda warns where the addenda exceed half of the total, naming the temperature ranges", () => {
    const t = [2, 3, 4, 5, 6, 8, 9];
    const totals = [5e-6, 5e-6, 6e-6, 4e-6, 1.3e-5, 1.5e-5, 2e-5]; // addenda = 1e-6 J/K² · T
    const r = subtractAddenda({ temperatureK: t, heatCapacityJPerK: totals }, addenda, { method: "linear" });
    expect(r.warnings[0]).toBe("addenda exceed 50 % of the total heat capacity at 3 K–5 K (3 points), 8 K (1 point): the net result there depends strongly on the addenda");
    expect(r.warnings[1]).toBe("net heat capacity is zero or negative at 5 K (1 point)");
  });

  it("subtractAddenda records method and parameters, and does not mutate its inputs", () => {
    const sample = { temperatureK: [3, 4], heatCapacityJPerK: [1, 1], sigma: [0.1, 0.1] };
    const copy = JSON.parse(JSON.stringify([sample, addenda]));
    const r = subtractAddenda(sample, addenda, { method: "smooth" });
    expect(JSON.parse(JSON.stringify([sample, addenda]))).toEqual(copy);
    expect(r.provenance).toMatchObject({ step: "addenda-subtraction", method: "smooth", parameters: { addendaRangeK: [2, 10], smoothingIn: "T", degreeChosen: "AICc", pointsUsed: 2, sigmaEstimated: true } });
    expect(r.warnings).toEqual([]);
  });

  it("subtractAddenda without sample σ gives no net σ and says so", () => {
    const r = subtractAddenda({ temperatureK: [3], heatCapacityJPerK: [1] }, { ...addenda, sigma: [1e-8, 1e-8, 1e-8, 1e-8, 1e-8] }, { method: "linear" });
    expect(r.sigma).toBeUndefined();
    expect(r.warnings).toContain("the sample has no σ: net σ not computed (addenda σ is in addendaSigma)");
  });

  it("subtractAddenda refuses bad input with the field and point", () => {
    const ok = { temperatureK: [3], heatCapacityJPerK: [1] };
    expect(() => subtractAddenda({ temperatureK: [3, -1], heatCapacityJPerK: [1, 1] }, addenda, { method: "linear" })).toThrow(/invalid sample\.temperatureK: -1.*line 2/);
    expect(() => subtractAddenda(ok, { ...addenda, heatCapacityJPerK: [1] }, { method: "linear" })).toThrow(/1 heat-capacity values for 5 temperatures/);
    expect(() => subtractAddenda(ok, addenda, { method: "spline" as never })).toThrow(/invalid method/);
    expect(() => subtractAddenda(ok, addenda, { method: "smooth", smoothingDegree: 4 })).toThrow(/needs at least 6 addenda temperatures/);
    expect(() => subtractAddenda(ok, { temperatureK: [2, 3, 4], heatCapacityJPerK: [1, 2, 3] }, { method: "smooth" })).toThrow(/at least 4/);
  });
});

describe("subtractAddenda seeded synthetic data", () => {
  it("subtractAddenda with AICc smoothing recovers the true net C within its propagated σ (seed 42)", () => {
    const rng = normalRng(42);
    const addendaTrue = (t: number) => 2e-7 * t + 3e-9 * t ** 3; // invented platform curve, J/K
    const sampleTrue = (t: number) => 1e-6 * t + 4e-8 * t ** 3; // invented sample curve, J/K
    const at = grid(0.5, 20, 80);
    const sa = at.map((t) => 0.01 * addendaTrue(t));
    const addenda = { temperatureK: at, heatCapacityJPerK: at.map((t, i) => addendaTrue(t) + sa[i] * rng()), sigma: sa };
    const st = grid(0.6, 19, 60);
    const ss = st.map((t) => 0.005 * (addendaTrue(t) + sampleTrue(t)));
    const sample = { temperatureK: st, heatCapacityJPerK: st.map((t, i) => addendaTrue(t) + sampleTrue(t) + ss[i] * rng()), sigma: ss };
    const r = subtractAddenda(sample, addenda, { method: "smooth" });
    expect(r.provenance.parameters.smoothingIn).toBe("logT");
    const z2 = r.temperatureK.map((t, i) => ((r.heatCapacityJPerK[i] - sampleTrue(t)) / r.sigma![i]) ** 2);
    const meanZ2 = z2.reduce((s, v) => s + v, 0) / z2.length;
    expect(meanZ2).toBeGreaterThan(0.5);
    expect(meanZ2).toBeLessThan(1.6);
    expect(Math.max(...z2)).toBeLessThan(16); // every point within 4σ
    const lin = subtractAddenda(sample, addenda, { method: "linear" });
    const zl = lin.temperatureK.map((t, i) => Math.abs(lin.heatCapacityJPerK[i] - sampleTrue(t)) / lin.sigma![i]);
    expect(Math.max(...zl)).toBeLessThan(5);
  });
});
