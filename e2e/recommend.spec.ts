/**
 * The fit step's model-and-window recommendation and weighting in the browser, on the demo data
 * (invented; NM-05 is the drafting analysis).
 */
import { test, expect, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

async function openDraft(page: Page): Promise<void> {
  await page.goto(`${GROUP}/analyses`);
  await page.getByRole("link", { name: /NM-05 .*γ and Θ_D/ }).click();
  await expect(page.getByTestId("revision-state")).toHaveText("Drafting");
  await expect(page.getByTestId("chart-fit").locator("svg").first()).toBeVisible();
}

test("fit step: recommend model and window shows the model, γ with statistical and systematic σ, the candidates and the reason; unweighted shows the residual standard deviation", async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1366, height: 900 });
  await uiSignIn(page, DEMO.analyst);
  await openDraft(page);
  const fit = page.getByTestId("step-fit").first();

  await fit.getByTestId("edit-step").click();
  // Other specs may have narrowed this step's window (the notebook spec brushes one): scan the whole range.
  await fit.getByTestId("fit-tmin").fill("");
  await fit.getByTestId("fit-tmax").fill("");
  await fit.getByLabel("Recommend model and window").check();
  await fit.getByTestId("save-step").click();
  const rec = fit.getByTestId("recommendation");
  await expect(rec).toBeVisible({ timeout: 30_000 });
  await expect(rec.getByTestId("recommendation-gamma")).toContainText(/^\d+\.\d+\(\d+\)\(\d+\) mJ mol⁻¹ K⁻²$/);
  await expect(rec.getByTestId("recommendation-reason")).toContainText("(stat)(syst)");
  await expect(rec.getByTestId("chart-candidates").locator("svg").first()).toBeVisible();
  await expect(fit.getByTestId("fit-weighting-text")).toContainText("weighted by 1/σ² with the σ of the data");
  await rec.scrollIntoViewIfNeeded();
  await page.screenshot({ path: ".data/e2e-shots/recommendation.png", fullPage: false });

  await fit.getByTestId("edit-step").click();
  await fit.getByTestId("fit-weighting").selectOption("none");
  await fit.getByTestId("save-step").click();
  await expect(fit.getByTestId("fit-residual-sd")).toContainText("mJ mol⁻¹ K⁻¹", { timeout: 30_000 });
  await expect(fit.getByTestId("fit-weighting-text")).toContainText("unweighted");
  await fit.getByTestId("fit-residual-sd").scrollIntoViewIfNeeded();
  await page.screenshot({ path: ".data/e2e-shots/unweighted.png", fullPage: false });
});
