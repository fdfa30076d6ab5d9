/**
 * Browser benchmark: time from navigation to both drawn charts of a measurement page, for
 * invented curves of 2 000, 20 000 and 100 000 points, in Debian's Chromium through Playwright,
 * against a real `next start` and an embedded PostgreSQL. Target: under 1 s for 100 000 points.
 * Needs a build (`npx next build`); skipped with a note without one.
 */
import { existsSync } from "node:fs";
import { join } from "node:path";
import { chromium } from "@playwright/test";
import { APP_DIR, opsDatabase, opsFixture, signIn, startApp, storeMeasurement } from "../tests/ops/harness";

const SIZES = [2_000, 20_000, 100_000];
const RUNS = 5;
const ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"];

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

export async function runBrowserBench(): Promise<string> {
  if (!existsSync(join(APP_DIR, ".next", "BUILD_ID"))) return "### Browser: measurement page\n\nSkipped: no build (`npx next build` first).";
  const pg = await opsDatabase("bench-browser");
  const app = await (async () => {
    const f = await opsFixture(pg.db, "browser");
    const ids = new Map<number, string>();
    for (const n of SIZES) ids.set(n, await storeMeasurement(pg.db, f, n));
    const server = await startApp(pg.url);
    return { f, ids, server };
  })();
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ARGS });
  try {
    const { cookie } = await signIn(app.server.base, app.f.analyst.email);
    const context = await browser.newContext();
    await context.addCookies(cookie.split("; ").map((kv) => {
      const at = kv.indexOf("=");
      return { name: kv.slice(0, at), value: kv.slice(at + 1), domain: "127.0.0.1", path: "/" };
    }));
    const page = await context.newPage();
    const rows: string[] = [];
    for (const n of SIZES) {
      const url = `${app.server.base}/g/${app.f.slug}/measurements/${app.ids.get(n)}`;
      await page.goto(url); // warm-up: compiles the route, fills caches
      await page.locator('[data-testid="chart-ct-vs-t2"] svg').first().waitFor();
      const times: number[] = [];
      let drawn = "";
      for (let r = 0; r < RUNS; r++) {
        const t0 = performance.now();
        await page.goto(url);
        await page.locator('[data-testid="chart-c-vs-t"] svg').first().waitFor();
        await page.locator('[data-testid="chart-ct-vs-t2"] svg').first().waitFor();
        times.push(performance.now() - t0);
        drawn = (await page.locator('[data-testid="chart-reduced"]').count()) ? "reduced" : "all";
      }
      const dots = await page.locator('[data-testid="chart-c-vs-t"] svg circle').count();
      rows.push(`| ${n.toLocaleString("en-GB").replace(/,/g, " ")} | ${median(times).toFixed(0)} | ${Math.max(...times).toFixed(0)} | ${dots} (${drawn}) | ${n === 100_000 ? (median(times) < 1000 ? "met" : "not met") : ""} |`);
    }
    return [
      "### Browser: navigation to both drawn charts of a measurement page (Chromium, median of 5)",
      "",
      "| points | median ms | max ms | dots in C vs T | target < 1 s |",
      "|---:|---:|---:|---|---|",
      ...rows,
    ].join("\n");
  } finally {
    await browser.close();
    await app.server.kill("SIGTERM");
    await pg.close();
  }
}
