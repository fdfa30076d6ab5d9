import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { makeData, type Truth } from "../engine/recommend.data";

// Invented data (tests/engine/recommend.data.ts), written as a CSV in mJ/(mol K).
function csv(truth: Truth, seed: number, withSigma = true): string {
  const d = makeData(truth, seed, withSigma);
  const rows = d.temperatureK.map((t, i) => [t, d.heatCapacity[i] * 1e3, ...(withSigma ? [d.sigma![i] * 1e3] : [])].join(","));
  return `# invented test data\nT (K),C (mJ/(mol K))${withSigma ? ",dC (mJ/(mol K))" : ""}\n${rows.join("\n")}\n`;
}

const SCHOTTKY: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "schottky", n: 2e-4, gapK: 1.5 }, tLoK: 0.5, tHiK: 15, points: 300, relSigma: 0.005 };

describe("heatbook fit --scan (model and window recommendation)", () => {
  it("heatbook fit --scan --json gives scan.recommended with model, γ and β with statistical and systematic σ in mJ units, and fits that model and window", async () => {
    const r = await runCli(["fit", "a.csv", "--scan", "--json"], { "a.csv": csv(SCHOTTKY, 4) });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    const rec = j.scan.recommended;
    expect(rec.recommended).toBe(true);
    expect(rec.model).toBe("schottky");
    for (const k of ["gamma", "gammaStdError", "gammaSystematicError", "beta", "betaStdError", "betaSystematicError", "tMinK", "tMaxK", "reason"]) expect(rec[k], k).not.toBeNull();
    expect(j.scan.units.gamma).toBe("mJ/(mol*K^2)");
    const total = Math.hypot(rec.gammaStdError, rec.gammaSystematicError);
    expect(Math.abs(rec.gamma - 3)).toBeLessThanOrEqual(3 * total);
    expect(rec.reason).toMatch(/\(stat\)\(syst\)/);
    expect(j.model).toBe("schottky");
    expect([j.window.tMinK, j.window.tMaxK]).toEqual([rec.tMinK, rec.tMaxK]);
    const gamma = j.parameters.find((p: { name: string }) => p.name === "gamma");
    expectClose(gamma.value, rec.gamma, { rel: 1e-6 });
    expectClose(gamma.stdError, rec.gammaStdError, { rel: 1e-3 });
    expect(j.scan.candidates.map((c: { model: string }) => c.model)).toEqual(["sommerfeld", "sommerfeld-t5", "nuclear", "schottky"]);
  });
  it("heatbook fit --scan on a file without σ reports the residual standard deviation and no χ²_red", async () => {
    const r = await runCli(["fit", "a.csv", "--scan", "--json"], { "a.csv": csv(SCHOTTKY, 5, false) });
    expect(r.code, r.err).toBe(0);
    const rec = JSON.parse(r.out).scan.recommended;
    expect(rec.reducedChiSquare).toBeNull();
    expect(rec.residualStdDev).toBeGreaterThan(0);
    expect(rec.method).toMatch(/unweighted/);
  });
  it("heatbook fit --scan with an Einstein bump exits 1, marks the result not recommended and names the missing term", async () => {
    const bump: Truth = { gamma: 3e-3, thetaDK: 300, extra: { kind: "einstein", nE: 0.02, thetaEK: 40 }, tLoK: 4, tHiK: 20, points: 300, relSigma: 0.005 };
    const r = await runCli(["fit", "a.csv", "--scan", "--json"], { "a.csv": csv(bump, 1) });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/no recommendation: Not recommended/);
    const rec = JSON.parse(r.out).scan.recommended;
    expect(rec.recommended).toBe(false);
    expect(rec.gamma).toBeNull();
    expect(rec.missingTerm).toMatch(/Einstein/);
  });
  it("heatbook fit --scan prints the recommendation in words", async () => {
    const r = await runCli(["fit", "a.csv", "--scan"], { "a.csv": csv(SCHOTTKY, 6) });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/^model × window scan: \d+ fits of 4 candidate models/);
    expect(r.out).toMatch(/recommendation: γT \+ βT³ \+ two-level Schottky/);
  });
});
