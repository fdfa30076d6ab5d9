/**
 * The analysis notebook on the demo data (invented; NM-05 is the drafting one): brush a new fit window and see γ change,
 * add a fit step with a user expression, comment on a range of points, and a second member's
 * browser sees the comment and the change without reloading (server-sent events).
 */
import { test, expect, type Locator, type Page } from "@playwright/test";
import { DEMO, apiSignIn, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

async function openDraft(page: Page): Promise<void> {
  await page.goto(`${GROUP}/analyses`);
  await page.getByRole("link", { name: /NM-05 .*γ and Θ_D/ }).click();
  await expect(page.getByTestId("revision-state")).toHaveText("Drafting");
  await expect(page.getByTestId("chart-fit").locator("svg").first()).toBeVisible();
}

/** Drag across the main SVG of a chart from fraction a to fraction b of its inner width. */
async function dragAcross(page: Page, chart: Locator, a: number, b: number, shift = false): Promise<void> {
  const svg = chart.locator(".chart-canvas svg").last();
  await svg.scrollIntoViewIfNeeded();
  const box = (await svg.boundingBox())!;
  const scale = box.width / Number(await svg.getAttribute("width"));
  const left = box.x + 68 * scale, inner = box.width - 86 * scale, y = box.y + box.height / 2;
  await page.mouse.move(left + a * inner, y);
  if (shift) await page.keyboard.down("Shift");
  await page.mouse.down();
  await page.mouse.move(left + ((a + b) / 2) * inner, y, { steps: 4 });
  await page.mouse.move(left + b * inner, y, { steps: 4 });
  await page.mouse.up();
  if (shift) await page.keyboard.up("Shift");
}

test("notebook: brush a window, add an expression fit, comment on a range; a second member sees it live", async ({ browser }) => {
  test.setTimeout(150_000);
  const analyst = await (await browser.newContext({ viewport: { width: 1366, height: 900 } })).newPage();
  const ownerContext = await browser.newContext({ viewport: { width: 1366, height: 900 } });
  const owner = await ownerContext.newPage();
  await uiSignIn(analyst, DEMO.analyst);
  await apiSignIn(ownerContext.request, DEMO.owner); // the context's request shares its cookies with the page
  await openDraft(analyst);
  await openDraft(owner);

  const fit = analyst.getByTestId("step-fit").first();
  const gammaBefore = (await fit.getByTestId("param-gamma").textContent())!;
  const ownerSummary = owner.getByTestId("step-fit").first().getByTestId("step-summary");
  const ownerBefore = (await ownerSummary.textContent())!;

  // Brush a narrower window on C/T vs T² and adopt it: γ is recomputed on the server.
  await dragAcross(analyst, fit.getByTestId("chart-fit"), 0.12, 0.3);
  await expect(fit.getByText(/New window .* K \(\d+ points\)/)).toBeVisible();
  await fit.getByTestId("use-window").click();
  await expect(fit.getByTestId("param-gamma")).not.toHaveText(gammaBefore);
  await expect(fit.getByTestId("step-summary")).toContainText("mJ mol⁻¹ K⁻²");

  // The owner's page follows without reloading and says who changed it.
  await expect(ownerSummary).not.toHaveText(ownerBefore, { timeout: 10_000 });
  await expect(owner.getByTestId("live-notice")).toContainText("Arun Analyst");

  // A second fit step with a user expression.
  await fit.getByRole("button", { name: "Add step below" }).click();
  await fit.getByTestId("add-step-kind").selectOption("fit");
  await fit.getByTestId("add-step").click();
  await expect(analyst.getByTestId("step-fit")).toHaveCount(2);
  const second = analyst.getByTestId("step-fit").nth(1);
  await second.getByTestId("edit-step").click();
  await second.getByTestId("fit-model").selectOption("expression");
  await second.getByTestId("fit-expression").fill("g*T + b*T^3");
  await second.getByTestId("fit-tmax").fill("6");
  await second.getByTestId("save-step").click();
  await expect(second.getByTestId("param-g")).toBeVisible();
  await expect(second.getByTestId("param-b")).toBeVisible();
  await expect(second.getByTestId("step-summary")).toContainText(/g = .*b = /);
  await expect(owner.getByTestId("step-fit")).toHaveCount(2, { timeout: 10_000 });

  // Comment on a range of points: shift-drag on the first fit chart.
  await dragAcross(analyst, fit.getByTestId("chart-fit"), 0.05, 0.15, true);
  await expect(analyst.getByTestId("thread-composer")).toContainText("C/T vs T² chart");
  await analyst.getByTestId("thread-body").fill("Slight upturn at the low end here? @olga.owner please look");
  await analyst.getByTestId("post-thread").click();
  await expect(analyst.getByTestId("thread").filter({ hasText: "Slight upturn" })).toBeVisible();
  await expect(fit.getByTestId("chart-fit").locator("text", { hasText: /^#\d+$/ })).toHaveCount(1);

  // The owner sees the discussion, with its range, without reloading.
  const ownerThread = owner.getByTestId("thread").filter({ hasText: "Slight upturn" });
  await expect(ownerThread).toBeVisible({ timeout: 10_000 });
  await expect(ownerThread).toContainText(/T = .* K \(\d+ points\)/);
  await ownerThread.getByRole("button", { name: "Resolve" }).click();
  await expect(analyst.getByTestId("thread").filter({ hasText: "Slight upturn" })).toHaveCount(0, { timeout: 10_000 });
});
