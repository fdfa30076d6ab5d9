/**
 * Several fields at once, on the demo data (invented): the superconductor's γ(H) analysis (a
 * joint fit with γ per field, γ(H)/γ_n with the linear and √H laws), a failing setting marked
 * in the form, the magnetic alloy's joint fit, and the lattice views over a wide range.
 */
import { test, expect, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

async function open(page: Page, title: RegExp): Promise<void> {
  await page.goto(`${GROUP}/analyses`);
  await page.getByRole("link", { name: title }).click();
  await expect(page.getByTestId("revision-state")).toHaveText("Drafting");
}

test("γ(H): per-field γ from a joint fit, the linear law preferred; H_c2 left empty is marked in the form", async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1366, height: 900 });
  await uiSignIn(page, DEMO.analyst);
  await open(page, /NM-01 .*γ\(H\) across fields/);

  const perField = page.getByTestId("step-joint-fit").nth(1);
  await expect(perField.getByTestId("joint-per-field").locator("tbody tr")).toHaveCount(5);
  await expect(perField.getByTestId("joint-chart").locator("svg").first()).toBeVisible();
  const gh = page.getByTestId("step-gamma-field");
  await expect(gh.getByTestId("step-summary")).toContainText("linear in H (fully gapped) preferred");
  await expect(gh.getByTestId("gamma-field-laws")).toContainText("preferred");
  await expect(gh.getByText("multiband superconductor")).toBeVisible();

  // Clear H_c2: the step is not computed, says why, and the form marks the field.
  await gh.getByTestId("edit-step").click();
  await gh.getByTestId("gamma-field-hc2").fill("");
  await gh.getByTestId("save-step").click();
  await expect(gh.getByRole("alert")).toContainText("give H");
  await gh.getByTestId("show-fault").click();
  const field = gh.locator(".nb-fault", { has: page.getByTestId("gamma-field-hc2") });
  await expect(field).toBeVisible();
  await expect(gh.getByTestId("gamma-field-hc2")).toHaveAttribute("aria-invalid", "true");
  // Put it back.
  await gh.getByTestId("gamma-field-hc2").fill("1.8");
  await gh.getByTestId("save-step").click();
  await expect(gh.getByTestId("step-summary")).toContainText("preferred");
});

test("alloy: one joint fit of four fields gives shared γ, β and the Schottky g; lattice views draw Θ_D(T) and C/T³", async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1366, height: 900 });
  await uiSignIn(page, DEMO.analyst);
  await open(page, /MA-01 .*Schottky term across fields/);
  const joint = page.getByTestId("step-joint-fit");
  await expect(joint.getByTestId("step-summary")).toContainText("4 measurements in 0–6 T");
  const shared = joint.getByTestId("joint-shared");
  await expect(shared.locator("tbody tr")).toHaveCount(5);
  await expect(shared).toContainText("mJ mol⁻¹ K⁻²");
  const g = Number((await shared.locator("tbody tr").nth(3).locator("td").nth(1).textContent())!.replace(/\(.*$/, ""));
  expect(Math.abs(g - 2.04)).toBeLessThan(0.01);
  // the derived-quantities step below uses the shared γ and β
  await expect(page.getByTestId("step-derive").getByTestId("step-summary")).toContainText("Θ");

  await open(page, /NM-02 .*lattice over a wide range/);
  const lat = page.getByTestId("step-lattice");
  await expect(lat.getByTestId("lattice-theta").locator("svg").first()).toBeVisible();
  await expect(lat.getByTestId("lattice-ratio").locator("svg").first()).toBeVisible();
  await expect(lat.getByTestId("step-summary")).toContainText("peaks at");

  // The new kinds are offered below any step.
  await lat.getByRole("button", { name: "Add step below" }).click();
  const kinds = await lat.getByTestId("add-step-kind").locator("option").allTextContents();
  for (const label of ["Joint fit across fields", "Sommerfeld coefficient against field", "Lattice views"]) expect(kinds.some((k) => k.startsWith(label))).toBe(true);
});
