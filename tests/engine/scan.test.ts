import { describe, it, expect } from "vitest";
import { scanWindows, compareModels, findPlateau } from "../../lib/engine/scan";
import { debyeHeatCapacity } from "../../lib/engine/models";
import { expectClose } from "../helpers/expectClose";
import { seededNormal as rng } from "./uncertainty.random";


// Invented, seeded: γ = 2.1 mJ mol⁻¹ K⁻², full Debye lattice Θ_D = 180 K, 0.3 % noise.
const GAMMA = 2.1e-3;
function dataset(n: number, seed: number) {
  const noise = rng(seed);
  const T = Array.from({ length: n }, (_, i) => 1 + (24 * i) / (n - 1));
  const clean = T.map((t) => GAMMA * t + debyeHeatCapacity(t, 180));
  const sigma = clean.map((c) => 0.003 * c);
  return { temperatureK: T, heatCapacity: clean.map((c, i) => c + sigma[i] * noise()), sigma };
}

describe("scanWindows", () => {
  it("scanWindows(sommerfeld) finds a plateau at low T_max and recommends a window whose γ is within 3σ of the truth", () => {
    const d = dataset(400, 1);
    const s = scanWindows(d, { model: "sommerfeld" });
    expect(s.cells.length).toBeGreaterThan(250); // of the 20 × 20 grid, windows with too few points are skipped
    expect(s.plateau).not.toBeNull();
    expect(s.plateau!.cells.length).toBeGreaterThan(1);
    const rec = s.recommended!;
    expect(Math.abs(rec.gamma! - GAMMA)).toBeLessThan(3 * rec.gammaStdError!);
    expect(rec.beyondT3Range).toBe(false);
    expect(rec.tMaxK).toBeLessThanOrEqual(180 / 15 + 1e-9);
    expect(s.reason).toMatch(/plateau of \d+ adjacent windows/);
    // windows reaching far past Θ_D/15 are biased: the widest window's γ is off by many σ
    const widest = s.cells.find((c) => c.tMinK === s.tMinGridK[0] && c.tMaxK === s.tMaxGridK[s.tMaxGridK.length - 1])!;
    expect(Math.abs(widest.gamma! - GAMMA) / widest.gammaStdError!).toBeGreaterThan(5);
    expect(widest.beyondT3Range).toBe(true);
  });
  it("scanWindows honours the given grids and minPoints", () => {
    const d = dataset(50, 2);
    const s = scanWindows(d, { tMinGridK: [1, 2], tMaxGridK: [5, 8, 25], minPoints: 10 });
    expect(s.cells.map((c) => [c.tMinK, c.tMaxK])).toEqual([[1, 8], [1, 25], [2, 8], [2, 25]]);
    s.cells.forEach((c) => expect(c.nPoints).toBeGreaterThanOrEqual(10));
  });
  it("scanWindows(debye) runs the nonlinear path and stays near the truth in every window", () => {
    const d = dataset(60, 3);
    const s = scanWindows(d, { model: "debye", tMinGridK: [1, 3], tMaxGridK: [15, 25] });
    expect(s.cells.length).toBe(4);
    s.cells.forEach((c) => {
      expect(c.converged).toBe(true);
      expect(Math.abs(c.gamma! - GAMMA)).toBeLessThan(4 * c.gammaStdError!);
    });
  });
  it("scanWindows with no window large enough says so", () => {
    const s = scanWindows(dataset(10, 4), { minPoints: 50 });
    expect(s.cells).toEqual([]);
    expect(s.recommended).toBeNull();
    expect(s.reason).toMatch(/enough points/);
  });
});

describe("findPlateau", () => {
  it("findPlateau takes the largest adjacent agreeing set and excludes an outlier", () => {
    const cells = [
      { i: 0, j: 0, value: 1.0, sigma: 0.1 }, { i: 0, j: 1, value: 1.05, sigma: 0.1 }, { i: 0, j: 2, value: 0.98, sigma: 0.1 },
      { i: 1, j: 0, value: 1.02, sigma: 0.1 }, { i: 1, j: 1, value: 3, sigma: 0.1 }, { i: 5, j: 5, value: 1.0, sigma: 0.1 },
    ];
    const p = findPlateau(cells)!;
    expect(p.members.sort()).toEqual([0, 1, 2, 3]);
    expectClose(p.mean, (1 + 1.05 + 0.98 + 1.02) / 4, { rel: 1e-12 });
  });
});

describe("compareModels", () => {
  it("compareModels ranks by AICc with Akaike weights summing to 1 and prefers the generating model", () => {
    const noise = rng(9);
    const T = Array.from({ length: 60 }, (_, i) => 0.2 + (4.8 * i) / 59);
    const clean = T.map((t) => GAMMA * t + 3e-5 * t ** 3 + 4e-6 / t ** 2);
    const sigma = clean.map((c) => 0.002 * c);
    const d = { temperatureK: T, heatCapacity: clean.map((c, i) => c + sigma[i] * noise()), sigma };
    const rows = compareModels(d, ["sommerfeld", "nuclear", "sommerfeld-t5"]);
    expect(rows[0].model).toBe("nuclear");
    expect(rows[0].deltaAicc).toBe(0);
    expectClose(rows.reduce((s, r) => s + (r.akaikeWeight ?? 0), 0), 1, { rel: 1e-12 });
    expect(rows[0].akaikeWeight!).toBeGreaterThan(0.9);
    rows.slice(1).forEach((r) => expect(r.deltaAicc!).toBeGreaterThan(0));
  });
});
