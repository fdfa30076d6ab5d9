/** Mentions by handle, with completion while typing, and a visible note when a mention matches nobody (demo data is invented). */
import { test, expect } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

test("typing @ro offers the reviewer's handle, Enter completes it, and an unknown handle is named", async ({ page }) => {
  await uiSignIn(page, DEMO.analyst);
  await page.goto(`${GROUP}/members`);
  await expect(page.getByTestId("member-handle").filter({ hasText: "@rosa" })).toBeVisible();
  await page.goto(`${GROUP}/analyses`);
  await page.getByRole("link", { name: /NM-05 .*γ and Θ_D/ }).click();
  await page.getByRole("button", { name: "Comment on the analysis" }).click();
  const box = page.getByTestId("thread-body");
  await box.click();
  await box.pressSequentially("Please check the window, @ro");
  const list = page.getByTestId("mention-list");
  await expect(list).toContainText("@rosa");
  await box.press("Enter");
  await expect(box).toHaveValue("Please check the window, @rosa ");
  await box.pressSequentially("and @nobodyhere");
  await expect(page.getByTestId("mention-unknown")).toContainText("@nobodyhere matches no member");
  await page.screenshot({ path: "test-results/mention-completion.png" });
});
