/**
 * A fresh clone passes its own tests with nothing beside it: no test, script, benchmark or app
 * file names a path that climbs out of the repository, and the runtime guard
 * (tests/helpers/repoBoundary.ts, a vitest setup file) refuses reads outside it.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { insideAllowed, takeRefusedReads } from "../helpers/repoBoundary";

const ROOT = resolve(fileURLToPath(new URL("../../", import.meta.url)));
const SCANNED = ["tests", "e2e", "scripts", "bench", "lib", "app", ".ci"];
const SKIP = new Set(["node_modules", "generated", "fixtures", "__snapshots__"]);

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    if (SKIP.has(name)) return [];
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return sourceFiles(full);
    return /\.(ts|tsx|js|mjs|cjs|json|sh)$|^run$/.test(name) ? [full] : [];
  });
}

/** Relative path literals ("../x", '../../x') in a file whose target lies outside the repository. */
function escapingPaths(file: string): string[] {
  const text = readFileSync(file, "utf8");
  const found: string[] = [];
  for (const m of text.matchAll(/["'`]((?:\.\.\/)+[^"'`\s]*)["'`]/g)) {
    const target = resolve(dirname(file), m[1]!);
    if (target !== ROOT && !target.startsWith(ROOT + sep)) found.push(`${relative(ROOT, file)}: ${m[1]}`);
  }
  if (/shared\/reference/.test(text)) found.push(`${relative(ROOT, file)}: names shared/reference`);
  return found;
}

describe("the repository is self-contained", () => {
  it("no source file names a relative path that leaves the repository, nor the shared reference folder", () => {
    const files = SCANNED.flatMap((d) => { try { return sourceFiles(join(ROOT, d)); } catch { return []; } });
    expect(files.length).toBeGreaterThan(100);
    const offenders = files.filter((f) => !f.endsWith(`repo${sep}selfContained.test.ts`)).flatMap(escapingPaths);
    expect(offenders).toEqual([]);
  });

  it("the NIST StRD fixtures the tests load are inside the repository, with their README", () => {
    const dir = join(ROOT, "tests", "fixtures", "nist-strd");
    const names = readdirSync(dir);
    expect(names).toContain("README.md");
    expect(names.filter((n) => n.endsWith(".json")).length).toBeGreaterThanOrEqual(30);
    expect(names.filter((n) => n.endsWith(".dat")).length).toBe(names.filter((n) => n.endsWith(".json")).length);
  });

  it("the runtime guard refuses a read outside the repository and allows one inside", () => {
    const outside = resolve(ROOT, "..", "shared", "reference", "nist-strd", "Norris.json");
    expect(() => readFileSync(outside, "utf8")).toThrow(/outside the repository/);
    expect(takeRefusedReads()).toHaveLength(1);
    expect(insideAllowed(join(ROOT, "package.json"))).toBe(true);
    expect(insideAllowed(resolve(ROOT, ".."))).toBe(false);
    expect(readFileSync(join(ROOT, "package.json"), "utf8")).toContain('"heatbook"');
  });
});
