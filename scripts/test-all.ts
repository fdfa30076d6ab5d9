/**
 * `npm test`: everything CI checks, in order — type check, vitest (unit + integration on a real
 * PostgreSQL), next build, the fault tests against real `next start` servers (tests/ops), Playwright
 * in Debian's Chromium — then one closing line
 * "N passed, N failed" summing both runners. Exits non-zero if anything failed.
 * `npm test -- --quick` skips the build and the browser tests.
 */
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, mkdirSync, rmSync } from "node:fs";

process.env.NEXT_TELEMETRY_DISABLED = "1";
const quick = process.argv.includes("--quick");
mkdirSync(".data", { recursive: true });

function run(label: string, cmd: string, args: string[], env: Record<string, string> = {}): boolean {
  console.log(`\n=== ${label} ===`);
  const t0 = Date.now();
  const r = spawnSync(cmd, args, { stdio: "inherit", env: { ...process.env, ...env } });
  console.log(`=== ${label}: ${r.status === 0 ? "ok" : "FAILED"} in ${((Date.now() - t0) / 1000).toFixed(1)} s ===`);
  return r.status === 0;
}

interface Counts { passed: number; failed: number }

function vitestCounts(file: string): Counts {
  if (!existsSync(file)) return { passed: 0, failed: 1 };
  const r = JSON.parse(readFileSync(file, "utf8")) as { numPassedTests: number; numFailedTests: number; numTotalTestSuites?: number; testResults?: { status: string; assertionResults: unknown[] }[] };
  // A test file that fails to load has no assertions but a failed status: count it as one failure.
  const brokenFiles = (r.testResults ?? []).filter((f) => f.status === "failed" && f.assertionResults.length === 0).length;
  return { passed: r.numPassedTests, failed: r.numFailedTests + brokenFiles };
}

function playwrightCounts(file: string): Counts {
  if (!existsSync(file)) return { passed: 0, failed: 1 };
  const r = JSON.parse(readFileSync(file, "utf8")) as { stats: { expected: number; unexpected: number; flaky: number }; errors?: unknown[] };
  return { passed: r.stats.expected + r.stats.flaky, failed: r.stats.unexpected + (r.errors?.length && !r.stats.expected ? 1 : 0) };
}

const total: Counts = { passed: 0, failed: 0 };
let ok = run("type check", process.execPath, ["node_modules/typescript/bin/tsc", "--noEmit", "-p", "tsconfig.json"]);
if (!ok) total.failed++;

rmSync(".data/vitest.json", { force: true });
ok = run("vitest", process.execPath, ["node_modules/vitest/vitest.mjs", "run", "--reporter=default", "--reporter=json", "--outputFile.json=.data/vitest.json"], { HEATBOOK_BCRYPT_COST: "4" }) && ok;
const v = vitestCounts(".data/vitest.json");
total.passed += v.passed;
total.failed += v.failed;

if (!quick) {
  const built = run("next build", process.execPath, ["node_modules/next/dist/bin/next", "build"]);
  if (!built) total.failed++;
  ok = built && ok;
  if (built) {
    rmSync(".data/vitest-ops.json", { force: true });
    ok = run("fault tests (tests/ops)", process.execPath, ["node_modules/vitest/vitest.mjs", "run", "--config", "vitest.ops.config.ts", "--reporter=default", "--reporter=json", "--outputFile.json=.data/vitest-ops.json"], { HEATBOOK_BCRYPT_COST: "4" }) && ok;
    const o = vitestCounts(".data/vitest-ops.json");
    total.passed += o.passed;
    total.failed += o.failed;
    rmSync(".data/playwright.json", { force: true });
    ok = run("playwright", process.execPath, ["node_modules/@playwright/test/cli.js", "test"], { PLAYWRIGHT_JSON_OUTPUT_NAME: ".data/playwright.json" }) && ok;
    const p = playwrightCounts(".data/playwright.json");
    total.passed += p.passed;
    total.failed += p.failed;
  }
}

console.log(`\n${total.passed} passed, ${total.failed} failed`);
process.exit(ok && total.failed === 0 ? 0 : 1);
