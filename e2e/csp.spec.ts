/**
 * The script policy (a nonce per response, no 'unsafe-inline' for scripts) leaves the app
 * working in Chromium: the main pages load, hydrate and draw their charts, and not one
 * Content-Security-Policy violation is reported (securitypolicyviolation events and console).
 */
import { test, expect, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

/** Violations seen by the page (recorded by an init script, which the policy does not govern) and the console. */
function watchViolations(page: Page): string[] {
  const seen: string[] = [];
  page.on("console", (m) => { if (/Content Security Policy|Refused to (execute|load|apply)/i.test(m.text())) seen.push(`console: ${m.text()}`); });
  page.on("pageerror", (e) => seen.push(`page error: ${e.message}`));
  return seen;
}

async function violationsIn(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []);
}

test("main pages load under the nonce script policy with no CSP violation in Chromium", async ({ browser }) => {
  test.setTimeout(180_000);
  const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
  await context.addInitScript(() => {
    const w = window as unknown as { __csp: string[] };
    w.__csp = [];
    document.addEventListener("securitypolicyviolation", (e) => w.__csp.push(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}`));
  });
  const page = await context.newPage();
  const seen = watchViolations(page);

  const response = await page.goto("/signin");
  const csp = response!.headers()["content-security-policy"] ?? "";
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/);
  expect(/script-src ([^;]*)/.exec(csp)![1]).not.toContain("unsafe-inline");
  // Next.js put each response's own nonce on every script tag of its HTML.
  const raw = await page.request.get("/signin");
  const rawNonce = /'nonce-([^']+)'/.exec(raw.headers()["content-security-policy"] ?? "")![1]!;
  const tags = (await raw.text()).match(/<script\b[^>]*>/g) ?? [];
  expect(tags.length).toBeGreaterThan(0);
  expect(tags.filter((t) => !t.includes(`nonce="${rawNonce}"`))).toEqual([]);
  expect(rawNonce).not.toBe(/'nonce-([^']+)'/.exec(csp)![1]);
  expect(await violationsIn(page)).toEqual([]);

  await uiSignIn(page, DEMO.analyst);
  const visits: [string, () => Promise<void>][] = [
    ["/groups", async () => { await expect(page.locator("main")).toBeVisible(); }],
    [GROUP, async () => { await expect(page.locator("main")).toBeVisible(); }],
    [`${GROUP}/samples`, async () => { await expect(page.locator("main")).toBeVisible(); }],
    [`${GROUP}/analyses`, async () => { await expect(page.getByRole("link", { name: /NM-05 .*γ and Θ_D/ })).toBeVisible(); }],
    [`${GROUP}/series`, async () => { await expect(page.locator("main")).toBeVisible(); }],
    [`${GROUP}/review`, async () => { await expect(page.locator("main")).toBeVisible(); }],
    [`${GROUP}/audit`, async () => { await expect(page.locator("main")).toBeVisible(); }],
  ];
  for (const [path, ready] of visits) {
    await page.goto(path);
    await ready();
    expect(await violationsIn(page), path).toEqual([]);
  }
  // A notebook: client components hydrate and Observable Plot draws the fit chart in the browser.
  await page.goto(`${GROUP}/analyses`);
  await page.getByRole("link", { name: /NM-05 .*γ and Θ_D/ }).click();
  await expect(page.getByTestId("chart-fit").locator("svg").first()).toBeVisible();
  expect(await violationsIn(page)).toEqual([]);
  expect(seen).toEqual([]);
  await context.close();
});
