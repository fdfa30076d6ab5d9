/**
 * Review and seal on the demo data (invented): the analyst sends a copy of the drafting NM-05
 * analysis for review, the reviewer asks for changes with a comment, the analyst narrows the fit
 * window (JSON route, with the step's version) and sends it back (each send confirmed in a
 * dialog), the reviewer signs the approval: the confirmation shows what is sealed, a wrong password
 * seals nothing, an open discussion thread blocks until acknowledged, and the note and meaning are
 * required; the page shows the seal (hash, reviewer, time, signature), Verify passes, the report
 * renders with the signature and the PDF downloads.
 */
import { test, expect, type Browser, type Page } from "@playwright/test";
import { DEMO, DEMO_PASSWORD, uiSignIn } from "./helpers";

const SLUG = "cryogenic-calorimetry-lab-demo";
const GROUP = `/g/${SLUG}`;
const API = `/api/groups/${SLUG}`;

async function signedIn(browser: Browser, email: string): Promise<Page> {
  const page = await (await browser.newContext()).newPage();
  await uiSignIn(page, email);
  return page;
}

/**
 * A new analysis of NM-05's sample with the standard starting chain, so this flow does not depend
 * on what other specs did to the demo's own drafting analysis.
 */
async function copyOfDraft(page: Page): Promise<string> {
  const list = await (await page.request.get(`${API}/analyses`)).json();
  const nm05 = (list.analyses as { id: string; title: string; sampleId: string }[]).find((a) => a.title.startsWith("NM-05"));
  expect(nm05, "the demo has NM-05's analysis").toBeTruthy();
  const res = await page.request.post(`${API}/analyses`, { data: { sampleId: nm05!.sampleId, title: "NM-05 for review (e2e)", starter: "standard" } });
  expect(res.status()).toBe(201);
  return (await res.json()).analysis.id as string;
}

test("analyst submits, reviewer asks for changes, analyst fixes and resubmits, reviewer approves: seal, verify, report, PDF", async ({ browser }) => {
  test.setTimeout(180_000);
  const analyst = await signedIn(browser, DEMO.analyst);
  const id = await copyOfDraft(analyst);
  const page = `${GROUP}/analyses/${id}`;

  await analyst.goto(page);
  await expect(analyst.getByTestId("review-state")).toHaveText("Drafting");
  await analyst.getByTestId("review-submit").click();
  await expect(analyst.getByTestId("submit-dialog")).toContainText("Its steps freeze while a reviewer looks at them");
  await analyst.screenshot({ path: "test-results/submit-dialog.png" });
  await analyst.getByTestId("submit-confirm").click();
  await expect(analyst.getByTestId("review-state")).toHaveText("With reviewer", { timeout: 30_000 });
  await expect(analyst.getByTestId("review-approve")).toHaveCount(0); // no self-approval in the demo group

  const reviewer = await signedIn(browser, DEMO.reviewer);
  await reviewer.goto(`${GROUP}/review`);
  await expect(reviewer.getByTestId("queue-awaiting")).toContainText("NM-05 for review (e2e)");
  await reviewer.goto(page);
  await expect(reviewer.getByTestId("review-state")).toHaveText("With reviewer");
  await reviewer.getByTestId("review-return").click();
  await expect(reviewer.getByTestId("return-send")).toBeDisabled(); // the comment is required
  await reviewer.getByTestId("return-comment").fill("Please stop the window below 4.5 K: the T³ law drifts above it.");
  await reviewer.getByTestId("return-send").click();
  await expect(reviewer.getByTestId("review-state")).toHaveText("Changes requested", { timeout: 30_000 });

  // The analyst sees it sent back, with the comment, and narrows the fit window.
  await analyst.goto(`${GROUP}/review`);
  await expect(analyst.getByTestId("queue-sent-back")).toContainText("the T³ law drifts");
  const nb = (await (await analyst.request.get(`${API}/analyses/${id}`)).json()).notebook;
  const fit = (nb.steps as { id: string; kind: string; version: number; config: Record<string, unknown> }[]).find((s) => s.kind === "fit")!;
  const patch = await analyst.request.patch(`${API}/analyses/${id}/steps/${fit.id}`, { data: { version: fit.version, config: { ...fit.config, tMaxK: 4.5 } } });
  expect(patch.status(), await patch.text()).toBe(200);
  await analyst.goto(page);
  await expect(analyst.getByTestId("review-state")).toHaveText("Changes requested");
  await expect(analyst.getByTestId("decision-history")).toContainText("asked for changes");
  await analyst.getByTestId("review-resubmit").click();
  await analyst.getByTestId("submit-confirm").click();
  await expect(analyst.getByTestId("review-state")).toHaveText("With reviewer", { timeout: 30_000 });
  const thread = await analyst.request.post(`${API}/analyses/${id}/threads`, { data: { body: "Is the 4 K point inside the window on purpose?" } });
  expect(thread.status(), await thread.text()).toBe(201);

  await reviewer.goto(page);
  await reviewer.getByTestId("review-approve").click();
  const dialog = reviewer.getByTestId("sign-dialog");
  await expect(dialog.getByTestId("sign-what")).toContainText("SHA-256");
  await expect(dialog.getByTestId("sign-numbers")).toContainText("γ");
  await expect(dialog.getByTestId("sign-threads")).toContainText("Is the 4 K point inside the window on purpose?");
  const seal = dialog.getByTestId("sign-seal");
  await expect(seal).toBeDisabled(); // no meaning, note, password, acknowledgement yet
  await dialog.getByTestId("meaning-internal").check();
  await expect(dialog.getByTestId("sign-statement")).toContainText("I have reviewed this analysis and approve its results");
  await dialog.getByTestId("sign-note").fill("Window now stops at 4.5 K; residuals flat; 4 K point kept.");
  await dialog.getByTestId("sign-password").fill("not-my-password");
  await expect(seal).toBeDisabled(); // the open thread is not acknowledged
  await dialog.getByTestId("ack-thread").check();
  await reviewer.screenshot({ path: "test-results/sign-dialog.png", fullPage: true });
  await seal.click();
  await expect(dialog.getByTestId("sign-error")).toContainText("the password is wrong; nothing was sealed");
  await expect(reviewer.getByTestId("review-state")).toHaveText("With reviewer");
  // The server blocks an unacknowledged open thread too (the dialog only mirrors it).
  const status = (await (await reviewer.request.get(`${API}/analyses/${id}/review`)).json()).review;
  const direct = await reviewer.request.post(`${API}/analyses/${id}/review`, { data: { revisionId: status.revisions[0].id, action: "approve", version: status.revisions[0].version, meaning: "internal", comment: "ok", password: DEMO_PASSWORD } });
  expect(direct.status()).toBe(422);
  expect((await direct.json()).error).toMatch(/discussion thread is still open/);
  await dialog.getByTestId("sign-password").fill(DEMO_PASSWORD);
  await seal.click();
  await expect(reviewer.getByTestId("review-state")).toHaveText("Sealed", { timeout: 30_000 });
  const lock = reviewer.getByTestId("lock-panel");
  await expect(lock.getByTestId("content-hash")).toHaveText(/^[0-9a-f]{8}( [0-9a-f]{8}){7}$/);
  await expect(lock.getByTestId("sealed-by")).toHaveText(/Rosa/);
  await expect(lock.getByTestId("sealed-at")).toHaveText(/^\d{4}-\d\d-\d\d \d\d:\d\d UTC$/);
  await expect(lock.getByTestId("seal-signature")).toContainText("approve its results as final for use within the group");
  await expect(lock.getByTestId("seal-note")).toHaveText("Window now stops at 4.5 K; residuals flat; 4 K point kept.");
  await reviewer.screenshot({ path: "test-results/sealed-panel.png", fullPage: true });

  await lock.getByTestId("verify").click();
  await expect(lock.getByTestId("verify-summary")).toContainText("Verified: content hash verified", { timeout: 30_000 });
  await expect(lock.getByTestId("verify-report").locator("tbody tr")).toHaveCount(nb.steps.length);

  const hash = (await lock.getByTestId("content-hash").textContent())!;
  await lock.getByTestId("report-link").click();
  await expect(reviewer.getByTestId("report")).toBeVisible();
  await expect(reviewer.getByTestId("report-hash")).toHaveText(hash);
  await expect(reviewer.getByTestId("report-reviewer")).toContainText("Rosa");
  await expect(reviewer.getByTestId("report-signature")).toContainText("reviewer of the group");
  await expect(reviewer.getByTestId("report-parameters").first()).toContainText("γ");
  await expect(reviewer.getByTestId("report-safety")).toContainText("expert review");
  // The report's figures (fit with residuals, window scan when there is one) are drawn as SVG.
  await expect(reviewer.locator(".rp-figure").first().locator("svg").first()).toBeVisible();
  expect(await reviewer.locator(".rp-figure").count()).toBeGreaterThanOrEqual(1);

  const [download] = await Promise.all([reviewer.waitForEvent("download"), reviewer.getByRole("link", { name: "Download PDF" }).click()]);
  const pdf = await reviewer.request.get(new URL(download.url()).pathname + new URL(download.url()).search);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  const body = await pdf.body();
  expect(body.length).toBeGreaterThan(1024);
  expect(body.subarray(0, 5).toString("latin1")).toBe("%PDF-");
});
