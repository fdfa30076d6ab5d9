/**
 * `heatbook fit A.csv B.csv … --field …`: joint fits from the command line on data invented for
 * these tests (Zeeman-split Schottky term over γT + βT³, σ = 1 % of C, seeded noise).
 */
import { describe, expect, it } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { JOINT_MODELS } from "../../lib/engine/fit";
import { seededNormal } from "../engine/uncertainty.random";

const TRUTH = { gamma: 4e-3, beta: 2.5e-4, n: 8e-3, g: 2 };

/** An invented file at field H (C in mJ/(mol K)), optionally per-file g and without σ. */
function csv(H: number, seed: number, opts: { g?: number; sigma?: boolean } = {}): string {
  const z = seededNormal(seed);
  const rows = ["# invented test data", opts.sigma === false ? "T (K),C (mJ/(mol K))" : "T (K),C (mJ/(mol K)),dC (mJ/(mol K))"];
  for (let i = 0; i < 60; i++) {
    const t = 0.4 * 30 ** (i / 59);
    const c = JOINT_MODELS["zeeman-schottky"].evaluate(t, H, { ...TRUTH, g: opts.g ?? TRUTH.g }) * 1e3;
    rows.push(opts.sigma === false ? `${t},${c + 0.01 * c * z()}` : `${t},${c + 0.01 * c * z()},${0.01 * c}`);
  }
  return rows.join("\n") + "\n";
}
const FILES = { "a.csv": csv(1, 1), "b.csv": csv(2, 2), "c.csv": csv(4, 3) };
const ARGS = ["fit", "a.csv", "b.csv", "c.csv", "--field", "1,2,4", "--model", "zeeman-schottky"];

describe("heatbook fit with several files", () => {
  it("heatbook fit A B C --field --model zeeman-schottky --json lists shared parameters by name in SI and files with χ²", async () => {
    const r = await runCli([...ARGS, "--json"], FILES);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j.parameters)).toEqual(["gamma", "beta", "n", "g"]);
    expect(j.shared).toEqual(["gamma", "beta", "n", "g"]);
    for (const [k, v] of Object.entries(TRUTH)) expect(Math.abs(j.parameters[k].value - v)).toBeLessThan(3 * j.parameters[k].stdError);
    expect(j.parameters.gamma.unit).toBe("J/(mol*K^2)");
    expect(j.files.map((f: { file: string; fieldT: number; nPoints: number }) => [f.file, f.fieldT, f.nPoints])).toEqual([["a.csv", 1, 60], ["b.csv", 2, 60], ["c.csv", 4, 60]]);
    expectClose(j.files.reduce((a: number, f: { chiSquare: number }) => a + f.chiSquare, 0), j.chiSquare, { rel: 1e-9 });
    expect(j.nPoints).toBe(180);
    expect(j.dof).toBe(176);
    expect(j.aicc).not.toBeNull();
  });

  it("heatbook fit --shared gamma,beta gives per-file keys n#k and g#k, k the file's position", async () => {
    const r = await runCli([...ARGS, "--shared", "gamma,beta", "--json"], FILES);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j.parameters)).toEqual(["gamma", "beta", "n#1", "n#2", "n#3", "g#1", "g#2", "g#3"]);
    expect(j.perMeasurement).toEqual(["n", "g"]);
    for (const k of ["g#1", "g#2", "g#3"]) expect(Math.abs(j.parameters[k].value - 2)).toBeLessThan(3 * j.parameters[k].stdError);
  });

  it("heatbook fit text output tables shared parameters in display units as value(σ), then each file", async () => {
    const r = await runCli([...ARGS, "--shared", "gamma,beta,n"], FILES);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/shared parameters\n  γ \(mJ mol⁻¹ K⁻²\)\s+4\.\d+\(\d+\)\n  β \(mJ mol⁻¹ K⁻⁴\)\s+0\.2\d+\(\d+\)\n  n\s+0\.00\d+\(\d+\)/);
    expect(r.out).toMatch(/per file\n  file\s+H \(T\)\s+points\s+window\s+χ²\s+g\n  a\.csv\s+1\s+60\s+0\.4–12 K/);
    expect(r.out).toMatch(/χ² = [\d.]+, dof = 174, χ²_red = [\d.]+, AICc = /);
    expect(r.out).not.toMatch(/e-\d|#\d/);
  });

  it("heatbook fit --t-min takes one value per file and --fix takes name#k in display units", async () => {
    const r = await runCli([...ARGS, "--shared", "gamma,beta,n", "--t-min", "0.5,0.6,0.7", "--fix", "g#1=2", "--json"], FILES);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.parameters["g#1"]).toMatchObject({ value: 2, fixed: true, stdError: null });
    expect(j.files.map((f: { nPoints: number }) => f.nPoints)).toEqual([56, 52, 50]);
  });

  it("heatbook fit takes an expression in T and H with the constants and shares what --shared names", async () => {
    const expr = "gamma*T + beta*T^3 + n*R*(g*muB*H/(kB*T))^2*exp(-g*muB*H/(kB*T))/(1+exp(-g*muB*H/(kB*T)))^2";
    const r = await runCli(["fit", "a.csv", "b.csv", "c.csv", "--field", "1,2,4", "--model", expr, "--shared", "gamma,beta,n,g", "--start", "g=1.5", "--json"], FILES);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expectClose(j.parameters.g.value, 2, { rel: 5e-3 });
  });

  it("heatbook fit with one file and --field runs the joint fit (keys name#1 for per-file parameters)", async () => {
    const r = await runCli(["fit", "a.csv", "--field", "1", "--model", "zeeman-schottky", "--shared", "gamma,beta", "--json"], FILES);
    expect(r.code, r.err).toBe(0);
    expect(Object.keys(JSON.parse(r.out).parameters)).toEqual(["gamma", "beta", "n#1", "g#1"]);
  });

  it("heatbook fit with one file and no --field keeps the single-curve output", async () => {
    const r = await runCli(["fit", "a.csv", "--json", "--t-min", "2"], FILES);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.file).toBe("a.csv");
    expect(j.parameters.map((p: { name: string }) => p.name)).toEqual(["gamma", "beta"]);
    expect(j.window.tMinK).toBe(2);
  });
});

describe("heatbook fit with several files: bad usage", () => {
  const cases: [string, string[], Record<string, string>, RegExp][] = [
    ["no --field", ["fit", "a.csv", "b.csv", "--model", "zeeman-schottky"], FILES, /--field is required/],
    ["a --field count that differs from the files", ["fit", "a.csv", "b.csv", "--field", "1,2,4", "--model", "zeeman-schottky"], FILES, /--field has 3 values for 2 files/],
    ["no --model", ["fit", "a.csv", "b.csv", "--field", "1,2"], FILES, /--model is required/],
    ["a --shared name that is not a parameter", [...ARGS, "--shared", "gamma,theta"], FILES, /invalid shared: "theta" is not a parameter.*field shared/],
    ["a --t-min list of the wrong length", [...ARGS, "--t-min", "0.5,0.6"], FILES, /--t-min has 2 values for 3 files/],
    ["σ in some files only", ["fit", "a.csv", "b.csv", "--field", "1,2", "--model", "zeeman-schottky"], { "a.csv": csv(1, 1), "b.csv": csv(2, 2, { sigma: false }) }, /σ missing for b\.csv while a\.csv has σ.*\(b\.csv, field sigma\)/],
    ["a --fix key for a file that does not exist", [...ARGS, "--shared", "gamma,beta", "--fix", "g#4=2"], FILES, /measurement 4 does not exist/],
    ["--shared with one file and no --field", ["fit", "a.csv", "--shared", "gamma"], FILES, /--shared applies to a joint fit/],
    ["a joint model with one file and no --field", ["fit", "a.csv", "--model", "zeeman-schottky"], FILES, /needs the field: give --field/],
    ["--scan with several files", [...ARGS, "--scan"], FILES, /--scan works on one file/],
  ];
  for (const [label, argv, files, message] of cases) {
    it(`heatbook fit refuses ${label} with exit 2`, async () => {
      const r = await runCli(argv, files);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(message);
    });
  }

  it("heatbook fit exits 1 when the joint fit cannot separate its parameters (A₀ shared, a per file)", async () => {
    const r = await runCli([...ARGS.slice(0, -1), "nuclear-field-a0", "--shared", "gamma,beta,A0"], FILES);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/joint fit failed/);
  });

  it("heatbook fit --help describes several files, --field and --shared", async () => {
    const r = await runCli(["fit", "--help"]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/FILE1 FILE2 … --field/);
    expect(r.out).toMatch(/--field T,…/);
    expect(r.out).toMatch(/--shared p,q,…/);
  });
});
