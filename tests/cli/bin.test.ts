/**
 * The shipped command: `node lib/cli/heatbook.js` runs the JavaScript that scripts/build-cli.mjs
 * compiles into lib/cli/dist (postinstall builds it; this file rebuilds it first, so it tests the
 * sources as they are). Files for the spawned processes live under .data/ (inside the repository).
 */
import { describe, it, expect, beforeAll } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { join } from "node:path";
import { runCli } from "./cliHarness";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
const BIN = join(ROOT, "lib/cli/heatbook.js");
const DIST = join(ROOT, "lib/cli/dist");
const WORK = join(ROOT, ".data/test-cli-bin");

const heatbook = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8", cwd: WORK });

function files(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(join(dir, e.name)) : [join(dir, e.name)]));
}

beforeAll(() => {
  const built = spawnSync(process.execPath, [join(ROOT, "scripts/build-cli.mjs"), "--quiet"], { encoding: "utf8", cwd: ROOT });
  expect(built.status, built.stderr).toBe(0);
  mkdirSync(WORK, { recursive: true });
  const rows = Array.from({ length: 30 }, (_, i) => 1 + i * 0.2).map((t) => `${t},${1.35 * t + 0.0204 * t ** 3},${0.003 * (1.35 * t + 0.0204 * t ** 3)}`);
  writeFileSync(join(WORK, "metal.csv"), `# invented test data\nT (K),C (mJ/(mol K)),dC (mJ/(mol K))\n${rows.join("\n")}\n`);
}, 60_000);

describe("the compiled heatbook command", () => {
  it("heatbook --help answers from the compiled JavaScript, listing transition and entropy", () => {
    const r = heatbook("--help");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^usage: heatbook <command>/);
    expect(r.stdout).toMatch(/transition FILE/);
    expect(r.stdout).toMatch(/entropy FILE/);
  });

  it("the compiled CLI imports no TypeScript loader and no .ts file", () => {
    const js = files(DIST).filter((f) => f.endsWith(".js"));
    expect(js.length).toBeGreaterThan(3);
    for (const f of [BIN, ...js]) {
      const text = readFileSync(f, "utf8");
      expect(text, f).not.toMatch(/from\s*["']tsx|import\(\s*["']tsx|require\(\s*["']tsx/);
      expect(text, f).not.toMatch(/["'][^"']+\.ts["']/);
    }
  });

  it("heatbook fit through the bin prints the same JSON as the in-process command", async () => {
    const r = heatbook("fit", "metal.csv", "--json");
    expect(r.status, r.stderr).toBe(0);
    const inProcess = await runCli(["fit", "metal.csv", "--json"], { "metal.csv": readFileSync(join(WORK, "metal.csv"), "utf8") });
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(inProcess.out));
  });

  it("heatbook entropy and transition run through the bin, and bad input exits 2 on stderr", () => {
    const e = heatbook("entropy", "metal.csv", "--fit-t-max", "3", "--json");
    expect(e.status, e.stderr).toBe(0);
    expect(JSON.parse(e.stdout).quantities.length).toBeGreaterThan(4);
    const t = heatbook("transition", "metal.csv", "--gamma-n", "2", "--beta", "0.0204");
    expect(t.status).toBe(2);
    expect(t.stderr).toMatch(/heatbook transition: .*no superconducting transition/);
    const m = heatbook("model", "debye", "--set", "thetaD=-5", "--T", "10");
    expect(m.status).toBe(2);
    expect(m.stdout).toBe("");
    expect(m.stderr).toMatch(/thetaD=-5/);
    expect(heatbook("nope").status).toBe(2);
  });
});
