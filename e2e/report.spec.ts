/**
 * The report of a sealed demo analysis as a reader gets it: the HTML page shows the figures as
 * SVG with axis titles and units and symbols with real subscripts; the PDF (text extracted
 * with pdf.js) has axis titles with units, no caret unit, no internal key from the engine's own
 * names, no number with more than 15 significant digits, no e-notation; a figure export is a
 * PDF exactly one journal column wide. Screenshots of the page are kept with the test output.
 */
import { test, expect } from "@playwright/test";
import { apiSignIn, uiSignIn, DEMO } from "./helpers";
import { pdfText } from "../tests/helpers/pdfText";
import { internalKeysIn } from "../tests/helpers/internalKeys";

function longestNumber(text: string): number {
  let best = 0;
  for (const m of text.matchAll(/\d+(?:\.\d+)?/g)) best = Math.max(best, m[0].replace(".", "").replace(/^0+/, "").length);
  return best;
}

test("a sealed demo analysis's report and PDF read as typeset physics", async ({ page, request }, info) => {
  await apiSignIn(request, DEMO.viewer);
  const groups = (await (await request.get("/api/groups")).json()).groups as { slug: string; name: string }[];
  const slug = groups[0]!.slug;
  const analyses = (await (await request.get(`/api/groups/${slug}/analyses`)).json()).analyses as { id: string; title: string; sealedRevision: { id: string } | null }[];
  const sealed = analyses.find((a) => a.sealedRevision && a.title.includes("γ and Θ"))!;
  expect(sealed, "a sealed demo analysis").toBeTruthy();

  await uiSignIn(page, DEMO.viewer);
  await page.goto(`/g/${slug}/analyses/${sealed.id}/report`);
  const report = page.getByTestId("report");
  await expect(report).toBeVisible();
  const fig = page.locator('[data-testid^="report-figure-fit-"]').first();
  await expect(fig.locator("svg").first()).toBeVisible();
  await expect(fig.locator("svg text", { hasText: "C/T (mJ mol⁻¹ K⁻²)" })).toHaveCount(1);
  await expect(report.locator("sub", { hasText: "D" }).first()).toBeVisible();
  await page.screenshot({ path: info.outputPath("report.png"), fullPage: true });
  const text = (await report.innerText()).replace(/[0-9a-f]{64}|([0-9a-f]{8} ){7}[0-9a-f]{8}/g, "");
  expect(internalKeysIn(text)).toEqual([]);
  expect(text).not.toMatch(/\d(?:\.\d+)?e[+-]?\d/i);
  expect(longestNumber(text)).toBeLessThanOrEqual(15);

  const res = await request.get(`/api/groups/${slug}/analyses/${sealed.id}/report.pdf`);
  expect(res.status()).toBe(200);
  const bytes = new Uint8Array(await res.body());
  await info.attach("report.pdf", { body: Buffer.from(bytes), contentType: "application/pdf" });
  const pdf = (await pdfText(bytes)).text.replace(/[0-9a-f]{64}/g, "");
  expect(pdf).toContain("C/T (mJ mol⁻¹ K⁻²)");
  expect(pdf).toContain("T² (K²)");
  expect(pdf).not.toMatch(/\^-?\d/);
  expect(pdf).not.toMatch(/\d(?:\.\d+)?e[+-]?\d/i);
  expect(internalKeysIn(pdf)).toEqual([]);
  expect(longestNumber(pdf)).toBeLessThanOrEqual(15);

  const href = await fig.locator("a", { hasText: "PDF 8.5 cm" }).getAttribute("href");
  const figRes = await request.get(href!);
  expect(figRes.status()).toBe(200);
  const head = new TextDecoder("latin1").decode(new Uint8Array(await figRes.body()));
  expect(Number(/\/MediaBox \[0 0 ([\d.]+)/.exec(head)![1])).toBeCloseTo((8.5 / 2.54) * 72, 1);
});
