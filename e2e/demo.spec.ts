/**
 * The demo's measurements in field (invented data): the superconductor NM-01 lists its zero-field,
 * mixed-state and normal-state curves and overlays them; the magnetic alloy MA-01 its four fields.
 */
import { test, expect, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

async function openSample(page: Page, prefix: string): Promise<void> {
  await page.goto(`${GROUP}/samples`);
  await page.getByRole("link", { name: new RegExp(`^${prefix} `) }).first().click();
  await expect(page.getByTestId("sample-measurements")).toBeVisible();
}

/** The "Field (T)" column of the sample's measurement table, top to bottom. */
async function fields(page: Page): Promise<string[]> {
  return page.getByTestId("sample-measurements").locator("tbody tr td:nth-child(3)").allTextContents();
}

test("the demo superconductor lists its curves from 3 T down to zero field and overlays all seven", async ({ page }, info) => {
  await uiSignIn(page, DEMO.analyst);
  await openSample(page, "NM-01");
  expect(await fields(page)).toEqual(["3", "2", "1.5", "1", "0.5", "0.25", "0"]);
  await expect(page.getByRole("link", { name: "Nb, 0.5 T mixed state" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Nb, 3 T normal state" })).toBeVisible();
  const overlay = page.getByTestId("overlay");
  await expect(overlay.locator("input[type=checkbox]:checked")).toHaveCount(7);
  await expect(overlay.getByLabel("Nb, 1.5 T mixed state (1.5 T)")).toBeChecked();
  await expect(overlay.locator("svg").first()).toBeVisible();
  await page.screenshot({ path: info.outputPath("nm01.png"), fullPage: true });
});

test("the demo magnetic alloy MA-01 lists its curves in 6, 4, 2 and 0 T", async ({ page }, info) => {
  await uiSignIn(page, DEMO.analyst);
  await openSample(page, "MA-01");
  expect(await fields(page)).toEqual(["6", "4", "2", "0"]);
  await expect(page.getByRole("link", { name: "CuMn 0.4 at.%, 4 T" })).toBeVisible();
  await expect(page.getByText("Cu0.996Mn0.004").first()).toBeVisible();
  await page.screenshot({ path: info.outputPath("ma01.png"), fullPage: true });
});
