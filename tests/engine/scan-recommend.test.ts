import { describe, it, expect } from "vitest";
import { scanWindows, recommendFit, chiSquareSurvival, formatStatSyst, schottkyGapDerivative, minimizeBrent, gapCandidateCells, testWindow, type Recommendation } from "../../lib/engine/scan";
import { recommendationWindows } from "../../lib/engine/scan/recommendGrid";
import { schottkyHeatCapacity } from "../../lib/engine/models";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "./uncertainty.random";
import { betaOf, makeData, type Truth } from "./recommend.data";

// Invented data with known truth (recommend.data.ts): C = γT + βT³ + one extra term, σ a fixed share of C.
const CASES: Record<string, Truth> = {
  "a two-level Schottky upturn": { gamma: 3e-3, thetaDK: 300, extra: { kind: "schottky", n: 2e-4, gapK: 1.5 }, tLoK: 0.5, tHiK: 15, points: 400, relSigma: 0.005 },
  "a T⁵ term": { gamma: 1.5e-3, thetaDK: 250, extra: { kind: "t5", delta: 3.2e-11 }, tLoK: 1, tHiK: 18, points: 400, relSigma: 0.005 },
  "a nuclear A/T² tail": { gamma: 7e-3, thetaDK: 420, extra: { kind: "nuclear", A: 6e-5 }, tLoK: 0.4, tHiK: 12, points: 400, relSigma: 0.01 },
  "nothing extra": { gamma: 5e-3, thetaDK: 350, extra: { kind: "none" }, tLoK: 1.5, tHiK: 12, points: 400, relSigma: 0.003 },
  "a small Schottky upturn and 1 % noise": { gamma: 9e-3, thetaDK: 200, extra: { kind: "schottky", n: 1e-4, gapK: 2.5 }, tLoK: 0.6, tHiK: 10, points: 300, relSigma: 0.01 },
};
const SEEDS = [1, 2, 3, 4, 5];

const total = (stat: number, syst: number) => Math.hypot(stat, syst);

function expectTruthInside(r: Recommendation, truth: Truth, label: string) {
  expect(r.recommended, `${label}: ${r.reason}`).toBe(true);
  const sg = total(r.gammaStdError!, r.gammaSystematicError!);
  expect(Math.abs(r.gamma! - truth.gamma), `${label}: γ = ${r.gamma} ± ${sg}, ${r.reason}`).toBeLessThanOrEqual(3 * sg);
  expect(sg, `${label}: σ_total(γ) informative`).toBeLessThan(0.1 * truth.gamma);
  const sb = total(r.betaStdError!, r.betaSystematicError!);
  expect(Math.abs(r.beta! - betaOf(truth.thetaDK)), `${label}: β`).toBeLessThanOrEqual(3 * sb);
}

describe("recommendFit on invented data with known truth", () => {
  for (const [name, truth] of Object.entries(CASES)) {
    it(`recommendFit with ${name} puts γ and β within 3σ_total of the truth for seeds ${SEEDS.join(", ")}`, () => {
      for (const seed of SEEDS) expectTruthInside(recommendFit(makeData(truth, seed)), truth, `${name}, seed ${seed}`);
    });
  }
  it("recommendFit with a Schottky upturn chooses the Schottky candidate and finds the gap", () => {
    const truth = CASES["a two-level Schottky upturn"];
    const r = recommendFit(makeData(truth, 11));
    expect(r.model).toBe("schottky");
    const cell = r.candidates.find((c) => c.model === "schottky")!.cells.find((c) => c.tMinK === r.window!.tMinK && c.tMaxK === r.window!.tMaxK)!;
    expect(Math.abs(cell.extra.gap - 1.5)).toBeLessThan(0.1);
    expect(r.reason).toMatch(/two-level Schottky: lowest AICc on the common window/);
    expect(r.reason).toMatch(/\(stat\)\(syst\)/);
  });
  it("recommendFit without σ uses the residual tests, reports no χ²_red and the residual standard deviation, and stays within 3σ_total", () => {
    for (const [name, truth] of Object.entries(CASES)) {
      for (const seed of [21, 22]) {
        const r = recommendFit(makeData(truth, seed, false));
        expectTruthInside(r, truth, `${name} unweighted, seed ${seed}`);
        expect(r.weighting).toBe("none");
        expect(r.reducedChiSquare).toBeNull();
        expect(r.residualStdDev!).toBeGreaterThan(0);
        expect(r.method).toMatch(/unweighted/);
        r.candidates.forEach((c) => c.cells.forEach((cell) => expect(cell.tests?.chiSquareProbability ?? null).toBeNull()));
      }
    }
  });
  it("recommendFit with an Einstein bump across the range recommends nothing and names the missing term", () => {
    const truth: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "einstein", nE: 0.02, thetaEK: 40 }, tLoK: 4, tHiK: 20, points: 400, relSigma: 0.005 };
    for (const seed of [1, 2, 3]) {
      const r = recommendFit(makeData(truth, seed));
      expect(r.recommended).toBe(false);
      expect(r.gamma).toBeNull();
      expect(r.window).toBeNull();
      expect(r.reason).toMatch(/^Not recommended/);
      expect(r.missingTerm).toMatch(/Einstein/);
      expect(r.reason).toContain(r.missingTerm!);
    }
  });
  it("recommendFit never falls back to the widest window: a single acceptable window is not enough", () => {
    const truth: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "einstein", nE: 0.05, thetaEK: 60 }, tLoK: 3, tHiK: 20, points: 400, relSigma: 0.005 };
    const r = recommendFit(makeData(truth, 1));
    expect(r.recommended).toBe(false);
    expect(r.reason).toMatch(/only 1 of the \d+ windows/);
  });
  it("recommendFit on data spanning less than a factor 2 in T says no window qualifies", () => {
    const r = recommendFit(makeData({ ...CASES["nothing extra"], tLoK: 5, tHiK: 9 }, 1));
    expect(r.recommended).toBe(false);
    expect(r.reason).toMatch(/no window of the grid spans a factor 2/);
  });
  it("recommendFit fits the user's expression on the same windows, agreeing with the built-in linear path", () => {
    const d = makeData(CASES["a T⁵ term"], 3);
    const r = recommendFit(d, { userModel: { expression: "g*T + b*T^3 + d*T^5" }, gridSize: 5 });
    const mine = r.candidates.find((c) => c.model === "expression")!;
    const built = r.candidates.find((c) => c.model === "sommerfeld-t5")!;
    expect(mine.cells.length).toBe(built.cells.length);
    mine.cells.forEach((c, k) => {
      expectClose(c.gamma!, built.cells[k].gamma!, { rel: 1e-8 });
      expectClose(c.gammaStdError!, built.cells[k].gammaStdError!, { rel: 1e-6 });
      expectClose(c.aicc!, built.cells[k].aicc!, { rel: 1e-8, abs: 1e-6 });
      expect(c.acceptable).toBe(built.cells[k].acceptable);
    });
  });
  it("recommendFit refuses bad options naming them", () => {
    const d = makeData(CASES["nothing extra"], 1);
    expect(() => recommendFit(d, { gridSize: 0 })).toThrow(/gridSize/);
    expect(() => recommendFit(d, { level: 0.7 })).toThrow(/level/);
    expect(() => recommendFit(d, { candidates: ["nope"] })).toThrow(/invalid model/);
    expect(() => recommendFit({ temperatureK: [1, -2], heatCapacity: [1, 2] })).toThrow(/temperatureK/);
  });
});

describe("scanWindows without a plateau", () => {
  it("scanWindows recommends no window when no two adjacent windows agree (no fallback to the smallest σ)", () => {
    // invented: a strong T⁵ term measured with σ = 1e-6 of C, so every window's γ differs from its neighbours'
    const T = Array.from({ length: 200 }, (_, i) => 1 + (19 * i) / 199);
    const C = T.map((t) => 2e-3 * t + 5e-5 * t ** 3 + 1e-6 * t ** 5);
    const s = scanWindows({ temperatureK: T, heatCapacity: C, sigma: C.map((c) => 1e-6 * c) });
    expect(s.cells.length).toBeGreaterThan(100);
    expect(s.recommended).toBeNull();
    expect(s.plateau).toBeNull();
    expect(s.reason).toMatch(/no window is recommended/);
  });
});

describe("the pieces of the recommendation", () => {
  it("chiSquareSurvival reproduces the closed forms for ν = 2 and 4 and tabulated critical values", () => {
    for (const x of [0.01, 0.5, 3, 20, 200]) {
      expectClose(chiSquareSurvival(x, 2), Math.exp(-x / 2), { rel: 1e-12 });
      expectClose(chiSquareSurvival(x, 4), Math.exp(-x / 2) * (1 + x / 2), { rel: 1e-12 });
    }
    // upper 1 % and 5 % points of χ² (standard statistical tables, from memory)
    expectClose(chiSquareSurvival(6.635, 1), 0.01, { rel: 2e-3 });
    expectClose(chiSquareSurvival(18.307, 10), 0.05, { rel: 2e-3 });
    expectClose(chiSquareSurvival(135.807, 100), 0.01, { rel: 2e-3 });
  });
  it("schottkyGapDerivative matches a central difference of the Schottky term", () => {
    for (const [t, gap] of [[0.5, 1.5], [2, 1.5], [10, 1.5], [1, 8]]) {
      const h = 1e-5 * gap;
      const numeric = (schottkyHeatCapacity(t, gap + h) - schottkyHeatCapacity(t, gap - h)) / (2 * h);
      expectClose(schottkyGapDerivative(t, gap), numeric, { rel: 1e-7 });
    }
  });
  it("minimizeBrent finds the minimum of a shifted parabola and of a non-quadratic function", () => {
    expectClose(minimizeBrent((x) => (x - 2) ** 2 + 1, 0, 5, 1e-10).x, 2, { rel: 1e-8 });
    expectClose(minimizeBrent((x) => Math.cosh(x - 0.3), -2, 4, 1e-10).x, 0.3, { abs: 1e-7 });
  });
  it("gapCandidateCells recovers γ, β, n and the gap from noise-free data", () => {
    const T = Float64Array.from({ length: 120 }, (_, i) => 0.5 * 30 ** (i / 119));
    const C = T.map((t) => 2e-3 * t + 8e-5 * t ** 3 + schottkyHeatCapacity(t, 1.7, 1, 3e-4));
    const S = C.map((c) => 0.005 * c);
    const windows = recommendationWindows(T, { size: 3, minPoints: 16, spanRatio: 2 }).filter((w) => w.lo === 0);
    const cells = gapCandidateCells({ T, C, S }, windows, 0.01);
    expect(cells.length).toBeGreaterThan(0);
    for (const c of cells) {
      // exact data: the Gauss–Newton polish lands on the generating values to near rounding
      expectClose(c.extra.gap, 1.7, { rel: 1e-9 });
      expectClose(c.gamma!, 2e-3, { rel: 1e-9 });
      expectClose(c.beta!, 8e-5, { rel: 1e-9 });
      expectClose(c.extra.n, 3e-4, { rel: 1e-9 });
      expect(c.chiSquare!).toBeLessThan(1e-12);
    }
  });
  it("testWindow flags a smooth trend that χ² alone misses and passes white noise", () => {
    const noise = seededNormal(5);
    const white = Array.from({ length: 400 }, () => noise());
    const chi = (z: number[]) => z.reduce((s, v) => s + v * v, 0);
    expect(testWindow(white, 2, chi(white), true).acceptable).toBe(true);
    const bent = white.map((v, i) => v + 0.3 * Math.cos((2 * Math.PI * i) / 400));
    const t = testWindow(bent, 2, chi(bent), true);
    expect(t.chiSquareProbability!).toBeGreaterThan(0.01);
    expect(t.failed).toContain("trend");
  });
  it("formatStatSyst writes value(stat)(syst) with the digits of the smaller uncertainty", () => {
    expect(formatStatSyst(3.00412, 0.0123, 0.0351)).toBe("3.004(12)(35)");
    expect(formatStatSyst(0.072104, 0.00012, 0.0003)).toBe("0.07210(12)(30)");
    expect(formatStatSyst(2.5, 0.012, 0)).toBe("2.500(12)(0)");
    expect(formatStatSyst(1.2345e-5, 5.6e-8, 1e-7)).toBe("1.2345(56)(100) × 10⁻⁵"); // never e-notation on a page
  });
});
