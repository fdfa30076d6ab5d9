import { describe, it, expect } from "vitest";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../../lib/engine/constants";

const lowT = (T: number, thetaD: number, r = 1) => ((12 * Math.PI ** 4) / 5) * r * R * (T / thetaD) ** 3;

describe("heatbook model", () => {
  it("heatbook model debye --set thetaD=300 --T 5,10,20 --json gives J/(mol K) per f.u. (T³ limit at Θ_D/60, analytic)", async () => {
    const r = await runCli(["model", "debye", "--set", "thetaD=300", "--T", "5,10,20", "--json"]);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.unit).toBe("J/(mol*K)");
    expect(j.values).toHaveLength(3);
    expectClose(j.values[0], lowT(5, 300), { rel: 1e-9 });
    expect(j.values[2]).toBeLessThan(lowT(20, 300));
  });
  it("heatbook model takes γ in mJ/(mol K²) and r from --set", async () => {
    const j = JSON.parse((await runCli(["model", "debye", "--set", "thetaD=300,gamma=2,r=3", "--T", "1", "--json"])).out);
    expectClose(j.values[0], 2e-3 + lowT(1, 300, 3), { rel: 1e-12 });
  });
  it("heatbook model exits 2 for an unknown model, an unknown parameter or a missing required one", async () => {
    expect((await runCli(["model", "nope", "--T", "1"])).err).toMatch(/known: sommerfeld/);
    expect((await runCli(["model", "debye", "--set", "theta=1", "--T", "1"])).code).toBe(2);
    const missing = await runCli(["model", "debye", "--T", "1"]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/needs thetaD/);
  });
  it("the real bin `node lib/cli/heatbook.js model debye ... --json` prints the same JSON", () => {
    const bin = fileURLToPath(new URL("../../lib/cli/heatbook.js", import.meta.url));
    const p = spawnSync(process.execPath, [bin, "model", "debye", "--set", "thetaD=300", "--T", "5,10,20", "--json"], { encoding: "utf8" });
    expect(p.status, p.stderr).toBe(0);
    const j = JSON.parse(p.stdout);
    expectClose(j.values[0], lowT(5, 300), { rel: 1e-9 });
  });
  it("heatbook model debye --set thetaD=-5 exits 2 naming Θ_D and its bounds, printing no values", async () => {
    const r = await runCli(["model", "debye", "--set", "thetaD=-5", "--T", "10", "--json"]);
    expect(r.code).toBe(2);
    expect(r.out).toBe("");
    expect(r.err).toMatch(/--set thetaD=-5: Debye temperature Θ_D must lie in \[0\.001, 100000\] K for model debye/);
  });
  it("heatbook model exits 2 for any out-of-bounds parameter: Θ_D = 0, n_E < 0, a gap of 0, α outside [0.1, 10]", async () => {
    for (const [model, set, name] of [["debye", "thetaD=0", "thetaD"], ["einstein", "thetaE=100,nE=-1", "nE"], ["schottky", "n=1,gap=0", "gap"], ["alpha-model", "gammaN=5,tc=4,alpha=20", "alpha"]]) {
      const r = await runCli(["model", model, "--set", set, "--T", "1"]);
      expect(r.code, `${model} ${set}`).toBe(2);
      expect(r.err).toContain(`--set ${name}=`);
    }
  });
  it("heatbook fit --model debye --fix/--start outside the bounds exits 2 naming the parameter", async () => {
    const file = "T (K),C (mJ/(mol K))\n" + Array.from({ length: 20 }, (_, i) => `${1 + i},${1.3 * (1 + i) + 0.02 * (1 + i) ** 3}`).join("\n");
    const fix = await runCli(["fit", "a.csv", "--model", "debye", "--fix", "thetaD=-5"], { "a.csv": file });
    expect(fix.code).toBe(2);
    expect(fix.err).toMatch(/--fix thetaD=-5: Debye temperature/);
    const start = await runCli(["fit", "a.csv", "--model", "debye", "--start", "thetaD=1e9"], { "a.csv": file });
    expect(start.code).toBe(2);
    expect(start.err).toMatch(/--start thetaD=1000000000: Debye temperature/);
  });
});
