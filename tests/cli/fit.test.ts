import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";

// Invented demo-style data: γ = 1.35 mJ mol⁻¹ K⁻², β = 0.0204 mJ mol⁻¹ K⁻⁴, small seeded-free ripple.
function csv(unit: "J" | "mJ", reorder = false): string {
  const rows: string[] = [];
  for (let i = 0; i < 30; i++) {
    const t = 1 + i * 0.2;
    const cmJ = (1.35 * t + 0.0204 * t ** 3) * (1 + 0.002 * Math.sin(i * 2.7));
    const f = unit === "J" ? 1e-3 : 1;
    rows.push(`${t},${cmJ * f},${0.002 * cmJ * f}`);
  }
  if (reorder) rows.reverse();
  return `# invented test data\nT (K),C (${unit}/(mol K)),dC (${unit}/(mol K))\n${rows.join("\n")}\n`;
}

describe("heatbook fit", () => {
  it("heatbook fit FILE --json prints parameters in mJ units and statistics", async () => {
    const r = await runCli(["fit", "a.csv", "--json"], { "a.csv": csv("mJ") });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    const gamma = j.parameters.find((p: { name: string }) => p.name === "gamma");
    expect(gamma.unit).toBe("mJ/(mol*K^2)");
    expectClose(gamma.value, 1.35, { rel: 1e-2 });
    expect(j.parameters.find((p: { name: string }) => p.name === "beta").unit).toBe("mJ/(mol*K^4)");
    expect(j.statistics.weighted).toBe(true);
    expect(j.statistics.dof).toBe(28);
    expect(j.columns).toMatchObject({ T: "T", C: "C", sigma: "dC" });
  });
  it("heatbook fit gives the same result for J and mJ files and for reordered rows", async () => {
    const a = JSON.parse((await runCli(["fit", "a.csv", "--json"], { "a.csv": csv("mJ") })).out);
    const b = JSON.parse((await runCli(["fit", "b.csv", "--json"], { "b.csv": csv("J", true) })).out);
    const c = JSON.parse((await runCli(["fit", "c.csv", "--json", "--c-unit", "J/(mol*K)"], { "c.csv": csv("J") })).out);
    for (const other of [b, c]) {
      a.parameters.forEach((p: { value: number; stdError: number }, k: number) => {
        expectClose(other.parameters[k].value, p.value, { rel: 1e-12 });
        expectClose(other.parameters[k].stdError, p.stdError, { rel: 1e-10 });
      });
      expectClose(other.statistics.reducedChiSquare, a.statistics.reducedChiSquare, { rel: 1e-10 });
    }
  });
  it("heatbook fit --t-min/--t-max are inclusive and --model takes an expression", async () => {
    const r = await runCli(["fit", "a.csv", "--json", "--t-min", "2", "--t-max", "5", "--model", "g*T + b*T^3"], { "a.csv": csv("mJ") });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.window.nPoints).toBe(16);
    expect(j.parameters.map((p: { name: string }) => p.name)).toEqual(["g", "b"]);
  });
  it("heatbook fit --fix takes display units (β in mJ/(mol K⁴)) and holds the parameter", async () => {
    const r = await runCli(["fit", "a.csv", "--json", "--fix", "beta=0.0204"], { "a.csv": csv("mJ") });
    expect(r.code, r.err).toBe(0);
    const beta = JSON.parse(r.out).parameters.find((p: { name: string }) => p.name === "beta");
    expect(beta.fixed).toBe(true);
    expectClose(beta.value, 0.0204, { rel: 1e-12 });
  });
  it("heatbook fit --scan reports the window scan and fits the recommended window", async () => {
    const r = await runCli(["fit", "a.csv", "--scan", "--json"], { "a.csv": csv("mJ") });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.scan.cells.length).toBeGreaterThan(0);
    expect(j.window.tMinK).toBe(j.scan.recommended.tMinK);
  });
  it("heatbook fit exits 2 naming the problem for a missing file, a bad column, a bad unit and a non-molar unit", async () => {
    expect((await runCli(["fit", "none.csv"])).err).toMatch(/cannot read none.csv/);
    const bad = await runCli(["fit", "a.csv", "--c-col", "nope"], { "a.csv": csv("mJ") });
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/no such column.*T, C, dC/);
    expect((await runCli(["fit", "a.csv", "--c-unit", "furlong"], { "a.csv": csv("mJ") })).code).toBe(2);
    const perK = await runCli(["fit", "a.csv", "--c-unit", "J/K"], { "a.csv": csv("mJ") });
    expect(perK.code).toBe(2);
    expect(perK.err).toMatch(/not per mole/);
    const line = await runCli(["fit", "a.csv"], { "a.csv": "T (K),C (J/(mol K))\n1,0.001\n2,abc\n" });
    expect(line.code).toBe(2);
    expect(line.err).toMatch(/line 3/);
    expect((await runCli(["fit", "a.csv", "--t-min", "x"], { "a.csv": csv("mJ") })).code).toBe(2);
  });
  it("heatbook fit exits 1 with the reason when the fit fails", async () => {
    const r = await runCli(["fit", "a.csv"], { "a.csv": "T (K),C (J/(mol K))\n3,0.004\n3,0.0041\n3,0.0039\n" });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/the fit failed: .*rank deficient/);
  });
});
