import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "../engine/uncertainty.random";

// Invented data: γ = 1.35 mJ mol⁻¹ K⁻², β = 0.0204 mJ mol⁻¹ K⁻⁴, seeded noise; columns as named.
function rows(seed: number, n = 40): { T: number; C: number }[] {
  const z = seededNormal(seed);
  return Array.from({ length: n }, (_, i) => {
    const T = 1 + i * 0.15;
    return { T, C: (1.35 * T + 0.0204 * T ** 3) * (1 + 0.004 * z()) };
  });
}
const csv = (head: string, lines: string[]) => `# invented test data\n${head}\n${lines.join("\n")}\n`;
const withSigma = (seed: number) => csv("T (K),C (mJ/(mol K)),sigma (mJ/(mol K))", rows(seed).map((r, i) => `${r.T},${r.C},${0.002 + 0.001 * (i % 3)}`));

interface P { name: string; value: number; stdError: number }
const param = (j: { parameters: P[] }, name: string) => j.parameters.find((p) => p.name === name) as P;
const fit = async (argv: string[], files: Record<string, string>) => {
  const r = await runCli(["fit", ...argv, "--json"], files);
  expect(r.code, r.err).toBe(0);
  return JSON.parse(r.out);
};

describe("heatbook fit columns and weights", () => {
  it("heatbook fit --c-col 2 does not pick up the column headed sigma, and says it is unused", async () => {
    const j = await fit(["a.csv", "--c-col", "2"], { "a.csv": withSigma(1) });
    expect(j.statistics.weighted).toBe(false);
    expect(j.columns.sigma).toBeNull();
    expect(j.weighting).toMatchObject({ kind: "none", text: "unweighted (no σ column)" });
    expect(j.notes.join(" ")).toMatch(/column "sigma" looks like σ of C but is not used/);
    const text = await runCli(["fit", "a.csv", "--c-col", "2"], { "a.csv": withSigma(1) });
    expect(text.out).toMatch(/note: column "sigma" looks like σ/);
  });

  it("heatbook fit without --c-col uses the recognised σ column; --c-col with --sigma-col gives the same fit", async () => {
    const auto = await fit(["a.csv"], { "a.csv": withSigma(2) });
    const named = await fit(["a.csv", "--c-col", "C", "--sigma-col", "3"], { "a.csv": withSigma(2) });
    expect(auto.weighting.text).toBe('weighted by σ from column "sigma"');
    expect(named.statistics.weighted).toBe(true);
    expectClose(param(named, "gamma").value, param(auto, "gamma").value, { rel: 1e-14 });
  });

  it("heatbook fit --sigma-col none and --unweighted give the same unweighted fit with a residual s.d. instead of χ²_red", async () => {
    const a = await fit(["a.csv", "--sigma-col", "none"], { "a.csv": withSigma(3) });
    const b = await fit(["a.csv", "--unweighted"], { "a.csv": withSigma(3) });
    const plain = await fit(["p.csv"], { "p.csv": csv("T (K),C (mJ/(mol K))", rows(3).map((r) => `${r.T},${r.C}`)) });
    for (const j of [a, b]) {
      expect(j.statistics.weighted).toBe(false);
      expectClose(param(j, "gamma").value, param(plain, "gamma").value, { rel: 1e-13 });
      expectClose(param(j, "gamma").stdError, param(plain, "gamma").stdError, { rel: 1e-10 });
    }
    expect(a.weighting.text).toBe("unweighted (--sigma-col none)");
    expect(b.weighting.text).toBe("unweighted (--unweighted)");
    expect(b.statistics.residualStdDev.unit).toBe("mJ/(mol*K)");
    expectClose(b.statistics.residualStdDev.value, Math.sqrt(b.statistics.chiSquare / b.statistics.dof) * 1e3, { rel: 1e-12 });
    const text = await runCli(["fit", "a.csv", "--unweighted"], { "a.csv": withSigma(3) });
    expect(text.out).toMatch(/residual s\.d\. = [\d.]+ mJ\/\(mol K\) \(unweighted: no χ²_red\)/);
    expect(text.out).not.toMatch(/χ²_red =/);
  });

  it("heatbook fit --relative-sigma 0.4 equals a fit with a σ column of 0.4 % of C", async () => {
    const data = rows(4);
    const rel = await fit(["p.csv", "--relative-sigma", "0.4"], { "p.csv": csv("T (K),C (mJ/(mol K))", data.map((r) => `${r.T},${r.C}`)) });
    const col = await fit(["s.csv"], { "s.csv": csv("T (K),C (mJ/(mol K)),dC (mJ/(mol K))", data.map((r) => `${r.T},${r.C},${(Math.abs(r.C) * 0.4) / 100}`)) });
    expect(rel.weighting).toMatchObject({ kind: "relative", percent: 0.4 });
    expectClose(param(rel, "gamma").value, param(col, "gamma").value, { rel: 1e-12 });
    expectClose(param(rel, "beta").stdError, param(col, "beta").stdError, { rel: 1e-10 });
    expectClose(rel.statistics.reducedChiSquare, col.statistics.reducedChiSquare, { rel: 1e-10 });
  });

  it("heatbook fit --sigma takes an absolute σ in C's unit or its own, and refuses another basis", async () => {
    const data = rows(5);
    const files = { "p.csv": csv("T (K),C (mJ/(mol K))", data.map((r) => `${r.T},${r.C}`)), "s.csv": csv("T (K),C (mJ/(mol K)),dC (mJ/(mol K))", data.map((r) => `${r.T},${r.C},0.02`)) };
    const col = await fit(["s.csv"], files);
    const bare = await fit(["p.csv", "--sigma", "0.02"], files);
    const joule = await fit(["p.csv", "--sigma", "2e-5 J/(mol*K)"], files);
    for (const j of [bare, joule]) {
      expectClose(param(j, "gamma").stdError, param(col, "gamma").stdError, { rel: 1e-10 });
      expectClose(j.statistics.reducedChiSquare, col.statistics.reducedChiSquare, { rel: 1e-10 });
    }
    expect(joule.weighting.text).toBe("weighted by σ = 0.00002 J/(mol*K) for every point (--sigma)".replace("0.00002", String(2e-5)));
    const basis = await runCli(["fit", "p.csv", "--sigma", "0.02 J/(g*K)"], files);
    expect(basis.code).toBe(2);
    expect(basis.err).toMatch(/--sigma in "J\/\(g\*K\)" is not on the basis of C/);
    for (const bad of ["-1", "0", "abc", "1 furlong"]) expect((await runCli(["fit", "p.csv", "--sigma", bad], files)).code, bad).toBe(2);
  });

  it("heatbook fit refuses two weightings at once, a bad percentage and a relative σ where C = 0 (naming the line)", async () => {
    const files = { "a.csv": withSigma(6), "z.csv": csv("T (K),C (mJ/(mol K))", ["1,1.4", "2,0", "3,4.6", "4,6.8"]) };
    const two = await runCli(["fit", "a.csv", "--unweighted", "--relative-sigma", "1"], files);
    expect(two.code).toBe(2);
    expect(two.err).toMatch(/choose one weighting: --unweighted and --relative-sigma/);
    expect((await runCli(["fit", "a.csv", "--sigma-col", "3", "--sigma", "0.1"], files)).code).toBe(2);
    expect((await runCli(["fit", "a.csv", "--relative-sigma", "0"], files)).err).toMatch(/invalid --relative-sigma: 0/);
    expect((await runCli(["fit", "a.csv", "--relative-sigma", "150"], files)).code).toBe(2);
    const zero = await runCli(["fit", "z.csv", "--relative-sigma", "1"], files);
    expect(zero.code).toBe(2);
    expect(zero.err).toMatch(/C = 0.*z\.csv, line 4/);
  });

  it("heatbook fit exits 2 for a column number past the end and for a σ column that is the C column", async () => {
    const files = { "a.csv": withSigma(7) };
    const past = await runCli(["fit", "a.csv", "--c-col", "5"], files);
    expect(past.code).toBe(2);
    expect(past.err).toMatch(/--c-col "5": no such column \(the file has 3 columns\)/);
    const same = await runCli(["fit", "a.csv", "--sigma-col", "2"], files);
    expect(same.code).toBe(2);
    expect(same.err).toMatch(/--sigma-col "2" is the C column/);
  });
});

describe("heatbook fit per-gram data", () => {
  // Nb: M = 92.906 g/mol, Cu: 63.546 g/mol (IUPAC 2021 abridged standard atomic weights, as in lib/engine/chemistry).
  const perGram = (M: number) => csv("T (K),C (J/(g K)),dC (J/(g K))", rows(8).map((r) => `${r.T},${(r.C * 1e-3) / M},${0.003e-3 / M}`));
  const molar = csv("T (K),C (mJ/(mol K)),dC (mJ/(mol K))", rows(8).map((r) => `${r.T},${r.C},0.003`));

  it("heatbook fit --c-unit J/(g*K) with --formula or --molar-mass gives the molar γ and β", async () => {
    const m = await fit(["m.csv"], { "m.csv": molar });
    const f = await fit(["g.csv", "--formula", "Nb"], { "g.csv": perGram(92.906) });
    const mm = await fit(["g.csv", "--c-unit", "J/(g*K)", "--molar-mass", "92.906"], { "g.csv": perGram(92.906) });
    for (const j of [f, mm]) {
      expectClose(param(j, "gamma").value, param(m, "gamma").value, { rel: 1e-6 });
      expectClose(param(j, "beta").stdError, param(m, "beta").stdError, { rel: 1e-6 });
    }
    expect(f.basis).toMatchObject({ given: "specific", formula: "Nb" });
    expectClose(f.basis.molarMassGPerMol, 92.906, { rel: 1e-6 });
  });

  it("heatbook fit --formula sets r for Θ_D unless --r is given", async () => {
    const two = await fit(["m.csv", "--formula", "NbTi"], { "m.csv": molar });
    expect(two.derived.r).toBe(2);
    expect((await fit(["m.csv", "--formula", "NbTi", "--r", "1"], { "m.csv": molar })).derived.r).toBe(1);
  });

  it("heatbook fit exits 2 for per-gram data without a molar mass, --molar-mass on molar data, both flags, a bad formula, per-sample data", async () => {
    const g = { "g.csv": perGram(63.546), "m.csv": molar };
    const missing = await runCli(["fit", "g.csv"], g);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/is per mass: give --formula F or --molar-mass/);
    expect((await runCli(["fit", "m.csv", "--molar-mass", "63.5"], g)).err).toMatch(/--molar-mass applies to per-gram data only/);
    expect((await runCli(["fit", "g.csv", "--molar-mass", "63.5", "--formula", "Cu"], g)).err).toMatch(/either --formula or --molar-mass/);
    expect((await runCli(["fit", "g.csv", "--formula", "Xq2"], g)).err).toMatch(/invalid --formula "Xq2"/);
    expect((await runCli(["fit", "g.csv", "--molar-mass", "-3"], g)).code).toBe(2);
    const sample = await runCli(["fit", "m.csv", "--c-unit", "mJ/K"], g);
    expect(sample.code).toBe(2);
    expect(sample.err).toMatch(/per sample \(J\/K\)/);
  });
});
