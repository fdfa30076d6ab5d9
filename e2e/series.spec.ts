/**
 * The demo series (invented data, Nb₁₋ₓMoₓ): open it, see the γ trend with its uncertainty,
 * switch the axis x ↔ electrons per atom, export the table as CSV (units in the header).
 */
import { test, expect } from "@playwright/test";
import { readFile } from "node:fs/promises";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

test("demo series: trend with uncertainty, axis switch x ↔ e/a, CSV export with units", async ({ page }) => {
  test.setTimeout(120_000);
  await uiSignIn(page, DEMO.analyst);
  await page.goto(`${GROUP}/series`);
  await page.getByRole("link", { name: "Nb1-xMox (demo)" }).click();
  await expect(page.getByTestId("series-title")).toHaveText("Nb1-xMox (demo)");

  const chart = page.getByTestId("series-chart");
  await expect(chart.locator("svg").first()).toBeVisible();
  await expect(chart.locator("svg text", { hasText: "γ (mJ mol⁻¹ K⁻², per mole formula unit)" })).toHaveCount(1);
  await expect(chart.locator('svg g[aria-label="area"] path')).toHaveCount(1); // the ±1σ band
  const trend = page.getByTestId("trend-summary");
  await expect(trend).toContainText("Linear trend");
  await expect(trend).toContainText(/a1 = [-−]?\d[\d.]*\(\d+(\.\d+)?\)/); // slope with its standard error
  await expect(page.getByTestId("series-table-all").locator("tbody tr")).toHaveCount(6);

  await page.getByTestId("axis-ea").click();
  await expect(chart.locator("svg text", { hasText: "e/a (valence electrons per atom)" })).toHaveCount(1);
  await expect(page.getByTestId("series-table").locator("thead")).toContainText("e/a");
  await expect(trend).toContainText("a₁·e/a");
  await page.getByTestId("axis-x").click();
  await expect(chart.locator("svg text", { hasText: /^x$/ })).toHaveCount(1);

  await page.getByTestId("sort-gamma").first().click();
  await expect(page.getByTestId("series-table").locator("thead th").nth(2)).toHaveAttribute("aria-sort", "ascending");

  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("export-csv").click()]);
  const text = await readFile((await download.path())!, "utf8");
  const header = text.split(/\r?\n/)[0]!;
  expect(header).toContain("γ (mJ mol⁻¹ K⁻²)");
  expect(header).toContain("ΘD (K)");
  expect(text.trim().split(/\r?\n/)).toHaveLength(1 + 6);
});
