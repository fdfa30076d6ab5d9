/**
 * Demo seed (INVENTED DATA): the measurements in field exist with their fields, say they are
 * invented, seeding twice changes nothing, and the seeded points are physically consistent:
 * single-curve fits of the stored data (addenda subtracted, per mole) recover the invented
 * truth of lib/server/demo/fieldCurves.ts within 3σ (seeded synthetic data, truth within k·σ).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { seedDemo } from "../../lib/server/demo/seed";
import { addendaHeatCapacity, betaFromTheta } from "../../lib/server/demo/curves";
import { MAGNETIC_ALLOY, MIXED_STATE_FIELDS_T, NORMAL_STATE_FIELDS_T } from "../../lib/server/demo/fieldCurves";
import { unpackFloat64 } from "../../lib/server/packing";
import { fitHeatCapacity, type HeatCapacityFitOptions, type HeatCapacityFitResult } from "../../lib/engine/fit";
import { BOHR_MAGNETON_J_PER_T, BOLTZMANN_J_PER_K, GAS_CONSTANT_J_PER_MOL_K } from "../../lib/engine/constants";

let t: TestDatabase;
beforeAll(async () => {
  t = await freshDatabase();
  const t0 = performance.now();
  await seedDemo(t.db);
  // Reported, not asserted (speed targets belong in benchmarks).
  console.log(`seedDemo took ${(performance.now() - t0).toFixed(0)} ms`);
}, 240_000);
afterAll(async () => { await t.drop(); });

async function sampleByLabel(prefix: string) {
  return t.db.sample.findFirstOrThrow({ where: { label: { startsWith: prefix } }, include: { measurements: true } });
}

/** A stored curve of `prefix` in `fieldT`, addenda subtracted, per mole of formula units. */
async function molarCurve(prefix: string, fieldT: number) {
  const s = await sampleByLabel(prefix);
  const m = s.measurements.find((x) => x.fieldT === fieldT)!;
  const moles = (s.massMg! * 1e-3) / s.molarMassGPerMol;
  const temperatureK = unpackFloat64(m.temperatureK);
  const heatCapacity = unpackFloat64(m.heatCapacity).map((c, i) => (c - addendaHeatCapacity(temperatureK[i]!)) / moles);
  const sigma = unpackFloat64(m.sigma!).map((s) => s / moles);
  return { temperatureK, heatCapacity, sigma };
}

async function fit(prefix: string, fieldT: number, options: HeatCapacityFitOptions): Promise<HeatCapacityFitResult> {
  return fitHeatCapacity(await molarCurve(prefix, fieldT), options);
}

function expectWithin3Sigma(result: HeatCapacityFitResult, truth: Record<string, number>): void {
  expect(result.converged, result.message).toBe(true);
  for (const [name, value] of Object.entries(truth)) {
    const p = result.parameters.find((q) => q.name === name)!;
    expect(p.stdError, name).not.toBeNull();
    expect(Math.abs(p.value - value), `${name} = ${p.value} ± ${p.stdError}, truth ${value}`).toBeLessThanOrEqual(3 * p.stdError!);
  }
}

// The truth written in fieldCurves.ts' header, spelled out here: Nb (NM-01) γ_n = 7.7 mJ mol⁻¹ K⁻²,
// Θ_D = 276 K, T_c(0) = 9.1 K, γ_r(0)/γ_n = 0.03, spread 0.08 K; H_c2(0) = 1.8 T.
const NB = { gamma: 7.7e-3, beta: betaFromTheta(276), tc0: 9.1, r0: 0.03, spread0: 0.08, hc2: 1.8 };

function nbMixedTruth(h: number) {
  const tc = NB.tc0 * Math.sqrt(1 - h / NB.hc2);
  const gammaR = NB.gamma * (NB.r0 + (1 - NB.r0) * h / NB.hc2);
  const spread = NB.spread0 + 0.1 * h;
  const meanInvTc2 = [-1, -0.5, 0, 0.5, 1].reduce((s, k) => s + 1 / (tc + k * spread) ** 2, 0) / 5;
  return { tc, spread, gamma: gammaR, beta: NB.beta + 3 * (NB.gamma - gammaR) * meanInvTc2 };
}

describe("seedDemo in fields", () => {
  it("seedDemo gives the superconducting sample curves in 0 T, four mixed-state fields and two normal-state fields", async () => {
    const nb = await sampleByLabel("NM-01");
    expect(nb.measurements.map((m) => m.fieldT).sort((a, b) => a - b)).toEqual([0, ...MIXED_STATE_FIELDS_T, ...NORMAL_STATE_FIELDS_T]);
    for (const h of MIXED_STATE_FIELDS_T) {
      const m = nb.measurements.find((x) => x.fieldT === h)!;
      expect(m.label).toBe(`Nb, ${h} T mixed state`);
      expect(m.tMinK).toBeCloseTo(0.6, 6);
      expect(m.tMaxK).toBeCloseTo(20, 6);
      expect(m.sigma).not.toBeNull();
    }
    expect(nb.measurements.find((x) => x.fieldT === 3)!.label).toBe("Nb, 3 T normal state");
  });

  it("seedDemo gives the magnetic alloy MA-01 Cu0.996Mn0.004 in 0, 2, 4 and 6 T with its IUPAC molar mass", async () => {
    const ma = await sampleByLabel("MA-01");
    expect(ma.formula).toBe("Cu0.996Mn0.004");
    // IUPAC 2021 standard atomic weights (abridged): Cu 63.546, Mn 54.938.
    expect(ma.molarMassGPerMol).toBeCloseTo(0.996 * 63.546 + 0.004 * 54.938, 2);
    expect(ma.seriesLabel).toBeNull();
    expect(ma.measurements.map((m) => m.fieldT).sort((a, b) => a - b)).toEqual([0, 2, 4, 6]);
    expect(ma.label).toBe("MA-01 CuMn 0.4 at.% (demo)");
    expect(ma.measurements.find((m) => m.fieldT === 4)!.label).toBe("CuMn 0.4 at.%, 4 T");
  });

  it("seedDemo marks every new measurement and its stored file as invented demo data", async () => {
    for (const prefix of ["NM-01", "MA-01"]) {
      const s = await sampleByLabel(prefix);
      for (const m of s.measurements) {
        expect(m.notes, `${prefix} ${m.label}`).toContain("INVENTED DEMO DATA");
        const file = await t.db.storedFile.findUniqueOrThrow({ where: { id: m.fileId } });
        expect(Buffer.from(file.bytes).toString("utf8").split("\n")[0]).toMatch(/^# INVENTED DEMO DATA/);
      }
      expect(s.notes).toContain("INVENTED DEMO DATA");
    }
  });

  it("seedDemo keeps the superconductor's demo analysis on the 2 T normal-state curve", async () => {
    const nb = await sampleByLabel("NM-01");
    const twoT = nb.measurements.find((m) => m.fieldT === 2)!;
    const analysis = await t.db.analysis.findFirstOrThrow({ where: { sampleId: nb.id } });
    const steps = await t.db.step.findMany({ where: { revision: { analysisId: analysis.id } }, orderBy: { position: "asc" } });
    const data = steps.filter((s) => s.kind === "data").map((s) => (s.config as { measurementIds: string[] }).measurementIds);
    expect(data[0]).toEqual([twoT.id]);
  });

  it("seedDemo a second time seeds nothing", async () => {
    const [samples, measurements, analyses] = await Promise.all([t.db.sample.count(), t.db.measurement.count(), t.db.analysis.count()]);
    expect(await seedDemo(t.db)).toBe(false);
    expect([await t.db.sample.count(), await t.db.measurement.count(), await t.db.analysis.count()]).toEqual([samples, measurements, analyses]);
  });
});

describe("seeded curves recover their invented truth (single-curve fits, 3σ)", () => {
  for (const h of MIXED_STATE_FIELDS_T) {
    it(`fitHeatCapacity sommerfeld on NM-01 at ${h} T below T_c(H) gives the residual γ(H) and the effective β`, async () => {
      const truth = nbMixedTruth(h);
      const r = await fit("NM-01", h, { model: "sommerfeld", tMinK: 0.6, tMaxK: Math.min(4, 0.85 * (truth.tc - truth.spread)) });
      expectWithin3Sigma(r, { gamma: truth.gamma, beta: truth.beta });
    });
  }

  it("fitHeatCapacity sommerfeld-t5 on NM-01 at 3 T gives the normal-state γ_n and β", async () => {
    const r = await fit("NM-01", 3, { model: "sommerfeld-t5", tMinK: 1.8, tMaxK: 14 });
    expectWithin3Sigma(r, { gamma: NB.gamma, beta: NB.beta });
  });

  const A = MAGNETIC_ALLOY.spec;
  const alloyTruth = { gamma: A.gammaMJ * 1e-3, beta: betaFromTheta(A.thetaDK) };

  it("fitHeatCapacity sommerfeld on MA-01 at 0 T gives γ and β (no Schottky term in zero field)", async () => {
    const r = await fit("MA-01", 0, { model: "sommerfeld", tMinK: 0.4, tMaxK: 8 });
    expectWithin3Sigma(r, alloyTruth);
  });

  for (const h of [2, 4, 6]) {
    it(`fitHeatCapacity of a Zeeman Schottky expression on MA-01 at ${h} T gives γ, β, n, g and A = a_N·H²`, async () => {
      // Δ/k_B = g·(μ_B H/k_B): the field's factor as a literal, CODATA 2018 μ_B and k_B.
      const c = (BOHR_MAGNETON_J_PER_T * h) / BOLTZMANN_J_PER_K;
      const x = `(${c}*g/T)`;
      const expression = `gamma*T + beta*T^3 + n*${GAS_CONSTANT_J_PER_MOL_K}*${x}^2*exp(${x})/(1+exp(${x}))^2 + A/T^2`;
      const r = await fit("MA-01", h, { model: { expression }, tMinK: 0.4, tMaxK: 16, start: { g: 2 } });
      expectWithin3Sigma(r, { ...alloyTruth, n: A.n, g: A.g, A: A.nuclearPerT2MJ * 1e-3 * h * h });
    });
  }
});

describe("demo analyses across fields and over a wide range", () => {
  async function stepsOf(titleEnd: string) {
    const { memberOf } = await import("../../lib/server/access");
    const { openNotebook } = await import("../../lib/server/notebook");
    const analyst = await t.db.user.findUniqueOrThrow({ where: { email: "arun.analyst@demo.heatbook" } });
    const a = await t.db.analysis.findFirstOrThrow({ where: { title: { endsWith: titleEnd } }, include: { group: true } });
    const member = await memberOf(t.db, analyst.id, a.group.slug);
    return (await openNotebook(t.db, member, a.id)).steps;
  }
  const resultOfKind = (steps: Awaited<ReturnType<typeof stepsOf>>, kind: string, k = 0) => {
    const s = steps.filter((x) => x.kind === kind)[k]!;
    expect(s.output?.ok, `${kind}: ${s.output?.error}`).toBe(true);
    return s.output!.result as any;
  };

  it("the demo γ(H) analysis prefers the linear law the curves were made with and finds γ_n within 3σ", async () => {
    const steps = await stepsOf("γ(H) across fields");
    const normal = resultOfKind(steps, "joint-fit", 0);
    const g = normal.fit.parameters.find((p: any) => p.key === "gamma");
    expect(Math.abs(g.value - 7.7e-3)).toBeLessThan(3 * g.stdError);
    // the normal state's lattice views: Θ_D(T) near the invented 276 K (δT⁵ makes it sag slowly with T)
    const lat = resultOfKind(steps, "lattice");
    const thetas = lat.curve.thetaDK.filter((v: number | null): v is number => v !== null);
    expect(thetas.length).toBeGreaterThan(100);
    const mid = lat.curve.temperatureK.map((t: number, i: number) => [t, lat.curve.thetaDK[i]]).filter(([t, v]: [number, number | null]) => t > 5 && t < 12 && v !== null);
    for (const [, v] of mid) expect(Math.abs(v / 276 - 1)).toBeLessThan(0.05);
    const gh = resultOfKind(steps, "gamma-field");
    expect(gh.preferred).toBe("linear");
    expect(gh.fields.map((f: any) => f.fieldT)).toEqual([0, ...MIXED_STATE_FIELDS_T]);
    const lin = gh.laws.find((l: any) => l.law === "linear");
    expect(Math.abs(lin.intercept.value - 0.03)).toBeLessThan(3 * lin.intercept.stdError + 0.01);
    expect(Math.abs(lin.slope.value * 1.8 / gh.hc2T - 0.97)).toBeLessThan(3 * lin.slope.stdError + 0.02);
  });

  it("the demo alloy's joint fit recovers γ, n, g and the nuclear coefficient within 3σ", async () => {
    const steps = await stepsOf("Schottky term across fields");
    const r = resultOfKind(steps, "joint-fit");
    const p = (k: string) => r.fit.parameters.find((q: any) => q.key === k);
    const s = MAGNETIC_ALLOY.spec;
    for (const [k, truth] of [["gamma", s.gammaMJ * 1e-3], ["n", s.n], ["g", s.g], ["a", s.nuclearPerT2MJ * 1e-3]] as const) {
      expect(Math.abs(p(k).value - truth), `${k} = ${p(k).value} ± ${p(k).stdError}`).toBeLessThan(3 * p(k).stdError);
    }
    expect(resultOfKind(steps, "derive").quantities.some((q: any) => q.name === "thetaD")).toBe(true);
  });

  it("the demo lattice views show the Einstein-like mode near Θ_E/4.93", async () => {
    const steps = await stepsOf("lattice over a wide range");
    const r = resultOfKind(steps, "lattice");
    expect(r.peak).not.toBeNull();
    expect(Math.abs(4.928 * r.peak.temperatureK / 70 - 1)).toBeLessThan(0.2);
  });
});
